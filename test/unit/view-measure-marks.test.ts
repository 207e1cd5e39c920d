// The canvas marks of measurements (src/render/markers.ts): a frame looks only at what the canvas
// can show. With a million delay pairs in the dump, the whole-run view visits a bounded number of
// them (a few per pixel column), and a zoomed view draws exactly the pairs inside it. Expected
// counts are worked out by hand from the evenly spaced items built here.

import { describe, expect, it } from 'vitest';
import type { Dump } from '../../src/model/dump';
import { DelayLayer, GlitchLayer, SkewLayer, lowerBound, lowerBoundVia } from '../../src/render/markers';
import { Pen } from '../../src/render/pen';
import type { MarkerContext } from '../../src/render/stage';
import { THEMES } from '../../src/render/theme';

function context(t0: number, tpp: number, width = 1000): MarkerContext {
  return {
    pen: new Pen(),
    dump: {} as Dump,
    theme: THEMES.paper,
    width,
    height: 400,
    t0,
    tpp,
    xOf: (tick) => (tick - t0) / tpp,
    body: (key) => (key === 'from' ? { top: 60, bottom: 80 } : { top: 100, bottom: 120 }),
  };
}

/** n pairs, one every 10 ticks, each 3 ticks long; every 1000th violates. */
function pairs(n: number) {
  const start = new Float64Array(n);
  const end = new Float64Array(n);
  const flags = new Uint8Array(n).fill(1);
  const v: number[] = [];
  for (let i = 0; i < n; i++) {
    start[i] = i * 10;
    end[i] = i * 10 + 3;
    if (i % 1000 === 0) {
      flags[i] |= 2;
      v.push(i);
    }
  }
  return { items: { count: n, start, end, value: new Float64Array(n).fill(3e-12), kind: new Uint8Array(n), flags }, violations: Int32Array.from(v) };
}

describe('binary search of the visible window', () => {
  it('finds the first item at or after a time, also through an index list', () => {
    const a = Float64Array.of(1, 3, 3, 7);
    expect([0, 1, 2, 3, 4, 7, 8].map((x) => lowerBound(a, x))).toEqual([0, 0, 1, 1, 3, 3, 4]);
    const idx = Int32Array.of(3, 0, 1); // points at 7, 1, 3 — searched in the order 1, 3, 7 via [1, 2, 0]
    expect(lowerBoundVia(a, Int32Array.of(0, 1, 3), 4, 0, 3)).toBe(2);
    expect(lowerBoundVia(a, idx, 0, 1, 3)).toBe(1);
  });

  it('gives what a scan gives for every start, end and value on arrays with runs of equal items (the galloping search)', () => {
    let seed = 12345;
    const next = () => (seed = (seed * 1103515245 + 12345) >>> 0) / 2 ** 32;
    for (let trial = 0; trial < 40; trial++) {
      const n = 1 + Math.floor(next() * 70);
      const a = new Float64Array(n);
      for (let i = 1; i < n; i++) a[i] = a[i - 1] + (next() < 0.4 ? 0 : Math.floor(next() * 5));
      const perm = Int32Array.from({ length: n }, (_, i) => n - 1 - i); // idx points backwards
      const reversed = Float64Array.from(a).reverse();
      for (let lo = 0; lo <= n; lo++) {
        for (let hi = lo; hi <= n; hi++) {
          for (const x of [-1, a[lo] ?? 0, a[hi - 1] ?? 0, a[Math.floor(next() * n)] + 0.5, a[n - 1] + 1]) {
            let want = lo;
            while (want < hi && a[want] < x) want++;
            expect(lowerBound(a, x, lo, hi)).toBe(want);
            expect(lowerBoundVia(reversed, perm, x, lo, hi)).toBe(want);
          }
        }
      }
    }
  });
});

