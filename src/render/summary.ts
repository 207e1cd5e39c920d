// Per-signal summaries that answer "what happened between change i and change j" in
// O(BLOCK + log n), so a pixel column holding a million changes costs the same as one holding
// two. Built once per shown signal in O(n); a few bytes per 16 changes.

import { type Signal, wordsFor } from '../model/dump';

/** Draw classes of a change. A dense column carries the OR of `1 << class` over its changes. */
export const Cls = {
  Low: 0,
  High: 1,
  /** x, and the VHDL states U, W and '-' (no defined level). */
  Unknown: 2,
  Z: 3,
  /** A vector or string value whose every bit is 0 or 1. */
  Value: 4,
  /** An event fired. */
  Event: 5,
  /** A vector value with x or z bits among known ones. */
  Partial: 6,
} as const;
export type ClsCode = (typeof Cls)[keyof typeof Cls];

/** Logic code (index into LOGIC_CHARS '01xzUWLH-') → draw class; weak levels draw as levels. */
const LOGIC_CLASS = new Uint8Array([Cls.Low, Cls.High, Cls.Unknown, Cls.Z, Cls.Unknown, Cls.Unknown, Cls.Low, Cls.High, Cls.Unknown]);

export const BLOCK = 16;

/** Class of one vector change from its planes (texts for states beyond 0/1/x/z). */
function vectorClass(sig: Signal, i: number, words: number): number {
  const t = sig.texts.get(i);
  if (t !== undefined) {
    if (sig.kind === 'string') return Cls.Value;
    let known = 0;
    let z = 0;
    for (let k = 0; k < t.length; k++) {
      const c = t[k];
      if (c === '0' || c === '1' || c === 'L' || c === 'H') known++;
      else if (c === 'z' || c === 'Z') z++;
    }
    if (known === t.length) return Cls.Value;
    if (z === t.length) return Cls.Z;
    return known === 0 && z === 0 ? Cls.Unknown : Cls.Partial;
  }
  const base = i * 2 * words;
  let anyUnknown = false;
  let allUnknown = true;
  let allZ = true;
  const width = sig.width;
  for (let w = 0; w < words; w++) {
    const bitsHere = Math.min(32, width - w * 32);
    const full = bitsHere === 32 ? 0xffffffff : (2 ** bitsHere - 1) >>> 0;
    const u = (sig.planes[base + words + w] & full) >>> 0;
    const v = (sig.planes[base + w] & full) >>> 0;
    if (u !== 0) anyUnknown = true;
    if (u !== full) allUnknown = false;
    if ((u & v) >>> 0 !== full) allZ = false;
  }
  if (!anyUnknown) return Cls.Value;
  if (allUnknown) return allZ ? Cls.Z : Cls.Unknown;
  return Cls.Partial;
}

/** Class of change i of any non-real signal. */
export function classOf(sig: Signal, i: number): number {
  switch (sig.kind) {
    case 'logic':
      return LOGIC_CLASS[sig.logic[i]] ?? Cls.Unknown;
    case 'event':
      return Cls.Event;
    case 'vector':
      return vectorClass(sig, i, wordsFor(sig.width));
    case 'string':
      return Cls.Value;
    default:
      return Cls.Unknown;
  }
}

export interface StepSummary {
  kind: 'steps';
  sig: Signal;
  /** classes[i] for every change (one byte each; cheaper than recomputing vector planes per frame). */
  classes: Uint8Array;
  /** levels[0][b] = OR of class bits over changes [b·BLOCK, (b+1)·BLOCK); levels[L+1] pairs up levels[L]. */
  levels: Uint8Array[];
}

export interface AnalogSummary {
  kind: 'analog';
  sig: Signal;
  mins: Float64Array[];
  maxs: Float64Array[];
  /** Smallest and largest finite value of the whole signal (NaN when none). */
  lo: number;
  hi: number;
  /**
   * Shortest interval between successive settled samples (the last value at each timestamp,
   * repeats dropped), in ticks. A held value is drawn flat until this long before the next sample
   * and then ramps to it: the measurement engine's reading of a VCD real (src/measure/realEdges.ts).
   */
  sampleTicks: number;
}

export type Summary = StepSummary | AnalogSummary;

function pairUp<T extends Uint8Array | Float64Array>(base: T, make: (n: number) => T, join: (a: number, b: number) => number): T[] {
  const levels: T[] = [base];
  let cur = base;
  while (cur.length > 1) {
    const next = make(Math.ceil(cur.length / 2));
    for (let k = 0; k < next.length; k++) {
      const a = cur[2 * k];
      next[k] = 2 * k + 1 < cur.length ? join(a, cur[2 * k + 1]) : a;
    }
    levels.push(next);
    cur = next;
  }
  return levels;
}

