// Level of detail: turns a signal's changes into at most a few spans per pixel column.
// A column holding one change keeps that change's exact position. A column holding two or more
// becomes part of a "dense" span carrying the OR of the classes seen there, so a pulse of any
// width still lights at least one full column. Runs of adjacent dense columns merge into one
// span. Work per frame is O(columns · log changes): changes are never walked one by one.

import type { Dump } from '../model/dump';
import { changeInEffectAt } from '../model/lookup';
import { type AnalogSummary, type StepSummary, classMask, valueRange } from './summary';

/** What is on screen: tick at x = 0, ticks per pixel, width in pixels. */
export interface Window {
  t0: number;
  tpp: number;
  width: number;
}

/** Class value for a dense span (its `mask` says what happened inside). */
export const DENSE = 255;
/** No value yet (before the first change). */
export const NONE = 254;

/** Spans in pixels, left to right, touching: span k covers [x0[k], x1[k]). */
export class Spans {
  n = 0;
  x0 = new Float64Array(64);
  x1 = new Float64Array(64);
  cls = new Uint8Array(64);
  /** Change index in effect (for value text), or -1 for dense spans. */
  index = new Int32Array(64);
  mask = new Uint16Array(64);

  push(x0: number, x1: number, cls: number, index: number, mask: number): void {
    if (x1 <= x0 || cls === NONE) return;
    if (this.n === this.x0.length) this.grow();
    const k = this.n++;
    this.x0[k] = x0;
    this.x1[k] = x1;
    this.cls[k] = cls;
    this.index[k] = index;
    this.mask[k] = mask;
  }

  private grow(): void {
    const n = this.x0.length * 2;
    const f = <T extends Float64Array | Uint8Array | Int32Array | Uint16Array>(a: T, b: T): T => {
      b.set(a);
      return b;
    };
    this.x0 = f(this.x0, new Float64Array(n));
    this.x1 = f(this.x1, new Float64Array(n));
    this.cls = f(this.cls, new Uint8Array(n));
    this.index = f(this.index, new Int32Array(n));
    this.mask = f(this.mask, new Uint16Array(n));
  }
}

/**
 * Where each pixel column starts in the dump's timestamp table: `first[c]` is the index of the
 * first timestamp whose column (floor((t − t0) / tpp)) is c or later, for c in [0, width + 1].
 * The column of a change then follows from its time index alone (column ≥ c exactly when its
 * index ≥ first[c], since the column of a time never decreases as time grows), so the searches
 * below compare integers and every lane of a frame shares one table, built in O(width · log T).
 */
export class ColumnStarts {
  first = new Int32Array(0);
  private times: Float64Array | null = null;
  private t0 = NaN;
  private tpp = NaN;
  private width = -1;

  /** The table for this dump's timestamps and this window (kept while both stay the same). */
  for(dump: Dump, w: Window): Int32Array {
    const times = dump.times;
    if (times === this.times && w.t0 === this.t0 && w.tpp === this.tpp && w.width === this.width) return this.first;
    const cols = Math.max(0, Math.ceil(w.width)) + 2;
    if (this.first.length !== cols) this.first = new Int32Array(cols);
    const T = times.length;
    let lo = 0;
    for (let c = 0; c < cols; c++) {
      // First index in [lo, T) whose column is at least c (the answer never moves left).
      let hi = T;
      while (lo < hi) {
        const m = (lo + hi) >>> 1;
        if (Math.floor((times[m] - w.t0) / w.tpp) < c) lo = m + 1;
        else hi = m;
      }
      this.first[c] = lo;
    }
    this.times = times;
    this.t0 = w.t0;
    this.tpp = w.tpp;
    this.width = w.width;
    return this.first;
  }
}

const shared = new ColumnStarts();

/**
 * Time index where the columns after `col` begin. A change before the window's end lies in a
 * column of at most `width`, so col + 1 is in the table; should rounding ever say otherwise, the
 * rest of the dump counts as one column, off screen, rather than reading past the table.
 */
