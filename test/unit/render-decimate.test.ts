// Level of detail for the trace canvas. What it must guarantee (common practice for waveform
// drawing): every state a signal holds inside a pixel column is shown in that column, so no
// pulse disappears however far out the view is zoomed; the number of spans stays bounded by
// the canvas width; and the work per frame depends on columns, not on the number of changes.
// Each property is checked against a brute-force walk over every change.

import { describe, expect, it } from 'vitest';
import { DumpBuilder } from '../../src/model/builder';
import type { Dump, Signal } from '../../src/model/dump';
import { Logic } from '../../src/model/dump';
import { ColumnStarts, DENSE, Spans, Trace, type Window, decimateAnalog, decimateSteps } from '../../src/render/decimate';
import { Cls, type AnalogSummary, type StepSummary, classMask, summarizeSignal, valueRange } from '../../src/render/summary';

/** Deterministic pseudo-random numbers (xorshift32), so failures reproduce. */
function rng(seed: number): () => number {
  let s = seed >>> 0 || 1;
  return () => {
    s ^= s << 13;
    s >>>= 0;
    s ^= s >>> 17;
    s ^= s << 5;
    s >>>= 0;
    return s / 2 ** 32;
  };
}

/** A 1-bit signal with changes at the given ticks and codes (the first at tick 0). */
function logicDump(ticks: number[], codes: number[], end = ticks[ticks.length - 1] + 1): { dump: Dump; sig: Signal } {
  const b = new DumpBuilder('t.vcd');
  const s = b.addSignal('logic', 1);
  ticks.forEach((t, i) => {
    b.setTime(t);
    b.pushLogic(s, codes[i]);
  });
  b.setTime(end);
  const dump = b.finish(0, false);
  return { dump, sig: dump.signals[s] };
}

function randomLogic(n: number, seed: number, maxGap: number): { dump: Dump; sig: Signal } {
  const r = rng(seed);
  const ticks: number[] = [];
  const codes: number[] = [];
  let t = 0;
  let prev = -1;
  for (let i = 0; i < n; i++) {
    ticks.push(t);
    let c = r() < 0.05 ? Logic.X : r() < 0.05 ? Logic.Z : r() < 0.5 ? Logic.L0 : Logic.L1;
    if (c === prev) c = c === Logic.L0 ? Logic.L1 : Logic.L0;
    codes.push(c);
    prev = c;
    // Sometimes several changes share one timestamp (zero-width glitches).
    t += r() < 0.1 ? 0 : 1 + Math.floor(r() * maxGap);
  }
  return logicDump(ticks, codes);
}

/** Classes held at any instant of column c, by walking every change. */
function bruteColumn(dump: Dump, s: StepSummary, w: Window, c: number): number {
  const sig = s.sig;
  const a = w.t0 + c * w.tpp;
  const b = w.t0 + (c + 1) * w.tpp;
  let mask = 0;
  let before = -1;
  for (let i = 0; i < sig.count; i++) {
    const t = dump.times[sig.timeIndex[i]];
    if (t <= a) before = i;
    else if (t < b) mask |= 1 << s.classes[i];
  }
  if (before >= 0) mask |= 1 << s.classes[before];
  return mask;
}

/** Classes the spans draw over column c. */
function drawnColumn(spans: Spans, c: number): number {
  let mask = 0;
  for (let k = 0; k < spans.n; k++) {
    // A span touching any part of the open column counts.
    if (spans.x1[k] <= c || spans.x0[k] >= c + 1) continue;
    mask |= spans.cls[k] === DENSE ? spans.mask[k] : 1 << spans.cls[k];
  }
  return mask;
}

