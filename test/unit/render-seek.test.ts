// Cursor snapping and edge search. Digital nets snap to change times; real nets to the
// interpolated crossing of their reference level. Outside check: an RC step response
// v(t) = 1 − e^(−t/RC) crosses 50 % at t = RC·ln 2 (handbook RC charging formula).

import { describe, expect, it } from 'vitest';
import { DumpBuilder } from '../../src/model/builder';
import { Logic } from '../../src/model/dump';
import { nearestChange, nearestCrossing, nextCrossing, nextEdge, nextValue } from '../../src/render/seek';

function logic(ticks: number[], codes: number[]) {
  const b = new DumpBuilder('l.vcd');
  const id = b.addSignal('logic', 1);
  ticks.forEach((t, i) => {
    b.setTime(t);
    b.pushLogic(id, codes[i]);
  });
  const dump = b.finish(0, false);
  return { dump, sig: dump.signals[id] };
}

describe('digital nets', () => {
  const { dump, sig } = logic([0, 10, 20, 20, 35, 50], [Logic.L0, Logic.L1, Logic.L1, Logic.L0, Logic.L0, Logic.X]);

  it('snap to the nearest change within the tolerance, and not beyond it', () => {
    expect(nearestChange(dump, sig, 12, 3)).toBe(10);
    expect(nearestChange(dump, sig, 18, 3)).toBe(20);
    expect(nearestChange(dump, sig, 15, 3)).toBeNull();
  });

  it('step over rewrites of the same value when looking for the next edge', () => {
    // 10: 0→1; 20: 1 rewritten, then 1→0; 35: 0 rewritten (no edge); 50: 0→x.
    expect(nextEdge(dump, sig, 10, 1)).toBe(20);
    expect(nextEdge(dump, sig, 20, 1)).toBe(50);
    expect(nextEdge(dump, sig, 50, 1)).toBeNull();
    expect(nextEdge(dump, sig, 50, -1)).toBe(20);
    expect(nextEdge(dump, sig, 10, -1)).toBeNull();
  });

  it('find the start of each stretch holding a value', () => {
    expect(nextValue(dump, sig, '0', 0, 1)).toBe(20);
    expect(nextValue(dump, sig, 'x', 0, 1)).toBe(50);
    expect(nextValue(dump, sig, '1', 49, -1)).toBe(10);
  });
});

describe('real nets', () => {
  it('snap to the 50 % crossing of an RC step at RC·ln 2', () => {
    const rc = 1000; // ticks
    const b = new DumpBuilder('rc.vcd');
    const id = b.addSignal('real', 64);
    for (let t = 0; t <= 5000; t += 10) {
      b.setTime(t);
      b.pushReal(id, 1 - Math.exp(-t / rc));
    }
    const dump = b.finish(0, false);
    const sig = dump.signals[id];
    const t50 = rc * Math.LN2; // 693.1 ticks
    const snapped = nearestCrossing(dump, sig, 0.5, 700, 20)!;
    // Linear interpolation between samples 10 ticks apart: the curve's bend over one step is
    // tiny, well under 0.1 tick here.
    expect(Math.abs(snapped - t50)).toBeLessThan(0.1);
    expect(nextCrossing(dump, sig, 0.5, 0, 1)).toBeCloseTo(snapped, 9);
    expect(nextCrossing(dump, sig, 0.5, 800, 1)).toBeNull();
    expect(nearestCrossing(dump, sig, 0.5, 900, 20)).toBeNull();
  });

  it('find falling crossings too, and skip gaps where dumping was off (NaN)', () => {
    const b = new DumpBuilder('r.vcd');
    const id = b.addSignal('real', 64);
    const pts: Array<[number, number]> = [[0, 0], [10, 2], [20, Number.NaN], [30, 2], [40, 0]];
    for (const [t, v] of pts) {
      b.setTime(t);
      b.pushReal(id, v);
    }
    const dump = b.finish(0, false);
    const sig = dump.signals[id];
    expect(nextCrossing(dump, sig, 1, 0, 1)).toBe(5);
    expect(nextCrossing(dump, sig, 1, 5, 1)).toBe(35);
    expect(nextCrossing(dump, sig, 1, 40, -1)).toBe(35);
  });
});
