// Edge matching between two runs: shifts of matched edges, and extra or lost pulses counted as
// added or missing edges without disturbing the other matches. Expected figures are worked out
// by hand from the edge lists below (times in ns).
import { describe, expect, it } from 'vitest';
import { type EdgeSeries, matchEdges } from '../../src/compare/match';

const R = 1;
const F = 0;

function edges(list: Array<[number, number]>): EdgeSeries {
  return { times: Float64Array.from(list.map((e) => e[0])), dir: Uint8Array.from(list.map((e) => e[1])) };
}

describe('matching edges of two runs', () => {
  it('matches every edge of a uniformly delayed run with that delay as the shift', () => {
    const base = edges([[10, R], [20, F], [30, R], [40, F]]);
    const next = edges([[12, R], [22, F], [32, R], [42, F]]);
    const m = matchEdges(base, next, null);
    expect([m.matched, m.added, m.missing]).toEqual([4, 0, 0]);
    expect(m.meanShift).toBe(2);
    expect(m.minShift).toBe(2);
    expect(m.maxShift).toBe(2);
  });

  it('counts an extra pulse in the new run as two added edges and keeps the other shifts', () => {
    const base = edges([[10, R], [40, F]]);
    const next = edges([[13, R], [25, F], [26, R], [43, F]]);
    const m = matchEdges(base, next, null);
    expect([m.matched, m.added, m.missing]).toEqual([2, 2, 0]);
    expect(m.minShift).toBe(3);
    expect(m.maxShift).toBe(3);
    expect(Array.from(m.baseToNew)).toEqual([0, 3]);
  });

  it('counts a pulse the new run filtered out as two missing edges', () => {
    const base = edges([[10, R], [20, F], [21, R], [40, F]]);
    const next = edges([[11, R], [41, F]]);
    const m = matchEdges(base, next, null);
    expect([m.matched, m.added, m.missing]).toEqual([2, 0, 2]);
    expect(m.meanShift).toBe(1);
  });

  it('leaves edges further apart than the window unmatched', () => {
    const base = edges([[10, R], [20, F]]);
    const next = edges([[11, R], [28, F]]);
    const m = matchEdges(base, next, 5);
    expect([m.matched, m.added, m.missing]).toEqual([1, 1, 1]);
  });

  it('never matches edges of opposite directions', () => {
    const m = matchEdges(edges([[10, R]]), edges([[10, F]]), null);
    expect([m.matched, m.added, m.missing]).toEqual([0, 1, 1]);
    expect(m.meanShift).toBeNull();
  });

  it('prefers the positive shift when two new edges are equally near', () => {
    const base = edges([[10, R], [20, R]]);
    const next = edges([[15, R]]);
    const m = matchEdges(base, next, null);
    expect(m.matched).toBe(1);
    expect(m.meanShift).toBe(5);
  });

  it('matches change edges of vectors like rises and falls', () => {
    const C = 2;
    const m = matchEdges(edges([[5, C], [15, C]]), edges([[6, C], [16, C]]), null);
    expect(m.matched).toBe(2);
    expect(m.meanShift).toBe(1);
  });
});
