// Issue 3 figures, each in a fresh process: delay pairing over many edge pairs, and the glitch
// search over every net of a synthetic dump, each timed against the plain pass over the same
// changes. Best of a few runs in one process, so the JIT is warm for both sides alike.

import { basename } from 'node:path';
import type { GlitchOptions, DelayOptions, DelayResult, GlitchResult } from '../../../src/measure/index';
import { DumpBuilder } from '../../../src/model/builder';
import type { Dump } from '../../../src/model/dump';
import type { NetRef } from '../../../src/model/netref';
import { loadMeasure, loadParser } from '../engines';
import { forEachPiece, pieceBuffer } from './chunks';
import { plainPass, changeCount } from './plainPass';

export interface TimedResult {
  /** Stored changes the measurement reads (the plain pass reads the same ones). */
  changes: number;
  measureMs: number;
  plainMs: number;
  /** What the measurement found, to show it did the work (pairs, or glitches and targets). */
  found: Record<string, number>;
}

interface MeasureApi {
  measureDelay: (dump: Dump, opts: DelayOptions) => DelayResult;
  findGlitches: (dump: Dump, opts: GlitchOptions) => GlitchResult;
}

async function api(): Promise<MeasureApi> {
  const m = await loadMeasure();
  if (!m || typeof m.measureDelay !== 'function' || typeof m.findGlitches !== 'function') {
    throw new Error('measure engine not available (src/measure/index.ts lacks measureDelay/findGlitches)');
  }
  return m as unknown as MeasureApi;
}

function bestOf(runs: number, f: () => unknown): number {
  let best = Infinity;
  for (let r = 0; r < runs; r++) {
    const t0 = performance.now();
    f();
    best = Math.min(best, performance.now() - t0);
  }
  return best;
}

/**
 * Two 1-bit nets: `a` toggles every 1000 ps, `y` follows it after 120 ps when rising and 90 ps when
 * falling (made-up delays; only the count matters here). `pairs` edges on each net.
 */
function pairedDump(pairs: number): { dump: Dump; from: NetRef; to: NetRef } {
  const b = new DumpBuilder('bench-delay');
  b.timescale = { magnitude: 1, unit: 'ps', seconds: 1e-12 };
  const scope = b.addScope('bench', 'module', -1);
  const refs: NetRef[] = [];
  for (const name of ['a', 'y']) {
    const signal = b.addSignal('logic', 1);
    const net = { path: `bench.${name}`, name, type: 'wire', width: 1, msb: 0, lsb: 0, ranged: false, scope, signal, code: name };
    b.addNet(net);
    refs.push({ net, bit: null, label: net.path });
  }
  b.setTime(0);
  b.pushLogic(0, 0);
  b.pushLogic(1, 0);
  for (let k = 1; k <= pairs; k++) {
    const rise = k % 2;
    b.setTime(k * 1000);
    b.pushLogic(0, rise);
    b.setTime(k * 1000 + (rise ? 120 : 90));
    b.pushLogic(1, rise);
  }
  return { dump: b.finish(0, false), from: refs[0], to: refs[1] };
}

export async function runDelay(pairs: number, runs: number): Promise<TimedResult> {
  const { measureDelay } = await api();
  const { dump, from, to } = pairedDump(pairs);
  const sigs = [from.net.signal, to.net.signal];
  let result: DelayResult | null = null;
  const measureMs = bestOf(runs, () => (result = measureDelay(dump, { from, to })));
  const plainMs = bestOf(runs * 3, () => plainPass(dump, sigs));
  const r = result as DelayResult | null;
  return {
    changes: changeCount(dump, sigs),
    measureMs,
    plainMs,
    found: { pairs: r ? r.pairs.length : 0, unpaired: r ? r.unpaired : 0 },
  };
}

export async function runGlitches(path: string, maxWidthS: number, runs: number): Promise<TimedResult> {
  const { findGlitches } = await api();
  const VcdParser = await loadParser();
  if (!VcdParser) throw new Error('midrail parser not available');
  const parser = new VcdParser(basename(path));
  forEachPiece(path, pieceBuffer(), (piece) => parser.push(piece));
  const dump = parser.finish();
  const sigs = new Set(dump.nets.map((n) => n.signal));
  let result: GlitchResult | null = null;
  const measureMs = bestOf(runs, () => (result = findGlitches(dump, { maxWidthS })));
  const plainMs = bestOf(runs * 3, () => plainPass(dump, sigs));
  const r = result as GlitchResult | null;
  return {
    changes: changeCount(dump, sigs),
    measureMs,
    plainMs,
    found: { glitches: r ? r.count : 0, targets: r ? r.nets : 0 },
  };
}