describe('decimateSteps', () => {
  it('keeps the exact position of each change when changes are far apart', () => {
    const { dump, sig } = logicDump([0, 10, 25, 40], [Logic.L0, Logic.L1, Logic.L0, Logic.L1], 50);
    const spans = decimateSteps(dump, summarizeSignal(sig, dump.times) as StepSummary, { t0: 0, tpp: 0.5, width: 100 }, new Spans());
    expect(Array.from(spans.x0.subarray(0, spans.n))).toEqual([0, 20, 50, 80]);
    expect(Array.from(spans.x1.subarray(0, spans.n))).toEqual([20, 50, 80, 100]);
    expect(Array.from(spans.cls.subarray(0, spans.n))).toEqual([Cls.Low, Cls.High, Cls.Low, Cls.High]);
  });

  it('shows a one-tick pulse as a dense column when zoomed far out', () => {
    // Low from 0, a 1-tick high pulse at 500 000, low again: 1 000 000 ticks on 100 px.
    const { dump, sig } = logicDump([0, 500_000, 500_001], [Logic.L0, Logic.L1, Logic.L0], 1_000_000);
    const spans = decimateSteps(dump, summarizeSignal(sig, dump.times) as StepSummary, { t0: 0, tpp: 10_000, width: 100 }, new Spans());
    const dense = [...Array(spans.n).keys()].filter((k) => spans.cls[k] === DENSE);
    expect(dense).toHaveLength(1);
    expect(spans.x0[dense[0]]).toBe(50);
    expect(spans.mask[dense[0]] & (1 << Cls.High)).not.toBe(0);
  });

  it('shows a zero-width glitch (two changes at one timestamp)', () => {
    const { dump, sig } = logicDump([0, 30, 30], [Logic.L0, Logic.L1, Logic.L0], 60);
    const spans = decimateSteps(dump, summarizeSignal(sig, dump.times) as StepSummary, { t0: 0, tpp: 1, width: 60 }, new Spans());
    expect(drawnColumn(spans, 30) & (1 << Cls.High)).not.toBe(0);
  });

  it('draws every state held in every column, for random signals at many zoom levels', () => {
    for (const seed of [1, 2, 3]) {
      const { dump, sig } = randomLogic(3000, seed, 40);
      const s = summarizeSignal(sig, dump.times) as StepSummary;
      const end = dump.endTick;
      for (const width of [37, 200]) {
        for (const tpp of [0.3, 1, 7.5, 61, end / width]) {
          for (const t0 of [-5, 13.7, end / 3]) {
            const w = { t0, tpp, width };
            const spans = decimateSteps(dump, s, w, new Spans());
            for (let c = 0; c < width; c++) {
              if (w.t0 + (c + 1) * tpp <= 0 || w.t0 + c * tpp >= end) continue;
              const want = bruteColumn(dump, s, w, c);
              expect(drawnColumn(spans, c) & want, `seed ${seed} tpp ${tpp} t0 ${t0} column ${c}`).toBe(want);
            }
          }
        }
      }
    }
  });

  it('yields at most a few spans per column however many changes are in view', () => {
    const { dump, sig } = randomLogic(200_000, 9, 3);
    const s = summarizeSignal(sig, dump.times) as StepSummary;
    for (const width of [50, 400]) {
      const spans = decimateSteps(dump, s, { t0: 0, tpp: dump.endTick / width, width }, new Spans());
      expect(spans.n).toBeLessThanOrEqual(2 * width + 2);
    }
  });

  it('reads a number of change times and time indexes that follows columns, not changes', () => {
    // Count reads of dump.times and of the signal's time index: zoomed out over 1 000 000
    // changes on 100 columns.
    const { dump, sig } = randomLogic(1_000_000, 4, 2);
    const s = summarizeSignal(sig, dump.times) as StepSummary;
    let reads = 0;
    const counting = <T extends object>(array: T): T =>
      new Proxy(array, {
        get(target, prop) {
          if (typeof prop === 'string' && /^\d+$/.test(prop)) reads++;
          const v = Reflect.get(target, prop, target);
          return typeof v === 'function' ? v.bind(target) : v;
        },
      });
    const spied = { ...dump, times: counting(dump.times) };
    const spiedSummary = { ...s, sig: { ...sig, timeIndex: counting(sig.timeIndex) } };
    const spans = decimateSteps(spied, spiedSummary, { t0: 0, tpp: dump.endTick / 100, width: 100 }, new Spans());
    expect(spans.n).toBeGreaterThan(0);
    // Galloping searches: O(log n) reads per column; far below the 1 000 000 changes.
    expect(reads).toBeLessThan(100 * 6 * Math.log2(1_000_000));
  });

  it('finds where each column starts in the timestamp table, as a walk over every timestamp does', () => {
    const { dump } = randomLogic(5000, 7, 9);
    const starts = new ColumnStarts();
    const end = dump.endTick;
    for (const width of [1, 37, 300]) {
      for (const tpp of [0.3, 1, 7.5, end / width, end]) {
        for (const t0 of [-50.5, 0, 13.7, end / 3, end + 10]) {
          const w = { t0, tpp, width };
          const first = starts.for(dump, w);
          expect(first.length).toBe(width + 2);
          for (let c = 0; c < first.length; c++) {
            let want = dump.times.length;
            for (let ti = 0; ti < dump.times.length; ti++) {
              if (Math.floor((dump.times[ti] - t0) / tpp) >= c) {
                want = ti;
                break;
              }
            }
            expect(first[c], `width ${width} tpp ${tpp} t0 ${t0} column ${c}`).toBe(want);
          }
        }
      }
    }
  });

  it('draws the right levels at a twentieth of a tick per pixel late in a long dump', () => {
    // At 2^51 ticks a double steps by 0.5 tick, so window ends and column times round.
    const base = 2 ** 51;
    const { dump, sig } = logicDump([0, base, base + 3, base + 4, base + 9, base + 10], [Logic.L0, Logic.L1, Logic.L0, Logic.L1, Logic.L0, Logic.L1], base + 40);
    const s = summarizeSignal(sig, dump.times) as StepSummary;
    const w = { t0: base + 0.5, tpp: 0.05, width: 200 };
    const spans = decimateSteps(dump, s, w, new Spans());
    expect(spans.n).toBeGreaterThan(0);
    for (let k = 1; k < spans.n; k++) expect(spans.x0[k]).toBeGreaterThanOrEqual(spans.x0[k - 1]);
    // High from base (left of the window) until base + 3, at x = 2.5 / 0.05 = 50.
    expect(drawnColumn(spans, 10)).toBe(1 << Cls.High);
    expect(drawnColumn(spans, 60)).toBe(1 << Cls.Low);
  });
});

