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
    layer.data = { items, targetStart: Int32Array.of(0, 2, 3), byTarget: Int32Array.of(0, 1, 2), rows: () => [{ key: 'to', targets: [0, 1] }], focus: -1 };
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
    layer.data = { items, targetStart: Int32Array.of(0, n), byTarget: Int32Array.from({ length: n }, (_, i) => i), rows: () => [{ key: 'to', targets: [0] }], focus: -1 };
    const ctx = context(0, 1);
    layer.draw(ctx);
    expect(layer.stats.drawn).toBe(1);
    expect(ctx.pen.primitives).toBeLessThan(10);
  });
});
