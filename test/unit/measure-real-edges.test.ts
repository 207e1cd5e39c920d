import { describe, expect, it } from 'vitest';
import { MeasureError, findEdges, histogramStateLevels, parseLevel } from '../../src/measure';
import { resolveNet } from '../../src/model/netref';
import { buildDump } from './measure-dumps';

/** Samples every tick of a piecewise waveform f(t) for t in [0, end]. */
function sampled(f: (t: number) => number, end: number, step = 1): Array<[number, number]> {
  const out: Array<[number, number]> = [];
  for (let t = 0; t <= end; t += step) out.push([t, f(t)]);
  return out;
}

/** Deterministic pseudo-noise in [-1, 1) (a 32-bit LCG, constants from Numerical Recipes, from memory). */
function noise(seed: number): () => number {
  let x = seed >>> 0;
  return () => {
    x = (Math.imul(x, 1664525) + 1013904223) >>> 0;
    return x / 2 ** 31 - 1;
  };
}

describe('IEEE 181 state levels (histogram mode)', () => {
  it('takes each level as the mean of the samples in its modal bin, not the bin centre', () => {
    // Low state dwells at 0.004 (inside the first of 100 bins over 0..1, centre 0.005); high at 0.993.
    const values: number[] = [];
    for (let k = 0; k < 50; k++) values.push(k % 2 ? 0.004 : 0.0, 1.0);
    for (let k = 0; k < 200; k++) values.push(0.004);
    for (let k = 0; k < 200; k++) values.push(0.993);
    const times = Float64Array.from(values, (_, k) => k);
    const lv = histogramStateLevels(Float64Array.from(values), times, 1);
    expect(lv.method).toBe('histogram-mode');
    // Modal low bin [0, 0.01) holds 25×0 + 225×0.004 → mean 0.0036; high bin [0.99, 1] holds 200×0.993 + 50×1.0.
    expect(lv.low).toBeCloseTo((225 * 0.004) / 250, 12);
    expect(lv.high).toBeCloseTo((200 * 0.993 + 50 * 1.0) / 250, 12);
  });

  it('is not pulled by overshoot, unlike min/max', () => {
    // A rise with 20 % overshoot that rings down: the mode stays at the settled level (IEEE 181 preference for mode over peak).
    const f = (t: number) => (t < 100 ? 0 : 3.3 + 0.66 * Math.exp(-(t - 100) / 5) * Math.cos((t - 100) / 2));
    const samples = sampled(f, 1000);
    const lv = histogramStateLevels(Float64Array.from(samples, (s) => s[1]), Float64Array.from(samples, (s) => s[0]), 1);
    expect(lv.high).toBeCloseTo(3.3, 2);
    expect(lv.low).toBe(0);
  });

  it('falls back to min/max when there are too few samples', () => {
    const lv = histogramStateLevels(Float64Array.from([0.1, 2.9, 0.3]), Float64Array.from([0, 10, 20]), 10);
    expect(lv).toEqual({ low: 0.1, high: 2.9, method: 'min-max' });
  });

  it('weights each sample by how long it holds (a real is written only when it changes)', () => {
    // Low written once and held 1000 ticks; 40 short samples near the high level: the low level must still be 0.
    const v = [0, ...Array.from({ length: 40 }, (_, k) => 3 + (k % 4) * 0.01)];
    const t = [0, ...Array.from({ length: 40 }, (_, k) => 1000 + k)];
    const lv = histogramStateLevels(Float64Array.from(v), Float64Array.from(t), 1);
    expect(lv.low).toBe(0);
    expect(lv.high).toBeGreaterThan(2.99);
  });
});