describe('summaries', () => {
  it('give the same class mask as a scan for any range', () => {
    const { dump, sig } = randomLogic(5000, 5, 10);
    const s = summarizeSignal(sig, dump.times) as StepSummary;
    const r = rng(77);
    for (let k = 0; k < 500; k++) {
      const i = Math.floor(r() * 5000);
      const j = i + Math.floor(r() * (5000 - i)) + 1;
      let want = 0;
      for (let q = i; q < j; q++) want |= 1 << s.classes[q];
      expect(classMask(s, i, j)).toBe(want);
    }
  });

  it('give the same min and max as a scan for any range of a real signal', () => {
    const b = new DumpBuilder('r.vcd');
    const id = b.addSignal('real', 64);
    const r = rng(3);
    for (let i = 0; i < 4000; i++) {
      b.setTime(i);
      b.pushReal(id, i % 97 === 0 ? Number.NaN : Math.sin(i / 30) * 5 + r());
    }
    const dump = b.finish(0, false);
    const s = summarizeSignal(dump.signals[id], dump.times) as AnalogSummary;
    for (let k = 0; k < 300; k++) {
      const i = Math.floor(r() * 4000);
      const j = i + Math.floor(r() * (4000 - i)) + 1;
      let lo = Infinity;
      let hi = -Infinity;
      for (let q = i; q < j; q++) {
        const v = dump.signals[id].reals[q];
        if (v < lo) lo = v;
        if (v > hi) hi = v;
      }
      expect(valueRange(s, i, j, [0, 0])).toEqual([lo, hi]);
    }
  });

  it('tell a fully known bus from one with x bits, and an all-z bus from both', () => {
    const b = new DumpBuilder('v.vcd');
    const id = b.addSignal('vector', 4);
    const push = (value: number, unknown: number) => b.pushVector(id, Uint32Array.of(value), Uint32Array.of(unknown), null);
    b.setTime(0);
    push(0b1010, 0); // 1010
    b.setTime(1);
    push(0b0000, 0b0011); // 00xx
    b.setTime(2);
    push(0b1111, 0b1111); // zzzz
    b.setTime(3);
    push(0b0000, 0b1111); // xxxx
    const dump = b.finish(0, false);
    const s = summarizeSignal(dump.signals[id], dump.times) as StepSummary;
    expect(Array.from(s.classes)).toEqual([Cls.Value, Cls.Partial, Cls.Z, Cls.Unknown]);
  });
});

describe('decimateAnalog', () => {
  it('passes through every sample when zoomed in, and brackets dense columns by their min and max', () => {
    const b = new DumpBuilder('a.vcd');
    const id = b.addSignal('real', 64);
    for (let i = 0; i <= 1000; i++) {
      b.setTime(i * 10);
      b.pushReal(id, i % 2 ? 1 : -1);
    }
    const dump = b.finish(0, false);
    const s = summarizeSignal(dump.signals[id], dump.times) as AnalogSummary;
    const near = decimateAnalog(dump, s, { t0: 0, tpp: 1, width: 100 }, new Trace());
    // Samples at 0, 10, … 90 are in view; the one at 100 (the right edge) gives the exit slope.
    expect(Array.from(near.x.subarray(0, near.n))).toEqual([0, 10, 20, 30, 40, 50, 60, 70, 80, 90, 100]);
    expect(Array.from(near.v.subarray(0, near.n))).toEqual([-1, 1, -1, 1, -1, 1, -1, 1, -1, 1, -1]);
    expect(near.bars).toBe(0);
    const far = decimateAnalog(dump, s, { t0: 0, tpp: 100, width: 100 }, new Trace());
    expect(far.bars).toBeGreaterThan(90);
    for (let k = 0; k < far.bars; k++) {
      expect(far.bmin[k]).toBe(-1);
      expect(far.bmax[k]).toBe(1);
    }
    expect(far.n).toBeLessThanOrEqual(2 * 100 + 3);
  });

  it('holds a value flat until one sample interval before the next sample, as the measurement engine reads reals', () => {
    // Samples 0 → 0, 10 → 1, 200 → 0: the shortest interval is 10 ticks, so 1 holds until 190
    // and ramps to 0 at 200 (src/measure/realEdges.ts reads held VCD reals the same way).
    const b = new DumpBuilder('h.vcd');
    const id = b.addSignal('real', 64);
    for (const [t, v] of [[0, 0], [10, 1], [200, 0]]) {
      b.setTime(t);
      b.pushReal(id, v);
    }
    const dump = b.finish(0, false);
    const s = summarizeSignal(dump.signals[id], dump.times) as AnalogSummary;
    expect(s.sampleTicks).toBe(10);
    const tr = decimateAnalog(dump, s, { t0: 0, tpp: 1, width: 300 }, new Trace());
    expect(Array.from(tr.x.subarray(0, tr.n))).toEqual([0, 10, 190, 200]);
    expect(Array.from(tr.v.subarray(0, tr.n))).toEqual([0, 1, 1, 0]);
  });
});
