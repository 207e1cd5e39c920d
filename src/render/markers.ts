// Measurement marks on the traces: delay markers from the cause edge on the `from` lane to the
// effect edge on the `to` lane (labelled tPLH/tPHL with the value when there is room), skew bands
// from the earliest to the latest edge of each event across the group's lanes, glitch flags on
// each net, and limit violations. Items come as sorted typed arrays; each layer binary-searches
// the visible window and then steps a pixel at a time, so a frame costs what the canvas can show
// (at most a few marks per pixel column), never what the dump holds. Pure (Pen, no pixi).
// Colours: tPLH bluish green and tPHL reddish purple (Okabe–Ito), each also labelled with its name;
// problems (violations, glitches) in vermillion with a hatch or a flag, so no mark relies on hue
// alone.

import type { Body } from './paint';
import { Z } from './paint';
import { type Bucket, hatch } from './pen';
import type { MarkerContext, MarkerLayer } from './stage';
import type { ThemeName } from './theme';

export interface MarkPalette {
  rise: number;
  fall: number;
  change: number;
  band: number;
  problem: number;
  ink: number;
  focus: number;
}

export const MARK_COLORS: Record<ThemeName, MarkPalette> = {
  paper: { rise: 0x00785a, fall: 0xa8407e, change: 0x5c5850, band: 0x0072b2, problem: 0xc85200, ink: 0x2a2925, focus: 0x0072b2 },
  slate: { rise: 0x4fd2ae, fall: 0xee92c6, change: 0xb8c0d0, band: 0x74c0f0, problem: 0xff8a4c, ink: 0xe2e7f0, focus: 0x74c0f0 },
};

/**
 * First index i in [lo, hi) with a[i] >= x (hi when none). It gallops from lo before halving, so
 * stepping along a sorted array from one mark to the next a few pixels on costs O(log distance),
 * not O(log n): a frame's walk over the visible marks stays cheap however many there are.
 */
export function lowerBound(a: ArrayLike<number>, x: number, lo = 0, hi = a.length): number {
  if (lo >= hi || a[lo] >= x) return lo;
  // a[lo] < x: gallop to bracket the answer in (lo, top].
  let step = 1;
  let top = lo + 1;
  while (top < hi && a[top] < x) {
    lo = top;
    step *= 2;
    top = lo + step;
  }
  if (top > hi) top = hi;
  lo++;
  while (lo < top) {
    const mid = (lo + top) >>> 1;
    if (a[mid] < x) lo = mid + 1;
    else top = mid;
  }
  return lo;
}