describe('edges of a real net', () => {
  it('places a linear ramp’s 50 % instant at its middle and its 10–90 % duration at 0.8 of its length', () => {
    // Ideal linear ramp of length T: 50 % at T/2, 10→90 % = 0.8·T (geometry of the ramp; IEEE 181 reference levels).
    const T = 200;
    const f = (t: number) => (t < 100 ? 0 : t < 100 + T ? (3.3 * (t - 100)) / T : t < 800 ? 3.3 : t < 800 + T ? 3.3 - (3.3 * (t - 800)) / T : 0);
    const dump = buildDump([{ path: 'top.v', kind: 'real', changes: sampled(f, 1500) }], { unit: 'ps' });
    const r = findEdges(dump, resolveNet(dump, 'top.v'));
    // The modal bins (1 % of the swing wide) also hold a ramp sample or two, so the levels sit within 0.01 % of the rails.
    expect(Math.abs(r.low!)).toBeLessThan(3.3e-4);
    expect(Math.abs(r.high! - 3.3)).toBeLessThan(3.3e-4);
    expect(r.state_method).toBe('histogram-mode');
    expect(r.edges).toHaveLength(2);
    expect(r.edges[0].edge).toBe('rise');
    const ps = (x: number | null | undefined) => Number(x) / 1e-12;
    expect(Math.abs(ps(r.edges[0].time_s) - 200)).toBeLessThan(0.05);
    expect(Math.abs(ps(r.edges[0].transition_s) - 0.8 * T)).toBeLessThan(0.05);
    expect(r.edges[1].edge).toBe('fall');
    expect(Math.abs(ps(r.edges[1].time_s) - 900)).toBeLessThan(0.05);
    expect(Math.abs(ps(r.edges[1].transition_s) - 0.8 * T)).toBeLessThan(0.05);
  });

  it('keeps a value written once flat until just before the next sample', () => {
    // Ramp sampled every 10 ticks, after a low stretch written once at 0: the first ramp segment
    // starts at 990, not at 0, so the 50 % instant is that of the ramp alone.
    const changes: Array<[number, number]> = [[0, 0]];
    for (let t = 1000; t <= 1100; t += 10) changes.push([t, (t - 1000) / 100]);
    changes.push([3000, 0]);
    const dump = buildDump([{ path: 'top.v', kind: 'real', changes }], { end: 4000 });
    const r = findEdges(dump, resolveNet(dump, 'top.v'));
    expect(r.edges[0].edge).toBe('rise');
    expect(r.edges[0].time_s).toBeCloseTo(1050e-9, 15);
    // The step down at 3000 was written once: it ramps over the last sample interval (2990..3000).
    expect(r.edges[1]).toMatchObject({ edge: 'fall' });
    expect(r.edges[1].time_s).toBeCloseTo(2995e-9, 15);
  });

  it('uses an absolute reference level when given in volts', () => {
    const f = (t: number) => (t < 100 ? 0 : t < 400 ? (3.3 * (t - 100)) / 300 : 3.3);
    const dump = buildDump([{ path: 'top.v', kind: 'real', changes: sampled(f, 1000) }]);
    const r = findEdges(dump, resolveNet(dump, 'top.v'), { level: parseLevel('1.5V') });
    expect(r.level).toBe('1.5V');
    expect(r.reference_value).toBe(1.5);
    expect(r.edges[0].time_s).toBeCloseTo((100 + (1.5 / 3.3) * 300) * 1e-9, 15);
  });

  it('rejects a reference level outside the transition region with a clear message', () => {
    const f = (t: number) => (t < 100 ? 0 : 1.2);
    const dump = buildDump([{ path: 'top.v', kind: 'real', changes: sampled(f, 300) }]);
    expect(() => findEdges(dump, resolveNet(dump, 'top.v'), { level: parseLevel('1.5V') })).toThrow(MeasureError);
    expect(() => findEdges(dump, resolveNet(dump, 'top.v'), { level: parseLevel('1.5V') })).toThrow(/outside its transition region/);
  });

  it('gives exactly one edge per transition when noise crosses 50 % many times (state boundaries as hysteresis)', () => {
    const rnd = noise(12345);
    // Slow ramps so noise of ±10 % of the swing crosses the 50 % level repeatedly during each transition.
    const clean = (t: number) => {
      const p = t % 2000;
      return p < 500 ? 0 : p < 900 ? (p - 500) / 400 : p < 1500 ? 1 : p < 1900 ? 1 - (p - 1500) / 400 : 0;
    };
    const changes = sampled((t) => clean(t) + 0.01 * rnd(), 8000).map(([t, v], k): [number, number] => {
      // Extra ±10 % noise only within the 40–60 % band, where only the hysteresis can keep one edge.
      const c = clean(t);
      return [t, c > 0.4 && c < 0.6 ? v + 0.1 * (k % 2 ? 1 : -1) : v];
    });
    const dump = buildDump([{ path: 'top.v', kind: 'real', changes }]);
    const r = findEdges(dump, resolveNet(dump, 'top.v'));
    expect(r.edges.map((e) => e.edge)).toEqual(['rise', 'fall', 'rise', 'fall', 'rise', 'fall', 'rise', 'fall']);
    expect(r.runts).toEqual([]);
    // The instants stay inside the noisy band around the true 50 % instants (700, 1700, ...).
    r.edges.forEach((e, k) => expect(Math.abs(e.time_s / 1e-9 - (700 + 1000 * k))).toBeLessThan(40));
  });

  it('reports a pulse that crosses 50 % but never reaches the other state band as a runt, not an edge', () => {
    // 0 → peak 0.7 of the swing → back to 0; then a full pulse to 1.
    const f = (t: number) =>
      t < 100 ? 0 : t < 200 ? (0.7 * (t - 100)) / 100 : t < 300 ? 0.7 - (0.7 * (t - 200)) / 100 : t < 500 ? 0 : t < 600 ? (t - 500) / 100 : t < 800 ? 1 : t < 900 ? 1 - (t - 800) / 100 : 0;
    const dump = buildDump([{ path: 'top.v', kind: 'real', changes: sampled(f, 1200) }]);
    const r = findEdges(dump, resolveNet(dump, 'top.v'));
    expect(r.edges.map((e) => [e.edge, Math.round(e.time_s * 1e9)])).toEqual([
      ['rise', 550],
      ['fall', 850],
    ]);
    expect(r.runts).toHaveLength(1);
    expect(r.runts![0].polarity).toBe('high');
    // 50 % crossings of the runt: up at 100 + 100·0.5/0.7, down at 200 + 100·(0.2/0.7).
    // (The histogram levels sit a hair inside the rails, so allow 0.02 ns.)
    expect(Math.abs(r.runts![0].start_s / 1e-9 - (100 + 50 / 0.7))).toBeLessThan(0.02);
    expect(Math.abs(r.runts![0].width_s / 1e-9 - (100 + 100 * (0.2 / 0.7) - 50 / 0.7))).toBeLessThan(0.04);
  });

  it('treats NaN ($dumpoff) as an unknown span and restarts the state machine after it', () => {
    const changes: Array<[number, number]> = [];
    for (let t = 0; t < 100; t++) changes.push([t, t < 50 ? 0 : 1]);
    changes.push([100, Number.NaN]);
    for (let t = 200; t < 300; t++) changes.push([t, t < 250 ? 1 : 0]);
    const dump = buildDump([{ path: 'top.v', kind: 'real', changes }]);
    const r = findEdges(dump, resolveNet(dump, 'top.v'));
    expect(r.edges.map((e) => e.edge)).toEqual(['rise', 'fall']);
    expect(r.unknown_spans).toEqual([{ net: 'top.v', start_s: 1e-7, end_s: 2e-7 }]);
  });
});