function limitAfter(first: Int32Array, col: number, timeCount: number): number {
  return col + 1 < first.length ? first[col + 1] : timeCount;
}

/**
 * First k in [lo, n) whose time index is at least `limit` (n if none): with limit = first[c + 1],
 * the first change in a column after c. The search starts at lo + `guess` (how many changes the
 * caller expects past lo: the last column's count, when zoomed out, is a close guess) and gallops
 * outwards from there, so a column of m changes costs O(log |m − guess|) reads, not O(log m).
 */
function firstAtOrAfter(idx: Uint32Array, n: number, lo: number, limit: number, guess: number): number {
  if (lo >= n || idx[lo] >= limit) return lo;
  // Bracket the answer in (a, b]: idx[a] < limit, and b === n or idx[b] >= limit.
  let a = lo;
  let b = n;
  const p = lo + (guess > 1 ? guess : 1);
  if (p < n && idx[p] >= limit) {
    // Past it: step back from p by doubling strides.
    b = p;
    for (let step = 1; p - step > a; step *= 2) {
      const q = p - step;
      if (idx[q] < limit) {
        a = q;
        break;
      }
      b = q;
    }
  } else {
    if (p < n) a = p;
    // Not there yet: step forward by doubling strides.
    for (let step = 1; a + step < n; step *= 2) {
      const q = a + step;
      if (idx[q] >= limit) {
        b = q;
        break;
      }
      a = q;
    }
  }
  let l = a + 1;
  let h = b;
  while (l < h) {
    const m = (l + h) >>> 1;
    if (idx[m] < limit) l = m + 1;
    else h = m;
  }
  return l;
}

/** Pixel x where the dump ends (values hold until the last timestamp). */
function endX(dump: Dump, w: Window): number {
  const end = Math.max(dump.endTick, dump.times.length ? dump.times[dump.times.length - 1] : 0);
  return Math.min(w.width, (end - w.t0) / w.tpp);
}

/** Spans of a 1-bit, event, vector or string signal. */
export function decimateSteps(dump: Dump, s: StepSummary, w: Window, out: Spans): Spans {
  out.n = 0;
  const sig = s.sig;
  const n = sig.count;
  if (n === 0 || w.width <= 0 || !(w.tpp > 0)) return out;
  const times = dump.times;
  const idx = sig.timeIndex;
  const cls = s.classes;
  const tEnd = w.t0 + w.width * w.tpp;
  const first = shared.for(dump, w);
  const i = changeInEffectAt(dump, sig, w.t0);
  let cur = i >= 0 ? cls[i] : NONE;
  let curIndex = i;
  let x = 0;
  let j = i + 1;
  // Changes in the last column searched: the guess for the next one.
  let perColumn = 1;
  while (j < n) {
    const tj = times[idx[j]];
    if (tj >= tEnd) break;
    const xj = (tj - w.t0) / w.tpp;
    const col = Math.floor(xj);
    const k = firstAtOrAfter(idx, n, j + 1, limitAfter(first, col, times.length), perColumn - 1);
    perColumn = k - j;
    if (k === j + 1) {
      out.push(x, xj, cur, curIndex, 0);
      x = xj;
      cur = cls[j];
      curIndex = j;
      j++;
      continue;
    }
    // Two or more changes in this column: a dense run starts here.
    out.push(x, col, cur, curIndex, 0);
    const runFirst = j;
    const d0 = Math.max(col, x);
    let d1 = col + 1;
    j = k;
    while (j < n) {
      const t = times[idx[j]];
      if (t >= tEnd) break;
      const c = Math.floor((t - w.t0) / w.tpp);
      if (c !== d1) break;
      const k2 = firstAtOrAfter(idx, n, j + 1, limitAfter(first, c, times.length), perColumn - 1);
      perColumn = k2 - j;
      if (k2 === j + 1) break;
      d1 = c + 1;
      j = k2;
    }
    // The run's classes in one query over all its changes, not one per column.
    const mask = (cur === NONE ? 0 : 1 << cur) | classMask(s, runFirst, j);
    cur = cls[j - 1];
    curIndex = j - 1;
    out.push(d0, d1, DENSE, -1, mask);
    x = d1;
  }
  out.push(x, endX(dump, w), cur, curIndex, 0);
  return out;
}

