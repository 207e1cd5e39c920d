// Propagation delay between two nets, every edge pair, in one merge pass (O(n)).
// Each edge of the `to` net pairs with the latest edge of the `from` net at or before it. A pair is
// dropped as unpaired when it is longer than the window, when `from` has no earlier edge, or when
// `from` went unknown after its latest edge (the output may follow the unknown, so the cause is not
// that edge). Kind from the output direction (JEDEC JESD99 letter symbols): output rise = tPLH,
// output fall = tPHL; a vector or event output gives tPD.
// Two 1-bit nets (the usual case) are paired in one merged walk of their change lists
// (pairLogicNets), which keeps only the per-kind sums: no edge list and nothing per pair is written.
// Any other pair of nets goes through edge lists (pairEdges), whose pair indices the viewer can also
// use. The `pairs` and `unpaired_edges` records are built on first read, from pairEdges; both ways
// must agree, which measure-paths.test.ts checks on random dumps.

import type { Dump, Signal } from '../model/dump';
import type { NetRef } from '../model/netref';
import { edgeList } from './edges';
import { logicSpans } from './logicEdges';
import { lazyField } from './lazy';
import { type LevelSpec, MESIAL } from './level';
import { NO_STATE, STATE, closeSpans, isEdge, spanChange } from './settle';
import { secondsOf, ticksToHertz, windowTicks } from './ticks';
import {
  EDGE_NAMES,
  EdgeDir,
  TIMING_CAUTION,
  type DelayKind,
  type DelayPair,
  type DelayResult,
  type DelayStats,
  type EdgeList,
  type UnknownSpan,
  type UnpairedEdge,
  type UnpairedReason,
} from './types';
import { unknownSpans } from './unknown';

export interface DelayOptions {
  from: NetRef;
  to: NetRef;
  /** Reference level for real nets (both unless overridden below); default 50 %. */
  level?: LevelSpec;
  fromLevel?: LevelSpec;
  toLevel?: LevelSpec;
  /** Longest pair kept, in seconds. */
  windowS?: number;
  /**
   * Pair over edge lists even for two 1-bit nets, and hand the lists and pairs to the caller
   * (`pairListOf(result)`): a viewer that draws every pair then measures once, not twice.
   */
  keepLists?: boolean;
}

/** Edge lists and pairs behind a result measured with `keepLists` (not part of its JSON). */
export interface DelayLists {
  from: EdgeList;
  to: EdgeList;
  pairs: PairList;
}

const LISTS = new WeakMap<DelayResult, DelayLists>();

export function pairListOf(result: DelayResult): DelayLists | undefined {
  return LISTS.get(result);
}

export const PAIR_KINDS: readonly DelayKind[] = ['tPLH', 'tPHL', 'tPD'];
const PLH = 0;
const PHL = 1;
const PD = 2;
export const UNPAIRED_REASONS: readonly UnpairedReason[] = ['no-from-edge', 'from-unknown', 'window'];
const NO_FROM_EDGE = 0;
const FROM_UNKNOWN = 1;
const BEYOND_WINDOW = 2;

/** Kind index from the output (`to`) edge: rise tPLH, fall tPHL; a vector or event output tPD. */
function pairKind(to: EdgeList, dir: number): number {
  return (to.source !== 'logic' && to.source !== 'real') || dir === EdgeDir.Change ? PD : dir === EdgeDir.Rise ? PLH : PHL;
}

/**
 * Per-kind sums over the pairs, 8 numbers per kind (PAIR_KINDS order) from 8·kind: pairs, the first
 * delay, Σ(delay − first), Σ(delay − first)², min, max, `to` time of the max. Sums are taken about
 * each kind's first delay, which keeps the variance exact for the integer tick delays of digital nets
 * and stable for millions of pairs.
 */
export function newDelaySums(): Float64Array {
  const st = new Float64Array(24);
  for (let k = 0; k < 3; k++) {
    st[8 * k + 4] = Infinity;
    st[8 * k + 5] = -Infinity;
  }
  return st;
}

function addDelay(st: Float64Array, kind: number, d: number, t: number): void {
  const b = 8 * kind;
  const n = st[b];
  if (n === 0) st[b + 1] = d;
  st[b] = n + 1;
  const x = d - st[b + 1];
  st[b + 2] += x;
  st[b + 3] += x * x;
  if (d < st[b + 4]) st[b + 4] = d;
  if (d > st[b + 5]) {
    st[b + 5] = d;
    st[b + 6] = t;
  }
}

/** Pairs as indices into the two edge lists, and their per-kind sums. */
export interface PairList {
  /** Per `to` edge: the index of the `from` edge it pairs with, or −1 − its UNPAIRED_REASONS code. */
  fromOf: Int32Array;
  count: number;
  unpairedCount: number;
  sums: Float64Array;
}

