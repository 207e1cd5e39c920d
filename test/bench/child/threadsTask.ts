// One read of a dump by the CLI's reader with several threads (src/cli/readParts.ts), in a fresh
// process, timed like the one-thread parse task. The part worker is the one run.mjs builds into
// dist/bench. Memory: the kernel's high-water mark over the whole read (all threads share it).

import { fileURLToPath } from 'node:url';
import { readDumpFile } from '../../../src/cli/readDump';
import { collectGarbage, peakResident, resetPeakResident } from './memory';

export interface ThreadsResult {
  bytes: number;
  ms: number;
  changes: number;
  threads: number;
  /** Why the reader fell back to one piece ('' when it read in parts). */
  onePiece: string;
  peakRssDelta: number;
}

export async function runThreads(path: string, threads: number): Promise<ThreadsResult> {
  const partWorker = fileURLToPath(new URL('./parsePart.js', import.meta.url));
  collectGarbage();
  await new Promise((r) => setTimeout(r, 20));
  collectGarbage();
  const base = process.memoryUsage().rss;
  const hwmReset = resetPeakResident();
  let onePiece = '';
  const t0 = performance.now();
  const dump = await readDumpFile(path, { threads, partWorker, onOnePiece: (why) => (onePiece = why), warn: () => undefined });
  const ms = performance.now() - t0;
  const hwm = hwmReset ? peakResident() : process.memoryUsage().rss;
  return { bytes: dump.bytes, ms, changes: dump.changes, threads, onePiece, peakRssDelta: hwm - base };
}
