// Issue 3 figures, each in a fresh process: delay pairing over many edge pairs, and the glitch
// search over every net of a synthetic dump, each timed against the plain pass over the same
// changes. Both sides get the same treatment so the ratio compares the work, not the JIT: one full
// collection once the dump is built, the same number of untimed warm-up runs, then timed runs taken
// in turn (measurement, plain pass, measurement, ...), best of each kept. The very first measurement
// (cold: interpreter and compiler at work) is reported beside it. No collection is forced between
// timed runs: a forced one also throws away compiled code (V8 drops code that embeds objects it
// frees), which would time the measurement half-compiled; the collector's own work stays in.

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
  /** The first measurement in the process, before any warm-up. */
  coldMs: number;
  /** Building the per-item records (`pairs` and `unpaired_edges`, or `glitches` and `unknown_spans`) on first read, once; not in measureMs. */
  recordsMs: number;
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

const gc = (globalThis as { gc?: () => void }).gc ?? (() => {});

function timeOnce(f: () => unknown): number {
  const t0 = performance.now();
  f();
  return performance.now() - t0;
}

/** Warm-up runs of each side, untimed, then `runs` timed runs of each in turn; the best of each. */
const WARM_RUNS = 2;

function timeBoth(runs: number, measure: () => unknown, plain: () => unknown): { measureMs: number; plainMs: number; coldMs: number } {
  gc();
  const coldMs = timeOnce(measure);
  for (let r = 0; r < WARM_RUNS; r++) {
    measure();
    plain();
  }
  let measureMs = Infinity;
  let plainMs = Infinity;
  for (let r = 0; r < runs; r++) {
    measureMs = Math.min(measureMs, timeOnce(measure));
    plainMs = Math.min(plainMs, timeOnce(plain));
  }
  return { measureMs, plainMs, coldMs };
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
  const times = timeBoth(runs, () => (result = measureDelay(dump, { from, to })), () => plainPass(dump, sigs));
  const r = result as unknown as DelayResult;
  let listed = 0;
  const recordsMs = timeOnce(() => (listed = r.pairs.length) + r.unpaired_edges.length);
  return {
    changes: changeCount(dump, sigs),
    ...times,
    recordsMs,
    found: { pairs: listed, unpaired: r.unpaired },
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
  const times = timeBoth(runs, () => (result = findGlitches(dump, { maxWidthS })), () => plainPass(dump, sigs));
  const r = result as unknown as GlitchResult;
  const recordsMs = timeOnce(() => r.glitches.length + r.unknown_spans.length);
  return {
    changes: changeCount(dump, sigs),
    ...times,
    recordsMs,
    found: { glitches: r.count, targets: r.nets },
  };
}