/** The pairing rule above over two edge lists (`windowTicks` = Infinity for no window), in one merge pass. */
export function pairEdges(from: EdgeList, to: EdgeList, windowTicks: number): PairList {
  const n = to.count;
  const fromOf = new Int32Array(n);
  const sums = newDelaySums();
  const ft = from.ticks;
  const tt = to.ticks;
  const td = to.dir;
  const fu = from.unknown;
  const spans = fu.length >> 1;
  const fromCount = from.count;
  let unpaired = 0;
  let fi = -1; // latest from edge at or before the current to edge
  let ui = 0; // unknown spans of `from` starting at or before it
  for (let j = 0; j < n; j++) {
    const t = tt[j];
    while (fi + 1 < fromCount && ft[fi + 1] <= t) fi++;
    while (ui < spans && fu[2 * ui] <= t) ui++;
    let reason = -1;
    if (fi < 0) reason = NO_FROM_EDGE;
    else if (ui > 0 && fu[2 * (ui - 1)] > ft[fi]) reason = FROM_UNKNOWN;
    else if (t - ft[fi] > windowTicks) reason = BEYOND_WINDOW;
    if (reason >= 0) {
      fromOf[j] = -1 - reason;
      unpaired++;
      continue;
    }
    fromOf[j] = fi;
    addDelay(sums, pairKind(to, td[j]), t - ft[fi], t);
  }
  return { fromOf, count: n - unpaired, unpairedCount: unpaired, sums };
}

/** Spans of one net in EdgeList form. */
interface Spans {
  unknown: number[];
  unknownState: number[];
}

/**
 * The same rule for two 1-bit nets, straight from their change lists by the settled-state rule
 * (settle.ts): `to` is walked change by change and, at each of its edges, `from` is walked up to that
 * timestamp. Returns the unpaired count; the sums go to `sums`, each net's unknown spans to its Spans.
 */
function pairLogicNets(times: Float64Array, from: Signal, to: Signal, windowTicks: number, sums: Float64Array, fromSpans: Spans, toSpans: Spans): number {
  const fIdx = from.timeIndex;
  const fCodes = from.logic;
  const fLast = from.count - 1;
  const tIdx = to.timeIndex;
  const tCodes = to.logic;
  const tLast = to.count - 1;
  let i = 0; // next change of `from`
  let fSettled = NO_STATE;
  let fTick = 0; // latest `from` edge, if fDir ≥ 0
  let fDir = -1;
  let fUnknownSince = false; // `from` went into a non-logic state after that edge (an unknown span began)
  let tSettled = NO_STATE;
  let unpaired = 0;
  for (let j = 0; j <= tLast; j++) {
    const tj = tIdx[j];
    while (j < tLast && tIdx[j + 1] === tj) j++; // collapse the timestamp (settle.ts groupEnd)
    const state = STATE[tCodes[j]];
    if (state === tSettled) continue;
    const prev = tSettled;
    tSettled = state;
    if (!isEdge(prev, state)) {
      spanChange(toSpans.unknown, toSpans.unknownState, times[tj], prev, state, tCodes[j]);
      continue;
    }
    // `from` up to this timestamp.
    while (i <= fLast) {
      const fi = fIdx[i];
      if (fi > tj) break;
      while (i < fLast && fIdx[i + 1] === fi) i++;
      const s = STATE[fCodes[i]];
      if (s !== fSettled) {
        if (isEdge(fSettled, s)) {
          fTick = times[fi];
          fDir = s;
          fUnknownSince = false;
        } else {
          spanChange(fromSpans.unknown, fromSpans.unknownState, times[fi], fSettled, s, fCodes[i]);
          if (s > 1) fUnknownSince = true;
        }
        fSettled = s;
      }
      i++;
    }
    const t = times[tj];
    if (fDir < 0 || fUnknownSince || t - fTick > windowTicks) unpaired++;
    else addDelay(sums, state === EdgeDir.Rise ? PLH : PHL, t - fTick, t);
  }
  logicSpans(times, from, fromSpans, i, fSettled); // the rest of `from`
  return unpaired;
}

/** Count, min, max, mean, population standard deviation and the time of the worst (longest) pair, per kind. */
function kindStats(dump: Dump, sums: Float64Array): { stats: DelayStats[]; meanTicks: number[] } {
  const s = secondsOf(dump.timescale);
  const meanTicks = [0, 1, 2].map((k) => sums[8 * k + 1] + sums[8 * k + 2] / sums[8 * k]);
  const stats = [0, 1, 2].map((k): DelayStats => {
    const [n, , sum, sumSq, min, max, worstAt] = sums.subarray(8 * k, 8 * k + 7);
    if (n === 0) return { count: 0, min_s: null, max_s: null, mean_s: null, std_s: null, worst_time_s: null };
    const meanX = sum / n;
    const variance = Math.max(0, sumSq / n - meanX * meanX);
    return { count: n, min_s: s(min), max_s: s(max), mean_s: s(meanTicks[k]), std_s: s(Math.sqrt(variance)), worst_time_s: s(worstAt) };
  });
  return { stats, meanTicks };
}