describe('delay markers', () => {
  const layer = new DelayLayer('d', () => 'paper', () => 7);
  const { items, violations } = pairs(1_000_000);
  layer.data = { items, fromRows: ['from'], toRows: ['to'], violations, focus: -1, label: () => 'tPLH 3 ps' };

  it('the whole run of a million pairs visits at most a few per pixel column', () => {
    const ctx = context(0, 10_000); // 10^7 ticks over 1000 px
    layer.draw(ctx);
    expect(layer.stats.visited).toBeLessThanOrEqual(1000 / 2 + 1000 + 2); // pairs a pixel apart, plus one violation per column
    expect(layer.stats.drawn).toBeGreaterThan(400);
    expect(ctx.pen.primitives).toBeLessThan(20_000);
  });

  it('zoomed in, every pair inside the window is drawn and labelled, and nothing else', () => {
    const ctx = context(5_000_000, 0.1); // ticks 5 000 000 … 5 000 100: pairs 500 000 … 500 010
    layer.draw(ctx);
    // Drawn: 11 pairs, and the violating pair 500 000 once more with its hatch.
    expect(layer.stats.drawn).toBe(11 + 1);
    expect(ctx.pen.texts.filter((t) => t.text === 'tPLH 3 ps')).toHaveLength(11);
  });
});

describe('skew bands', () => {
  it('an event that starts before the window but reaches into it is drawn', () => {
    const layer = new SkewLayer('s', () => 'paper', () => 7);
    const items = { count: 2, start: Float64Array.of(0, 1000), end: Float64Array.of(500, 1100), value: Float64Array.of(5e-10, 1e-10), kind: new Uint8Array(2), flags: Uint8Array.of(1, 1) };
    layer.data = { items, rows: ['to'], maxSpan: 500, focus: -1, label: () => 'skew' };
    layer.draw(context(400, 1));
    expect(layer.stats.drawn).toBe(2);
    layer.draw(context(501, 1));
    expect(layer.stats.drawn).toBe(1);
  });
});

