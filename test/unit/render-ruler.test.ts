// Time ruler marks: 1-2-5 steps (the common practice of graph paper and instrument scales)
// and SI units from fs to s.

import { describe, expect, it } from 'vitest';
import { niceStep, rulerMarks } from '../../src/render/ruler';

describe('niceStep', () => {
  it('rounds up to 1, 2 or 5 times a power of ten', () => {
    expect(niceStep(0.7)).toBe(1);
    expect(niceStep(1)).toBe(1);
    expect(niceStep(1.01)).toBe(2);
    expect(niceStep(3)).toBe(5);
    expect(niceStep(7)).toBe(10);
    expect(niceStep(2.2e-12)).toBeCloseTo(5e-12, 24);
  });
});

describe('rulerMarks', () => {
  it('labels major marks at least the minimum gap apart, in units that suit them', () => {
    // 0 to 3 µs on 1000 px: 3 ns per pixel, 90 px ≥ 270 ns, so a 500 ns step.
    const marks = rulerMarks(0, 3e-9, 1000);
    const labels = marks.filter((m) => m.label).map((m) => m.label);
    expect(labels).toEqual(['0 s', '500 ns', '1 us', '1.5 us', '2 us', '2.5 us', '3 us']);
    const majors = marks.filter((m) => m.label);
    for (let k = 1; k < majors.length; k++) expect(majors[k].x - majors[k - 1].x).toBeGreaterThanOrEqual(90);
    // Four minor marks between majors: one mark every 100 ns from 0 to 3 µs.
    expect(marks.length).toBe(31);
  });

  it('goes down to femtoseconds', () => {
    const labels = rulerMarks(0, 1e-15, 500).filter((m) => m.label).map((m) => m.label);
    expect(labels.slice(0, 3)).toEqual(['0 s', '100 fs', '200 fs']);
  });

  it('gives labels enough digits to tell apart far from time zero', () => {
    // Around 1 ms, a 100 ps step: labels must differ.
    const labels = rulerMarks(1e-3, 1e-12, 1000).filter((m) => m.label).map((m) => m.label);
    expect(new Set(labels).size).toBe(labels.length);
    expect(labels[0]).toMatch(/^1\.0000001 ms$|^1 ms$/);
  });
});
