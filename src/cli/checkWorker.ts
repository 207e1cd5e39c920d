// One dump through a plan, for `midrail check`: reads the file once, each piece hashed for
// provenance and then parsed, runs every measurement, and returns a small result; the dump itself
// is dropped at once, so a thread holds at most one dump. Built as its own entry
// (dist/cli/checkWorker.js) and run in worker_threads; the same function runs in the main thread
// for --jobs 1.

import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import { basename } from 'node:path';
import { isMainThread, parentPort, workerData } from 'node:worker_threads';
import { ticksToSeconds } from '../measure/index';
import type { DumpCheck } from '../plan/result';
import { runPlan } from '../plan/run';
import type { Plan } from '../plan/types';
import type { Dump } from '../model/dump';
import { VcdParser } from '../parse/vcd';
import { forEachPiece } from './filePieces';
import { type ReadDumpOptions, finishDump, isGzip, readDumpFile } from './readDump';

export interface CheckTask {
  index: number;
  file: string;
}

export interface CheckSettings {
  plan: Plan;
  allowTruncated: boolean;
}

export interface CheckReply {
  index: number;
  result: DumpCheck;
}

/** Marks the worker's workerData so a stray import never starts serving. */
export const WORKER_ROLE = 'midrail-check';

export function sha256File(path: string): Promise<string> {
  return new Promise((resolve, reject) => {
    const hash = createHash('sha256');
    createReadStream(path, { highWaterMark: 1 << 20 })
      .on('data', (chunk) => hash.update(chunk))
      .on('error', reject)
      .on('end', () => resolve(hash.digest('hex')));
  });
}

/** Parses and hashes a dump in one read; a gzipped dump or anything not a plain file goes through readDumpFile. */
async function readHashed(file: string, options: ReadDumpOptions): Promise<{ dump: Dump; sha256: string }> {
  if (!(await stat(file)).isFile() || (await isGzip(file))) {
    const hashing = sha256File(file);
    // Both reads stream the same file; the OS cache serves the second.
    // One thread per dump: check already spreads the dumps over the cores.
    const dump = await readDumpFile(file, { ...options, threads: 1 });
    return { dump, sha256: await hashing };
  }
  const parser = new VcdParser(basename(file));
  const hash = createHash('sha256');
  forEachPiece(file, (bytes) => {
    hash.update(bytes);
    parser.push(bytes);
  });
  return { dump: finishDump(parser, options), sha256: hash.digest('hex') };
}

export async function checkDumpFile(file: string, settings: CheckSettings): Promise<DumpCheck> {
  const started = performance.now();
  const warnings: string[] = [];
  const result: DumpCheck = { file, bytes: 0, sha256: null, timescale: null, end_s: null, error: null, warnings, elapsed_s: 0, measurements: [] };
  try {
    result.bytes = (await stat(file)).size;
    const { dump, sha256 } = await readHashed(file, { allowTruncated: settings.allowTruncated, warn: (m) => warnings.push(m) });
    result.sha256 = sha256;
    result.timescale = `${dump.timescale.magnitude}${dump.timescale.unit}`;
    result.end_s = ticksToSeconds(dump.timescale, dump.endTick);
    result.measurements = runPlan(dump, settings.plan);
  } catch (err) {
    const e = err as NodeJS.ErrnoException;
    result.error = e.code === 'ENOENT' ? `cannot read dump '${file}': no such file` : (e.message ?? String(err));
    result.measurements = [];
  }
  result.elapsed_s = (performance.now() - started) / 1000;
  return result;
}

if (!isMainThread && parentPort && (workerData as { role?: string } | null)?.role === WORKER_ROLE) {
  const settings = (workerData as { settings: CheckSettings }).settings;
  const port = parentPort;
  port.on('message', (task: CheckTask) => {
    void checkDumpFile(task.file, settings).then((result) => port.postMessage({ index: task.index, result } satisfies CheckReply));
  });
}