describe('glitch flags', () => {
  it('a lane gathers the glitches of the bits it shows; glitches closer than 3 px share one flag', () => {
    const layer = new GlitchLayer(() => 'paper');
    // Target 0: glitches at 100 and 101; target 1: at 500. Both bits on one lane.
    const items = { count: 3, start: Float64Array.of(100, 101, 500), end: Float64Array.of(100.5, 101.5, 500.5), value: new Float64Array(3), kind: new Uint8Array(3), flags: Uint8Array.of(1, 1, 1) };
    layer.data = { items, targetStart: Int32Array.of(0, 2, 3), start: items.start, end: items.end, rows: () => [{ key: 'to', targets: [0, 1] }], focus: -1 };
    layer.draw(context(0, 1)); // 100 and 101 a pixel apart: one flag; 500 its own
    expect(layer.stats.drawn).toBe(2);
    layer.draw(context(99, 0.1)); // ticks 99 … 199: 100 and 101 are 10 px apart, 500 off screen
    expect(layer.stats.drawn).toBe(2);
    layer.draw(context(450, 0.1)); // ticks 450 … 550: only 500
    expect(layer.stats.drawn).toBe(1);
  });

  it('a lane crowded with glitches draws one run, not one set of shapes per glitch', () => {
    const layer = new GlitchLayer(() => 'paper');
    // 500 glitches two ticks apart over 1000 px (1 tick per px): every one is within 3 px of the next.
    const n = 500;
    const start = Float64Array.from({ length: n }, (_, i) => 2 * i);
    const items = { count: n, start, end: start.map((t) => t + 0.5), value: new Float64Array(n), kind: new Uint8Array(n), flags: new Uint8Array(n).fill(1) };
    layer.data = { items, targetStart: Int32Array.of(0, n), start: items.start, end: items.end, rows: () => [{ key: 'to', targets: [0] }], focus: -1 };
    const ctx = context(0, 1);
    layer.draw(ctx);
    expect(layer.stats.drawn).toBe(1);
    expect(ctx.pen.primitives).toBeLessThan(10);
    // 1000 px wide: tinted along the lane's top (y 100) in a strip, not over the whole lane.
    const tint = [...ctx.pen.buckets.values()].find((b) => b.kind === 'rects' && b.alpha === 0.3)!;
    expect(tint.count).toBe(1);
    expect(tint.data[1]).toBe(100);
    expect(tint.data[3]).toBeLessThan(20);
  });

  it('a 64-bit lane whose bits all glitch everywhere visits about one bit of glitches, not 64', () => {
    // Every bit has a glitch every 2 ticks over 1000 px (1 tick per px).
    const bits = 64;
    const per = 500;
    const n = bits * per;
    const start = Float64Array.from({ length: n }, (_, i) => 2 * (i % per) + (i / per) * 0.01);
    const items = { count: n, start, end: start.map((t) => t + 0.5), value: new Float64Array(n), kind: new Uint8Array(n), flags: new Uint8Array(n).fill(1) };
    const targetStart = Int32Array.from({ length: bits + 1 }, (_, t) => t * per);
    const layer = new GlitchLayer(() => 'paper');
    layer.data = { items, targetStart, start: items.start, end: items.end, rows: () => [{ key: 'to', targets: [...Array(bits).keys()] }], focus: -1 };
    layer.draw(context(0, 1));
    expect(layer.stats.drawn).toBe(1);
    // The first bit's walk visits its glitches (each mark reaches the next); every other bit
    // finds its columns covered after a visit or two, instead of walking its own 500.
    expect(layer.stats.visited).toBeLessThan(per + 2 * bits);
  });

  it('runs on a lane of many bits mark every glitch, claim no column no mark covers, and keep 3 px apart', () => {
    let seed = 99;
    const next = () => (seed = (seed * 1103515245 + 12345) >>> 0) / 2 ** 32;
    for (let trial = 0; trial < 40; trial++) {
      // 6 bits, each with glitches in time order (pulses of one bit never overlap).
      const targets = 6;
      const start: number[] = [];
      const end: number[] = [];
      const targetStart = [0];
      for (let t = 0; t < targets; t++) {
        let at = -200 + next() * 100;
        const count = Math.floor(next() * 25);
        for (let g = 0; g < count; g++) {
          at += 1 + next() * 120;
          const w = next() < 0.2 ? next() * 60 : next() * 2;
          start.push(at);
          end.push(at + w);
          at += w;
        }
        targetStart.push(start.length);
      }
      const n = start.length;
      const items = { count: n, start: Float64Array.from(start), end: Float64Array.from(end), value: new Float64Array(n), kind: new Uint8Array(n), flags: new Uint8Array(n).fill(1) };
      const layer = new GlitchLayer(() => 'paper');
      layer.data = { items, targetStart: Int32Array.from(targetStart), start: items.start, end: items.end, rows: () => [{ key: 'to', targets: [...Array(targets).keys()] }], focus: -1 };
      const width = 300;
      const ctx = context(0, 2.5, width); // ticks 0 … 750
      layer.draw(ctx);
      const rims = [...ctx.pen.buckets.values()].find((b) => b.kind === 'lines');
      const runs = rims ? Array.from({ length: rims.count / 2 }, (_, k) => [rims.data[8 * k] - 0.5, rims.data[8 * k + 4] + 0.5]) : [];
      expect(layer.stats.drawn, `trial ${trial}`).toBe(runs.length);
      for (let k = 1; k < runs.length; k++) expect(runs[k][0] - runs[k - 1][1], `trial ${trial}: gap`).toBeGreaterThanOrEqual(3);
      // Every glitch in the window, its mark as [l, r) px (a pixel each side, at least 3 px wide,
      // clamped 8 px past the edges).
      const marks: Array<[number, number]> = [];
      for (let i = 0; i < n; i++) {
        if (end[i] < 0 || start[i] > 750) continue;
        const l = Math.floor(start[i] / 2.5) - 1;
        marks.push([Math.max(-8, l), Math.min(width + 8, Math.max(l + 3, Math.ceil(end[i] / 2.5) + 1))]);
        const x = Math.max(-8, Math.floor(start[i] / 2.5));
        expect(runs.some(([a, b]) => a <= x && x < b), `trial ${trial}: glitch ${i} unmarked`).toBe(true);
      }
      // The union of all those marks, gaps under 3 px closed: each run drawn lies inside one.
      marks.sort((p, q) => p[0] - q[0]);
      const union: Array<[number, number]> = [];
      for (const [l, r] of marks) {
        const last = union[union.length - 1];
        if (last && l - last[1] < 3) last[1] = Math.max(last[1], r);
        else union.push([l, r]);
      }
      for (const [a, b] of runs) expect(union.some(([l, r]) => l <= a && b <= r), `trial ${trial}: run ${a}…${b}`).toBe(true);
    }
  });
});
