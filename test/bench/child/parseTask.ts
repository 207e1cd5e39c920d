// One parse of a dump by midrail's streaming parser, in a fresh process started with
// --expose-gc, so the memory figures hold only this parse. Resident memory is sampled after
// every piece and the kernel's high-water mark catches what falls between samples.

import { basename } from 'node:path';
import type { Dump } from '../../../src/model/dump';
import { loadParser } from '../engines';
import { forEachPiece, pieceBuffer } from './chunks';
import { MemoryPeaks, collectGarbage, peakResident, resetPeakResident } from './memory';

export interface HeldBytes {
  times: number;
  logic: number;
  vector: number;
  real: number;
  changesByKind: { logic: number; vector: number; real: number };
}

export interface ParseResult {
  bytes: number;
  ms: number;
  changes: number;
  nets: number;
  signals: number;
  truncated: boolean;
  warnings: number;
  /** Resident bytes above the pre-parse baseline at the peak (high-water mark or samples). */
  peakRssDelta: number;
  peakArrayBuffersDelta: number;
  /** After finish() and a full GC, with the Dump still referenced. */
  retainedRssDelta: number;
  held: HeldBytes;
}

/** Bytes of the finished typed arrays, split by signal kind: where the resident memory goes. */
function heldBytes(dump: Dump): HeldBytes {
  const h: HeldBytes = { times: dump.times.byteLength, logic: 0, vector: 0, real: 0, changesByKind: { logic: 0, vector: 0, real: 0 } };
  for (const s of dump.signals) {
    const b = s.timeIndex.byteLength + s.logic.byteLength + s.planes.byteLength + s.reals.byteLength;
    const k = s.kind === 'vector' ? 'vector' : s.kind === 'real' ? 'real' : 'logic';
    h[k] += b;
    h.changesByKind[k] += s.count;
  }
  return h;
}

export async function runParse(path: string): Promise<ParseResult> {
  const VcdParser = await loadParser();
  if (!VcdParser) throw new Error('src/parse/vcd.ts does not export VcdParser yet');
  const buf = pieceBuffer();
  collectGarbage();
  await new Promise((r) => setTimeout(r, 20));
  collectGarbage();
  const base = process.memoryUsage();
  const peaks = new MemoryPeaks();
  const hwmReset = resetPeakResident();

  const t0 = performance.now();
  const parser = new VcdParser(basename(path));
  const bytes = forEachPiece(path, buf, (piece) => {
    parser.push(piece);
    peaks.sample();
  });
  const dump = parser.finish();
  const ms = performance.now() - t0;
  peaks.sample();
  const hwm = hwmReset ? peakResident() : 0;

  collectGarbage();
  const after = process.memoryUsage();
  const result: ParseResult = {
    bytes,
    ms,
    changes: dump.changes,
    nets: dump.nets.length,
    signals: dump.signals.length,
    truncated: dump.truncated,
    warnings: dump.warnings.length,
    peakRssDelta: Math.max(hwm, peaks.rss) - base.rss,
    peakArrayBuffersDelta: peaks.arrayBuffers - base.arrayBuffers,
    retainedRssDelta: after.rss - base.rss,
    held: heldBytes(dump),
  };
  return result;
}