/**
 * Points of a real signal for a linear plot, plus a min–max bar for each dense column.
 * NaN values (dumping off) break the line. The first point may lie left of the window and the
 * last right of it, so the line enters and leaves at the right slope.
 */
export class Trace {
  n = 0;
  x = new Float64Array(64);
  v = new Float64Array(64);
  bars = 0;
  bx = new Float64Array(16);
  bmin = new Float64Array(16);
  bmax = new Float64Array(16);

  point(x: number, v: number): void {
    if (this.n === this.x.length) {
      this.x = grow64(this.x);
      this.v = grow64(this.v);
    }
    this.x[this.n] = x;
    this.v[this.n++] = v;
  }

  bar(x: number, lo: number, hi: number): void {
    if (this.bars === this.bx.length) {
      this.bx = grow64(this.bx);
      this.bmin = grow64(this.bmin);
      this.bmax = grow64(this.bmax);
    }
    this.bx[this.bars] = x;
    this.bmin[this.bars] = lo;
    this.bmax[this.bars++] = hi;
  }
}

function grow64(a: Float64Array<ArrayBuffer>): Float64Array<ArrayBuffer> {
  const b = new Float64Array(a.length * 2);
  b.set(a);
  return b;
}

export function decimateAnalog(dump: Dump, s: AnalogSummary, w: Window, out: Trace): Trace {
  out.n = 0;
  out.bars = 0;
  const sig = s.sig;
  const n = sig.count;
  if (n === 0 || w.width <= 0 || !(w.tpp > 0)) return out;
  const times = dump.times;
  const idx = sig.timeIndex;
  const reals = sig.reals;
  const ramp = s.sampleTicks;
  const tEnd = w.t0 + w.width * w.tpp;
  const first = shared.for(dump, w);
  let perColumn = 1;
  const range: [number, number] = [0, 0];
  let lastK = -2;
  let lastT = Number.NaN;
  let lastV = Number.NaN;
  /**
   * A sample, preceded by the knee where the sample before it stops being held and ramps to it.
   * (Between samples that are not neighbours, a dense column's bar already covers the gap.)
   */
  const sample = (k: number) => {
    const t = times[idx[k]];
    const v = reals[k];
    if (k === lastK + 1 && t - lastT > ramp && !Object.is(v, lastV)) out.point((t - ramp - w.t0) / w.tpp, lastV);
    out.point((t - w.t0) / w.tpp, v);
    lastK = k;
    lastT = t;
    lastV = v;
  };
  const i = changeInEffectAt(dump, sig, w.t0);
  if (i >= 0) sample(i);
  let j = i + 1;
  while (j < n) {
    const tj = times[idx[j]];
    if (tj >= tEnd) break;
    const col = Math.floor((tj - w.t0) / w.tpp);
    const k = firstAtOrAfter(idx, n, j + 1, limitAfter(first, col, times.length), perColumn - 1);
    perColumn = k - j;
    sample(j);
    if (k > j + 1) {
      // Many samples in one column: a bar from their lowest to highest, then the last one.
      valueRange(s, j, k, range);
      if (range[0] <= range[1]) out.bar(col + 0.5, range[0], range[1]);
      sample(k - 1);
    }
    j = k;
  }
  if (j < n) sample(j);
  else if (out.n > 0) {
    // Hold the last value to the end of the dump.
    const xe = endX(dump, w);
    if (xe > out.x[out.n - 1]) out.point(xe, out.v[out.n - 1]);
  }
  return out;
}
