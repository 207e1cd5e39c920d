// Reads a dump file from disk in 16 MiB pieces through the streaming parser, gunzipping
// `.vcd.gz` (recognised by its magic bytes, whatever the name). A big plain file is read by
// several threads at once (readParts.ts) where the machine has the cores.

import { createReadStream } from 'node:fs';
import { open, stat } from 'node:fs/promises';
import { availableParallelism } from 'node:os';
import { basename } from 'node:path';
import { createGunzip } from 'node:zlib';
import type { Dump } from '../model/dump';
import { VcdParser } from '../parse/vcd';
import { MAX_READING_THREADS, PARTS_FROM_BYTES, readingThreads } from '../parse/parts';
import { forEachPiece } from './filePieces';
import { partWorkerScript, readDumpInParts } from './readParts';
import { UsageError } from './run';

export interface ReadDumpOptions {
  /** Measure the complete part of a cut-off dump (with a warning) instead of failing. */
  allowTruncated?: boolean;
  /** Where warnings go; stderr by default. */
  warn?: (message: string) => void;
  /** Threads that may read one file (default: see readingThreads); 1 reads it in one piece. */
  threads?: number;
  /** The built part worker (default: parsePart.js beside this module). */
  partWorker?: string;
  /** Told why a file big enough to read in parts was read in one piece. */
  onOnePiece?: (why: string) => void;
}

/** MIDRAIL_READ_THREADS=N sets the reading threads (1: one piece, to compare or on a shared machine). */
function threadsFromEnvironment(): number | null {
  const n = Number(process.env.MIDRAIL_READ_THREADS);
  return Number.isInteger(n) && n >= 1 ? n : null;
}

const PIECE = 16 * 1024 * 1024;

export async function isGzip(path: string): Promise<boolean> {
  const fh = await open(path, 'r');
  try {
    const head = Buffer.alloc(2);
    const { bytesRead } = await fh.read(head, 0, 2, 0);
    return bytesRead === 2 && head[0] === 0x1f && head[1] === 0x8b;
  } finally {
    await fh.close();
  }
}

export async function readDumpFile(path: string, options: ReadDumpOptions = {}): Promise<Dump> {
  try {
    const st = await stat(path);
    if (!st.isFile()) throw new UsageError(`cannot read dump '${path}': not a file`);
  } catch (err) {
    if (err instanceof UsageError) throw err;
    throw new UsageError(`cannot read dump '${path}': ${(err as NodeJS.ErrnoException).code === 'ENOENT' ? 'no such file' : (err as Error).message}`);
  }
  const gz = await isGzip(path);
  const size = (await stat(path)).size;
  const threads = Math.min(options.threads ?? threadsFromEnvironment() ?? readingThreads(size, availableParallelism()), MAX_READING_THREADS);
  const script = options.partWorker ?? partWorkerScript();
  const debug = process.env.MIDRAIL_DEBUG_READ ? (m: string) => process.stderr.write(`midrail: ${path}: ${m}\n`) : null;
  if (!gz && size >= PARTS_FROM_BYTES && threads > 1 && script) {
    const onOnePiece = (why: string) => {
      options.onOnePiece?.(why);
      debug?.(`read in one piece: ${why}`);
    };
    const dump = await readDumpInParts(path, size, threads, script, onOnePiece);
    if (dump) {
      debug?.(`read in parts by ${threads} threads`);
      return acceptDump(dump, options);
    }
  }
  const parser = new VcdParser(basename(path));
  if (!gz) {
    forEachPiece(path, (bytes) => parser.push(bytes));
    return finishDump(parser, options);
  }
  const raw = createReadStream(path, { highWaterMark: PIECE });
  const stream = raw.pipe(createGunzip({ chunkSize: 1024 * 1024 }));
  try {
    for await (const piece of stream as AsyncIterable<Buffer>) {
      parser.push(new Uint8Array(piece.buffer, piece.byteOffset, piece.byteLength));
    }
  } catch (err) {
    raw.destroy();
    const e = err as NodeJS.ErrnoException;
    if (e.code?.startsWith('Z_')) throw new UsageError(`${path}: the gzip data is damaged after ${parser.bytesRead} bytes of VCD (${e.message})`);
    throw err;
  }
  return finishDump(parser, options);
}

/** Ends a parse fed by any reader: refuses a cut-off dump unless allowed, and passes the warnings on. */
export function finishDump(parser: VcdParser, options: ReadDumpOptions = {}): Dump {
  return acceptDump(parser.finish(), options);
}

function acceptDump(dump: Dump, options: ReadDumpOptions): Dump {
  const warn = options.warn ?? ((m: string) => process.stderr.write(`midrail: warning: ${m}\n`));
  if (dump.truncated) {
    const cut = dump.warnings[dump.warnings.length - 1]?.message ?? 'the dump is cut off';
    if (!options.allowTruncated) {
      throw new UsageError(`${dump.source}: ${cut}. A regression must not pass on part of a dump; rerun with --allow-truncated to measure the complete part`);
    }
  }
  for (const w of dump.warnings) warn(`${dump.source}: line ${w.line}: ${w.message}`);
  return dump;
}