/** See AnalogSummary.sampleTicks; 1 tick when there are not two finite samples in a row. */
function shortestSampleInterval(sig: Signal, times: Float64Array): number {
  let best = Infinity;
  let prevT = Number.NaN;
  let prevV = Number.NaN;
  let have = false;
  const n = sig.count;
  for (let i = 0; i < n; i++) {
    const ti = sig.timeIndex[i];
    if (i + 1 < n && sig.timeIndex[i + 1] === ti) continue; // settled value: the last at this time
    const v = sig.reals[i];
    const t = times[ti];
    if (have && Object.is(v, prevV)) continue; // a repeat is no new sample
    if (have && Number.isFinite(v) && Number.isFinite(prevV) && t - prevT < best) best = t - prevT;
    prevT = t;
    prevV = v;
    have = true;
  }
  return Number.isFinite(best) ? best : 1;
}

export function summarizeSignal(sig: Signal, times: Float64Array): Summary {
  const n = sig.count;
  const blocks = Math.ceil(n / BLOCK);
  if (sig.kind === 'real') {
    const mins = new Float64Array(blocks).fill(Infinity);
    const maxs = new Float64Array(blocks).fill(-Infinity);
    for (let i = 0; i < n; i++) {
      const v = sig.reals[i];
      if (!Number.isFinite(v)) continue;
      const b = (i / BLOCK) | 0;
      if (v < mins[b]) mins[b] = v;
      if (v > maxs[b]) maxs[b] = v;
    }
    const minLevels = pairUp(mins, (k) => new Float64Array(k), Math.min);
    const maxLevels = pairUp(maxs, (k) => new Float64Array(k), Math.max);
    const top = minLevels.length - 1;
    const sampleTicks = shortestSampleInterval(sig, times);
    const lo = blocks > 0 ? minLevels[top][0] : Infinity;
    const hi = blocks > 0 ? maxLevels[top][0] : -Infinity;
    return { kind: 'analog', sig, mins: minLevels, maxs: maxLevels, lo: Number.isFinite(lo) ? lo : NaN, hi: Number.isFinite(hi) ? hi : NaN, sampleTicks };
  }
  const classes = new Uint8Array(n);
  const base = new Uint8Array(blocks);
  for (let i = 0; i < n; i++) {
    const c = classOf(sig, i);
    classes[i] = c;
    base[(i / BLOCK) | 0] |= 1 << c;
  }
  return { kind: 'steps', sig, classes, levels: pairUp(base, (k) => new Uint8Array(k), (a, b) => a | b) };
}

/** OR of class bits over changes [i, j). */
export function classMask(s: StepSummary, i: number, j: number): number {
  let m = 0;
  if (j - i <= 2 * BLOCK) {
    for (let k = i; k < j; k++) m |= 1 << s.classes[k];
    return m;
  }
  let bi = Math.ceil(i / BLOCK);
  let bj = Math.floor(j / BLOCK);
  for (let k = i; k < bi * BLOCK; k++) m |= 1 << s.classes[k];
  for (let k = bj * BLOCK; k < j; k++) m |= 1 << s.classes[k];
  for (let level = 0; bi < bj; level++) {
    const arr = s.levels[level];
    if (bi & 1) m |= arr[bi++];
    if (bj & 1) m |= arr[--bj];
    bi >>= 1;
    bj >>= 1;
  }
  return m;
}

/** [min, max] of the finite values of changes [i, j) (Infinity, -Infinity when none). */
export function valueRange(s: AnalogSummary, i: number, j: number, out: [number, number]): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  const reals = s.sig.reals;
  const scan = (a: number, b: number) => {
    for (let k = a; k < b; k++) {
      const v = reals[k];
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  };
  if (j - i <= 2 * BLOCK) scan(i, j);
  else {
    let bi = Math.ceil(i / BLOCK);
    let bj = Math.floor(j / BLOCK);
    scan(i, bi * BLOCK);
    scan(bj * BLOCK, j);
    for (let level = 0; bi < bj; level++) {
      const mins = s.mins[level];
      const maxs = s.maxs[level];
      if (bi & 1) {
        lo = Math.min(lo, mins[bi]);
        hi = Math.max(hi, maxs[bi]);
        bi++;
      }
      if (bj & 1) {
        --bj;
        lo = Math.min(lo, mins[bj]);
        hi = Math.max(hi, maxs[bj]);
      }
      bi >>= 1;
      bj >>= 1;
    }
  }
  out[0] = lo;
  out[1] = hi;
  return out;
}
