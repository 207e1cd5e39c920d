// Glitch search on hand-built dumps. Expected widths are worked out by hand from the changes written
// below: a pulse's width is the time between its two opposite edges (IEEE 181-2011 pulse duration,
// mesial to mesial, which for logic nets is the change time; from memory), and a net changing more
// than once at one timestamp back to where it started is a zero-width glitch (common practice).
import { describe, expect, it } from 'vitest';
import { GlitchSink, MeasureError, findGlitches, glitchOrder } from '../../src/measure';
import { resolveNetList } from '../../src/model/netref';
import { buildDump } from './measure-dumps';

describe('findGlitches', () => {
  const dump = buildDump([
    // high pulse of 1, low pulse of 2, then a wide pulse of 10
    { path: 'top.x', kind: 'logic', changes: [[0, '0'], [11, '1'], [12, '0'], [20, '1'], [22, '0'], [30, '1'], [40, '0']] },
    // zero-width at 15; a pulse with an x inside is not a clean pulse
    { path: 'top.w', kind: 'logic', changes: [[0, '0'], [15, '1'], [15, '0'], [50, '1'], [50, 'x'], [51, '1'], [52, '0']] },
    // bit 1 of a vector pulses for 1 tick
    { path: 'top.bus', kind: 'vector', width: 2, changes: [[0, '00'], [60, '10'], [61, '00']] },
  ]);

  it('finds pulses strictly narrower than the width on every 1-bit net and vector bit, sorted by time then net', () => {
    const r = findGlitches(dump, { maxWidthS: 2e-9 });
    expect(r.glitches).toEqual([
      { net: 'top.x', start_s: 1.1e-8, width_s: 1e-9, polarity: 'high' },
      { net: 'top.w', start_s: 1.5e-8, width_s: 0, polarity: 'zero-width' },
      { net: 'top.bus[1]', start_s: 6e-8, width_s: 1e-9, polarity: 'high' },
    ]);
    expect(r.count).toBe(3);
    expect(r.nets).toBe(4);
    expect(r.max_width_s).toBe(2e-9);
  });

  it('reports high and low pulses by polarity and honours the strict width limit', () => {
    const d = buildDump([{ path: 'top.n', kind: 'logic', changes: [[0, '1'], [10, '0'], [12, '1'], [20, '0'], [23, '1'], [30, '0'], [33, '1']] }]);
    const r = findGlitches(d, { maxWidthS: 3e-9 });
    // Low pulse 10–12 is 2 wide; the high pulses (8, 7) are wide; low pulses 20–23 and 30–33 are exactly 3: not narrower.
    expect(r.glitches).toEqual([{ net: 'top.n', start_s: 1e-8, width_s: 2e-9, polarity: 'low' }]);
    const wider = findGlitches(d, { maxWidthS: 3.5e-9 });
    expect(wider.glitches.map((g) => [g.polarity, g.width_s])).toEqual([
      ['low', 2e-9],
      ['low', 3e-9],
      ['low', 3e-9],
    ]);
  });

  it('expands a named vector into its bits', () => {
    const r = findGlitches(dump, { maxWidthS: 2e-9, nets: resolveNetList(dump, 'top.bus') });
    expect(r.nets).toBe(2);
    expect(r.glitches.map((g) => g.net)).toEqual(['top.bus[1]']);
  });

  it('sorts glitches at one time by net name', () => {
    const d = buildDump([
      { path: 'top.m', kind: 'logic', changes: [[0, '0'], [5, '1'], [6, '0']] },
      { path: 'top.c', kind: 'logic', changes: [[0, '0'], [5, '1'], [6, '0']] },
    ]);
    expect(findGlitches(d, { maxWidthS: 2e-9 }).glitches.map((g) => g.net)).toEqual(['top.c', 'top.m']);
  });

  it('reports runts on real nets whatever their width', () => {
    const changes: Array<[number, number]> = [];
    for (let t = 0; t <= 1000; t++) {
      const v = t < 100 ? 0 : t < 200 ? (0.7 * (t - 100)) / 100 : t < 300 ? 0.7 - (0.7 * (t - 200)) / 100 : t < 500 ? 0 : t < 510 ? (t - 500) / 10 : 1;
      changes.push([t, v]);
    }
    const d = buildDump([{ path: 'top.v', kind: 'real', changes }]);
    const r = findGlitches(d, { maxWidthS: 1e-9 });
    expect(r.glitches).toHaveLength(1);
    expect(r.glitches[0]).toMatchObject({ net: 'top.v', polarity: 'runt' });
  });

  it('rejects a zero or negative width', () => {
    expect(() => findGlitches(dump, { maxWidthS: 0 })).toThrow(MeasureError);
  });
});

describe('glitch order', () => {
  it('sorts by start time, then net name, then the order found, as a comparison sort does (ties, big ticks, equal names)', () => {
    let seed = 2024;
    const next = () => (seed = (seed * 1103515245 + 12345) >>> 0) / 2 ** 32;
    for (let trial = 0; trial < 20; trial++) {
      const T = 1 + Math.floor(next() * 30);
      // Names repeat now and then (aliases of one net are separate targets with their own label).
      const targets = Array.from({ length: T }, (_, t) => ({ net: {} as never, bit: null, label: `top.n${Math.floor(next() * T * 0.7)}` }));
      const sink = new GlitchSink();
      const n = Math.floor(next() * 9000);
      // Ticks from a small set (many ties) and from up to 2^52 (every 16-bit digit matters).
      const pool = Array.from({ length: 40 }, () => (next() < 0.5 ? Math.floor(next() * 100) : Math.floor(next() * 2 ** 52)));
      for (let k = 0; k < n; k++) sink.push(next() < 0.7 ? pool[Math.floor(next() * pool.length)] : next() * 1e6, next() * 10, Math.floor(next() * T), Math.floor(next() * 4));
      const order = glitchOrder({ targets, sink });
      const { tick, target } = sink.flat();
      const rankOf = (t: number) => targets.filter((o, i) => o.label < targets[t].label || (o.label === targets[t].label && i < t)).length;
      const rank = targets.map((_, t) => rankOf(t));
      const want = Array.from({ length: n }, (_, k) => k).sort((a, b) => tick[a] - tick[b] || rank[target[a]] - rank[target[b]] || a - b);
      expect(Array.from(order), `trial ${trial}`).toEqual(want);
    }
  });
});