export function measureDelay(dump: Dump, opts: DelayOptions): DelayResult {
  const level = opts.level ?? MESIAL;
  const ts = dump.timescale;
  const s = secondsOf(ts);
  const win = opts.windowS === undefined ? Infinity : windowTicks(ts, opts.windowS);
  const fromSig = dump.signals[opts.from.net.signal];
  const toSig = dump.signals[opts.to.net.signal];
  const edgesOf = (ref: NetRef, lv: LevelSpec | undefined) => edgeList(dump, ref, { level: lv ?? level });
  // The pairs over edge lists: made now for any nets but two 1-bit ones, else when first asked for.
  let listed: { from: EdgeList; to: EdgeList; pairs: PairList } | null = null;
  const listedPairs = () => {
    if (!listed) {
      const from = edgesOf(opts.from, opts.fromLevel);
      const to = edgesOf(opts.to, opts.toLevel);
      listed = { from, to, pairs: pairEdges(from, to, win) };
    }
    return listed;
  };
  let sums: Float64Array;
  let unpaired: number;
  let spans: UnknownSpan[];
  if (fromSig.kind === 'logic' && toSig.kind === 'logic' && !opts.keepLists) {
    sums = newDelaySums();
    const fromSpans: Spans = { unknown: [], unknownState: [] };
    const toSpans: Spans = { unknown: [], unknownState: [] };
    unpaired = pairLogicNets(dump.times, fromSig, toSig, win, sums, fromSpans, toSpans);
    closeSpans(fromSpans.unknown);
    closeSpans(toSpans.unknown);
    spans = [...unknownSpans(dump, { label: opts.from.label, ...fromSpans }), ...unknownSpans(dump, { label: opts.to.label, ...toSpans })];
  } else {
    const { from, to, pairs } = listedPairs();
    sums = pairs.sums;
    unpaired = pairs.unpairedCount;
    spans = [...unknownSpans(dump, from), ...unknownSpans(dump, to)];
  }
  const { stats, meanTicks } = kindStats(dump, sums);
  const [plh, phl, pd] = stats;
  const maxOf = (k: number) => sums[8 * k + 5];
  // Figures from ticks, converted once, so 1/tpd and |tPHL − tPLH| are as exact as the unit allows.
  const tpd = Math.max(maxOf(PLH), maxOf(PHL), maxOf(PD));
  const both = plh.count > 0 && phl.count > 0;
  const result: DelayResult = {
    from: opts.from.label,
    to: opts.to.label,
    level: level.text,
    window_s: opts.windowS ?? null,
    pairs: [],
    unpaired,
    unpaired_edges: [],
    tPLH: plh,
    tPHL: phl,
    tPD: pd,
    tpd_s: Number.isFinite(tpd) ? s(tpd) : null,
    tskp_s: both ? s(Math.abs(meanTicks[PHL] - meanTicks[PLH])) : null,
    tskp_worst_s: both ? s(Math.abs(maxOf(PHL) - maxOf(PLH))) : null,
    // fmax = 1/tpd when tpd is taken to include the register overhead (common practice; see the
    // test that checks it for the textbook).
    fmax_hz: Number.isFinite(tpd) && tpd > 0 ? ticksToHertz(ts, tpd) : null,
    caution: TIMING_CAUTION,
    unknown_spans: spans,
  };
  lazyField(result, 'pairs', () => {
    const { from, to, pairs } = listedPairs();
    const out: DelayPair[] = new Array(pairs.count);
    let p = 0;
    for (let j = 0; j < to.count; j++) {
      const fi = pairs.fromOf[j];
      if (fi < 0) continue;
      out[p++] = {
        kind: PAIR_KINDS[pairKind(to, to.dir[j])],
        from_edge: EDGE_NAMES[from.dir[fi]],
        from_time_s: s(from.ticks[fi]),
        to_edge: EDGE_NAMES[to.dir[j]],
        to_time_s: s(to.ticks[j]),
        delay_s: s(to.ticks[j] - from.ticks[fi]),
      };
    }
    return out;
  });
  lazyField(result, 'unpaired_edges', () => {
    const { to, pairs } = listedPairs();
    const out: UnpairedEdge[] = new Array(pairs.unpairedCount);
    let k = 0;
    for (let j = 0; j < to.count; j++) {
      const fi = pairs.fromOf[j];
      if (fi < 0) out[k++] = { to_edge: EDGE_NAMES[to.dir[j]], to_time_s: s(to.ticks[j]), reason: UNPAIRED_REASONS[-1 - fi] };
    }
    return out;
  });
  if (opts.keepLists) LISTS.set(result, listedPairs());
  return result;
}