/** The same over the items `idx[lo..hi)` point to: first j with a[idx[j]] >= x. */
export function lowerBoundVia(a: ArrayLike<number>, idx: ArrayLike<number>, x: number, lo: number, hi: number): number {
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (a[idx[mid]] < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** What a layer needs to know about measured items (see src/view/measure/types.ts). */
export interface MarkItems {
  count: number;
  start: Float64Array;
  end: Float64Array;
  value: Float64Array;
  kind: Uint8Array;
  flags: Uint8Array;
}

const VIOLATES = 2;

export interface LayerStats {
  /** Marks drawn in the last frame (for tests and the status line). */
  drawn: number;
  /** Items the layer looked at in the last frame: bounded by the canvas width, not the item count. */
  visited: number;
}

const px = (v: number) => Math.floor(v) + 0.5;
const mid = (b: Body) => (b.top + b.bottom) / 2;

export interface DelayMarks {
  items: MarkItems;
  /** Row keys of the lanes showing the cause and the effect net. */
  fromRows: string[];
  toRows: string[];
  /** Label of item i ('tPLH 750 ps'). */
  label(i: number): string;
  /** Indices of violating items in time order (drawn even where the pixel stepping skips them). */
  violations: Int32Array;
  /** Item to emphasise (the table's chosen row), or -1. */
  focus: number;
}

/** Delay markers of one measurement. */
export class DelayLayer implements MarkerLayer {
  readonly id: string;
  data: DelayMarks | null = null;
  readonly stats: LayerStats = { drawn: 0, visited: 0 };

  constructor(
    id: string,
    private readonly theme: () => ThemeName,
    private readonly charWidth: () => number,
  ) {
    this.id = id;
  }

  draw(ctx: MarkerContext): void {
    this.stats.drawn = 0;
    this.stats.visited = 0;
    const d = this.data;
    if (!d || d.items.count === 0) return;
    const bodies = d.toRows.map((k) => ctx.body(k)).filter((b): b is Body => b !== null);
    const fromBodies = d.fromRows.map((k) => ctx.body(k)).filter((b): b is Body => b !== null);
    if (bodies.length === 0 && fromBodies.length === 0) return;
    const pal = MARK_COLORS[this.theme()];
    const it = d.items;
    const t0 = ctx.t0;
    const t1 = ctx.t0 + ctx.tpp * ctx.width;
    // Pairs are sorted by both edges; those with the effect edge at or after t0 start here.
    let k = lowerBound(it.end, t0, 0, it.count);
    const cw = this.charWidth();
    while (k < it.count && it.start[k] <= t1) {
      this.stats.visited++;
      const xs = ctx.xOf(it.start[k]);
      const xe = ctx.xOf(it.end[k]);
      // The next pair drawn is at least 2 px further on; its start bounds this label's room.
      const next = lowerBound(it.end, ctx.t0 + (Math.max(xe, xs) + 2) * ctx.tpp, k + 1, it.count);
      const room = next < it.count ? ctx.xOf(it.start[next]) - xs : ctx.width - xs;
      this.pair(ctx, pal, d, k, xs, xe, fromBodies, bodies, room, cw);
      k = next;
    }
    // Violations on top, each of them, thinned only where they share a pixel.
    const v = d.violations;
    let j = lowerBoundVia(it.end, v, t0, 0, v.length);
    let lastX = -Infinity;
    for (; j < v.length && it.start[v[j]] <= t1; j++) {
      const i = v[j];
      const xs = ctx.xOf(it.start[i]);
      const xe = ctx.xOf(it.end[i]);
      if (xe - lastX < 1) continue;
      lastX = xe;
      this.stats.visited++;
      for (const b of bodies) this.violation(ctx, pal, xs, xe, b);
    }
    if (d.focus >= 0 && d.focus < it.count) {
      const xs = ctx.xOf(it.start[d.focus]);
      const xe = ctx.xOf(it.end[d.focus]);
      if (xe >= -2 && xs <= ctx.width + 2) {
        const l = Math.floor(Math.min(xs, xe)) - 3;
        ctx.pen.rects(Z.band, pal.focus, 0.16).rect(l, 30, Math.max(7, Math.abs(xe - xs) + 6), ctx.height - 30);
      }
    }
  }

  private violation(ctx: MarkerContext, pal: MarkPalette, xs: number, xe: number, b: Body): void {
    const l = Math.floor(Math.min(xs, xe));
    const r = Math.max(l + 3, Math.ceil(Math.max(xs, xe)));
    ctx.pen.rects(Z.fill, pal.problem, 0.22).rect(l, b.top, r - l, b.bottom - b.top);
    hatch(ctx.pen.lines(Z.hatch, pal.problem, 0.9), l, b.top, r, b.bottom, 4);
    this.stats.drawn++;
  }

  private pair(ctx: MarkerContext, pal: MarkPalette, d: DelayMarks, i: number, xs: number, xe: number, from: Body[], to: Body[], room: number, cw: number): void {
    const kind = d.items.kind[i];
    const color = kind === 0 ? pal.rise : kind === 1 ? pal.fall : pal.change;
    const pen = ctx.pen;
    const line = pen.lines(Z.marker, color);
    const xa = px(xs);
    const xb = px(xe);
    if (xe - xs < 4) {
      // Zoomed out: a short tick at the effect edge says "a pair ends here".
      for (const b of to) pen.rects(Z.marker, color).rect(Math.floor(xe), b.top - 5, 1, 4);
      this.stats.drawn++;
      return;
    }
    for (const b of to) {
      const y = px(mid(b));
      // A dotted guide from the cause edge on the `from` lanes down (or up) to this lane's middle.
      const guide = pen.lines(Z.marker, color, 0.75);
      for (const f of from) {
        const y0 = Math.min(mid(f), y);
        const y1 = Math.max(mid(f), y);
        for (let yy = y0; yy < y1; yy += 4) guide.seg(xa, yy, xa, Math.min(y1, yy + 2));
      }
      // The span from cause to effect at mid height, between the trace's two levels, with a head.
      line.seg(xa, y - 3, xa, y + 4);
      line.seg(xa, y, xb - 1, y);
      const r = pen.rects(Z.marker, color);
      for (let k = 0; k < 4; k++) r.rect(Math.floor(xe) - 1 - k, Math.floor(y) - k, 1, 2 * k + 1);
      const text = d.label(i);
      const w = text.length * cw;
      if (room >= w + 10) {
        // The label sits in the lane's caption strip, over the span.
        const violating = (d.items.flags[i] & VIOLATES) !== 0;
        const cx = Math.max(xa + w / 2, Math.min(ctx.width - w / 2 - 4, (xa + xb) / 2));
        const ly = b.top - 8;
        pen.rects(Z.fill, ctx.theme.background, 0.9).rect(Math.floor(cx - w / 2) - 3, Math.floor(ly) - 6, w + 6, 12);
        pen.text(text, cx, ly, violating ? pal.problem : color, 0.5);
      }
    }
    for (const f of from) line.seg(xa, f.top - 3, xa, f.top + 3);
    this.stats.drawn++;
  }
}

export interface SkewMarks {
  items: MarkItems;
  /** Row keys of the group's lanes. */
  rows: string[];
  /** Longest event (ticks), so events that start before the window but reach into it are found. */
  maxSpan: number;
  label(i: number): string;
  focus: number;
}

/** Skew bands of one measurement: earliest to latest edge of each event, across the group's lanes. */
export class SkewLayer implements MarkerLayer {
  readonly id: string;
  data: SkewMarks | null = null;
  readonly stats: LayerStats = { drawn: 0, visited: 0 };

  constructor(
    id: string,
    private readonly theme: () => ThemeName,
    private readonly charWidth: () => number,
  ) {
    this.id = id;
  }

  draw(ctx: MarkerContext): void {
    this.stats.drawn = 0;
    this.stats.visited = 0;
    const d = this.data;
    if (!d || d.items.count === 0) return;
    const bodies = d.rows.map((k) => ctx.body(k)).filter((b): b is Body => b !== null);
    if (bodies.length === 0) return;
    const top = Math.min(...bodies.map((b) => b.top)) - 2;
    const bottom = Math.max(...bodies.map((b) => b.bottom)) + 2;
    const pal = MARK_COLORS[this.theme()];
    const it = d.items;
    const t1 = ctx.t0 + ctx.tpp * ctx.width;
    const fill = ctx.pen.rects(Z.band, pal.band, 0.16);
    const bad = ctx.pen.rects(Z.band, pal.problem, 0.22);
    const edge = ctx.pen.lines(Z.marker, pal.band, 0.95);
    const badEdge = ctx.pen.lines(Z.marker, pal.problem);
    const cw = this.charWidth();
    let k = lowerBound(it.start, ctx.t0 - d.maxSpan, 0, it.count);
    while (k < it.count && it.start[k] <= t1) {
      this.stats.visited++;
      const xs = ctx.xOf(it.start[k]);
      const xe = ctx.xOf(it.end[k]);
      const next = lowerBound(it.start, ctx.t0 + (xs + 2) * ctx.tpp, k + 1, it.count);
      if (xe >= 0) {
        const violating = (it.flags[k] & VIOLATES) !== 0;
        const l = Math.floor(xs);
        const w = Math.max(1, Math.ceil(xe) - l);
        (violating ? bad : fill).rect(l, top, w, bottom - top);
        const e = violating ? badEdge : edge;
        e.seg(px(xs), top, px(xs), bottom);
        if (xe - xs >= 1) e.seg(px(xe), top, px(xe), bottom);
        if (violating) hatch(ctx.pen.lines(Z.hatch, pal.problem, 0.8), l, top, l + Math.max(3, w), bottom, 5);
        const room = next < it.count ? ctx.xOf(it.start[next]) - xs : ctx.width - xs;
        const text = d.label(k);
        const tw = text.length * cw;
        if (room >= tw + 12 && top - 8 > 30) ctx.pen.text(text, Math.max(xs, 0) + 3, top - 7, violating ? pal.problem : pal.ink, 0);
        this.stats.drawn++;
      }
      k = next;
    }
    if (d.focus >= 0 && d.focus < it.count) {
      const xs = ctx.xOf(it.start[d.focus]);
      const xe = ctx.xOf(it.end[d.focus]);
      ctx.pen.rects(Z.band, pal.focus, 0.14).rect(Math.floor(xs) - 3, 30, Math.max(7, xe - xs + 6), ctx.height - 30);
    }
  }
}

/** The buckets a glitch run is drawn into. */
interface GlitchInk {
  block: Bucket;
  flag: Bucket;
  rim: Bucket;
}

/** Columns kept left and right of the canvas, so runs reaching past its edges keep their rims off screen. */
const PAD = 8;
/** Runs wider than this (px) are tinted in a strip WIDE_TINT px tall along the lane's top. */
const WIDE_RUN = 24;
const WIDE_TINT = 4;

export interface GlitchMarks {
  items: MarkItems;
  /**
   * Start and end ticks of the glitches grouped by target (CSR): target t's are at
   * [targetStart[t], targetStart[t + 1]) in time order.
   */
  targetStart: Int32Array;
  start: Float64Array;
  end: Float64Array;
  /** The lanes on screen and the targets (nets or bits) each shows. */
  rows(): Array<{ key: string; targets: number[] }>;
  focus: number;
}

/** Glitch flags on every lane that shows a net or bit with glitches. */
export class GlitchLayer implements MarkerLayer {
  readonly id = 'glitches';
  data: GlitchMarks | null = null;
  readonly stats: LayerStats = { drawn: 0, visited: 0 };
  onDrawn: ((stats: LayerStats) => void) | null = null;

  /** Per column of one lane, the way to the next column its marks do not cover (see paint). */
  private free = new Int32Array(0);

  constructor(private readonly theme: () => ThemeName) {}

  draw(ctx: MarkerContext): void {
    this.stats.drawn = 0;
    this.stats.visited = 0;
    const d = this.data;
    if (d && d.items.count > 0) this.paint(ctx, d);
    this.onDrawn?.(this.stats);
  }

  /**
   * One run of glitch marks on a lane: a tinted block, a rim at each end and a flag above,
   * pointing down at it. A run wider than WIDE_RUN px is tinted along the lane's top edge only,
   * so the trace under it stays readable and a lane full of glitches is not a lane-wide fill.
   */
  private glitchRun(ink: GlitchInk, b: Body, runL: number, runR: number): void {
    const tint = runR - runL > WIDE_RUN ? Math.min(WIDE_TINT, b.bottom - b.top) : b.bottom - b.top;
    ink.block.rect(runL, b.top, runR - runL, tint);
    ink.rim.seg(runL + 0.5, b.top, runL + 0.5, b.bottom);
    ink.rim.seg(runR - 0.5, b.top, runR - 0.5, b.bottom);
    const flag = ink.flag;
    const cx = Math.floor((runL + runR) / 2);
    for (let k = 0; k < 4; k++) flag.rect(cx - 3 + k, b.top - 7 + k, 7 - 2 * k, 1);
    this.stats.drawn++;
  }

  private paint(ctx: MarkerContext, d: GlitchMarks): void {
    const pal = MARK_COLORS[this.theme()];
    const it = d.items;
    const t1 = ctx.t0 + ctx.tpp * ctx.width;
    const ink: GlitchInk = {
      block: ctx.pen.rects(Z.fill, pal.problem, 0.3),
      flag: ctx.pen.rects(Z.marker, pal.problem),
      rim: ctx.pen.lines(Z.marker, pal.problem),
    };
    // Columns a lane's marks cover, from PAD px left of the canvas to PAD right. The union does
    // not depend on the order the marks come in, so the bits of a vector lane need no sorting.
    // free[c] leads to the first column at or after c not covered yet (c itself when c is not
    // covered; column `cols` never is), with paths halved as they are followed: a bit's walk
    // jumps over what earlier bits covered, so a lane costs about its columns plus its marks,
    // not its bits times its columns.
    const cols = Math.max(0, Math.ceil(ctx.width)) + 2 * PAD;
    const { t0, tpp } = ctx;
    const starts = d.start;
    const ends = d.end;
    let visited = 0;
    if (this.free.length < cols + 1) this.free = new Int32Array(cols + 1);
    const free = this.free;
    const firstFree = (c: number): number => {
      while (free[c] !== c) {
        const up = free[free[c]];
        free[c] = up;
        c = up;
      }
      return c;
    };
    for (const row of d.rows()) {
      const b = ctx.body(row.key);
      if (!b) continue;
      for (let c = 0; c <= cols; c++) free[c] = c;
      let marks = 0;
      for (const t of row.targets) {
        const lo = d.targetStart[t];
        const hi = d.targetStart[t + 1];
        let j = lowerBound(ends, t0, lo, hi);
        while (j < hi && starts[j] <= t1) {
          visited++;
          // A mark covers its glitch plus a pixel each side, and at least 3 px.
          const l = Math.floor((starts[j] - t0) / tpp) - 1;
          const r = Math.max(l + 3, Math.ceil((ends[j] - t0) / tpp) + 1);
          const cr = Math.min(cols, r + PAD);
          for (let c = firstFree(Math.max(0, l + PAD)); c < cr; c = firstFree(c + 1)) free[c] = c + 1;
          marks++;
          // Glitches ending in covered columns start in them too (a bit's pulses never overlap):
          // they share the marks there. Go on from the first column not covered yet.
          const c = firstFree(cr);
          if (c >= cols) break;
          j = lowerBound(ends, t0 + (c - PAD) * tpp, j + 1, hi);
        }
      }
      if (marks === 0) continue;
      // Runs: covered columns, with gaps under 3 px closed, so a lane crowded with glitches costs
      // a handful of shapes, and no glitch goes unmarked.
      let runL = 0;
      let runR = -Infinity;
      for (let c = 0; c < cols; c++) {
        if (free[c] === c) continue;
        const x = c - PAD;
        if (x - runR >= 3) {
          if (runR > -Infinity) this.glitchRun(ink, b, runL, runR);
          runL = x;
        }
        c = firstFree(c);
        runR = c - PAD;
      }
      if (runR > -Infinity) this.glitchRun(ink, b, runL, runR);
    }
    this.stats.visited += visited;
    if (d.focus >= 0 && d.focus < it.count) {
      const xs = ctx.xOf(it.start[d.focus]);
      const xe = ctx.xOf(it.end[d.focus]);
      ctx.pen.rects(Z.band, pal.focus, 0.14).rect(Math.floor(xs) - 4, 30, Math.max(9, xe - xs + 8), ctx.height - 30);
    }
  }
}
