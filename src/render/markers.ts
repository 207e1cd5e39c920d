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
import { hatch } from './pen';
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

/** First index i in [lo, hi) with a[i] >= x (hi when none). */
export function lowerBound(a: ArrayLike<number>, x: number, lo = 0, hi = a.length): number {
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (a[mid] < x) lo = mid + 1;
    else hi = mid;
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

export interface GlitchMarks {
  items: MarkItems;
  /** Glitch indices grouped by target (CSR) and each group in time order. */
  targetStart: Int32Array;
  byTarget: Int32Array;
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

  constructor(private readonly theme: () => ThemeName) {}

  draw(ctx: MarkerContext): void {
    this.stats.drawn = 0;
    this.stats.visited = 0;
    const d = this.data;
    if (d && d.items.count > 0) this.paint(ctx, d);
    this.onDrawn?.(this.stats);
  }

  private paint(ctx: MarkerContext, d: GlitchMarks): void {
    const pal = MARK_COLORS[this.theme()];
    const it = d.items;
    const t1 = ctx.t0 + ctx.tpp * ctx.width;
    const block = ctx.pen.rects(Z.fill, pal.problem, 0.3);
    const flag = ctx.pen.rects(Z.marker, pal.problem);
    const rim = ctx.pen.lines(Z.marker, pal.problem);
    for (const row of d.rows()) {
      const b = ctx.body(row.key);
      if (!b) continue;
      // Per lane, one flag per pixel column: a vector lane gathers the glitches of all its bits.
      const xs: number[] = [];
      for (const t of row.targets) {
        const lo = d.targetStart[t];
        const hi = d.targetStart[t + 1];
        let j = lowerBoundVia(it.end, d.byTarget, ctx.t0, lo, hi);
        while (j < hi && it.start[d.byTarget[j]] <= t1) {
          this.stats.visited++;
          const i = d.byTarget[j];
          const a = ctx.xOf(it.start[i]);
          const e = ctx.xOf(it.end[i]);
          xs.push(a, e);
          j = lowerBoundVia(it.end, d.byTarget, ctx.t0 + (Math.max(a, e) + 3) * ctx.tpp, j + 1, hi);
        }
      }
      if (xs.length === 0) continue;
      const order = xs.length > 2 ? [...Array(xs.length / 2).keys()].sort((p, q) => xs[2 * p] - xs[2 * q]) : [0];
      // Marks closer than a few pixels merge into one run: one block, its two rims and one flag,
      // so a lane crowded with glitches costs a handful of shapes, and no glitch goes unmarked.
      let runL = Infinity;
      let runR = -Infinity;
      const flush = () => {
        if (runL === Infinity) return;
        block.rect(runL, b.top, runR - runL, b.bottom - b.top);
        rim.seg(runL + 0.5, b.top, runL + 0.5, b.bottom);
        rim.seg(runR - 0.5, b.top, runR - 0.5, b.bottom);
        // A flag above the trace, pointing down at the run.
        const cx = Math.floor((runL + runR) / 2);
        for (let k = 0; k < 4; k++) flag.rect(cx - 3 + k, b.top - 7 + k, 7 - 2 * k, 1);
      };
      for (const p of order) {
        const l = Math.floor(xs[2 * p]) - 1;
        const r = Math.max(l + 3, Math.ceil(xs[2 * p + 1]) + 1);
        if (l - runR < 3) {
          runR = Math.max(runR, r);
          continue;
        }
        flush();
        this.stats.drawn++;
        runL = l;
        runR = r;
      }
      flush();
    }
    if (d.focus >= 0 && d.focus < it.count) {
      const xs = ctx.xOf(it.start[d.focus]);
      const xe = ctx.xOf(it.end[d.focus]);
      ctx.pen.rects(Z.band, pal.focus, 0.14).rect(Math.floor(xs) - 4, 30, Math.max(9, xe - xs + 8), ctx.height - 30);
    }
  }
}
