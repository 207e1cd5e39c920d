// The worst-case sheet's rows, their tab-separated text and report sheets, the histogram bins,
// and the measuring part of a saved view. The formula guard follows OWASP's CSV-injection advice
// (as src/report/inject.ts); the rest is worked out by hand from the small item sets built here.

import { describe, expect, it } from 'vitest';
import { toCsv } from '../../src/report/csv';
import { binOf, binValues } from '../../src/view/measure/bins';
import { emptyItems, flagItems } from '../../src/view/measure/limitcheck';
import type { LimitValues } from '../../src/view/measure/types';
import { readMeasurePart } from '../../src/view/measure/viewpart';
import { type RowSource, rowOf, rowsToTsv, worstItems, worstSheets } from '../../src/view/measure/worstrows';

/** Four delay pairs of 1, 4, 2 and 4 ns (tPLH, tPHL, tPLH, tPHL) at 10, 20, 30, 40 ns, 1 ps ticks. */
function source(limits: LimitValues, nets = 'top.a -> top.y'): RowSource {
  const items = emptyItems(4);
  [1, 4, 2, 4].forEach((ns, i) => {
    items.end[i] = (i + 1) * 10_000;
    items.start[i] = items.end[i] - ns * 1000;
    items.time[i] = (i + 1) * 10e-9;
    items.value[i] = ns * 1e-9;
    items.kind[i] = i % 2;
  });
  flagItems(items, limits, () => true);
  return { id: 'a_to_y', kind: 'delay', items, limits, nets: () => nets, fromDir: Uint8Array.of(1, 0, 1, 0), tickSeconds: 1e-12 };
}

const none: LimitValues = { min: null, max: null, unit: 's' };

describe('worst rows', () => {
  it('without limits the largest values come first, ties in time order', () => {
    expect(worstItems(source(none), 3)).toEqual([1, 3, 2]);
  });

  it('with limits the smallest margins come first and margins are signed', () => {
    const src = source({ min: 1.5e-9, max: 3e-9, unit: 's' });
    // margins: 1 ns → −0.5 ns, 4 ns → −1 ns, 2 ns → +0.5 ns.
    expect(worstItems(src, 4)).toEqual([1, 3, 0, 2]);
    const r = rowOf(src, 0);
    expect(r.margin_s).toBe(-0.5e-9);
    expect(r.edge).toBe('tPLH (rise → rise)');
    expect(r.start_s).toBeCloseTo(9e-9, 20);
    expect(r.end_s).toBeCloseTo(10e-9, 20);
  });

  it('tab-separated text: a header, one line per row, numbers bare, text guarded against formulas', () => {
    const src = source({ min: null, max: 3e-9, unit: 's' }, '=HYPERLINK("x")\tb');
    const tsv = rowsToTsv([rowOf(src, 1)]);
    expect(tsv).toBe('measurement\tnets\tedge\ttime_s\tvalue_s\tlimit_min_s\tlimit_max_s\tmargin_s\r\n' + "a_to_y\t'=HYPERLINK(\"x\") b\ttPHL (fall → fall)\t2e-8\t4e-9\t\t3e-9\t-1e-9\r\n");
  });

  it('one report sheet per kind, in the CLI writers’ column style, and through the CLI’s CSV writer', () => {
    const src = source(none);
    const sheets = worstSheets([rowOf(src, 1), rowOf(src, 3)]);
    expect(sheets).toHaveLength(1);
    expect(sheets[0].measurement).toBe('delay');
    expect(sheets[0].columns).toEqual(['row', 'measurement_id', 'nets', 'edge', 'time_s', 'value_s', 'limit_min_s', 'limit_max_s', 'margin_s']);
    expect(sheets[0].summary[0]).toMatchObject({ item: 'a_to_y', count: 2, min_s: 4e-9, max_s: 4e-9 });
    const csv = toCsv(sheets).split('\r\n');
    // Row cells, then the empty summary columns the CSV writer adds for its summary rows.
    expect(csv[1]).toBe('"worst","a_to_y","top.a -> top.y","tPHL (fall → fall)",2e-8,4e-9,,,' + ','.repeat(10));
  });
});

describe('histogram bins', () => {
  it('equal-width bins from min to max, the top value in the last bin', () => {
    const b = binValues(Float64Array.of(1, 2, 3, 4, 10), 5)!;
    expect(b.counts.length).toBe(3); // ceil(√5)
    expect([...b.counts]).toEqual([3, 1, 1]); // [1, 4), [4, 7), [7, 10]
    expect(b.mean).toBe(4);
    expect(binOf(10, b.lo, b.width, 3)).toBe(2);
  });

  it('one bin when every value is the same; only the chosen items when filtered', () => {
    expect([...binValues(Float64Array.of(5, 5, 5), 3)!.counts]).toEqual([3]);
    expect(binValues(Float64Array.of(5, 6), 2, (i) => i === 1)!.count).toBe(1);
    expect(binValues(new Float64Array(0), 0)).toBeNull();
  });
});

describe('the measuring part of a saved view', () => {
  const plan = { format: 'midrail-plan', version: 1, measurements: [{ id: 'd', kind: 'delay', from: 'a', to: 'y', max: '3ns' }] };
  const row = rowOf(source(none), 0);

  it('a part written by the viewer reads back the same', () => {
    const part = { plan, chosen: 'd', glitchWidth: '1ns', sheet: [row] };
    const r = readMeasurePart(JSON.parse(JSON.stringify(part)));
    expect(r).toEqual({ part });
  });

  it('a bad field is refused with its name', () => {
    const bad = (v: unknown) => (readMeasurePart(v) as { problem: string }).problem;
    expect(bad({ sheet: [], plan: { ...plan, measurements: [{ id: 'd', kind: 'delay', from: 'a', to: 'y', max: 'soon' }] } })).toMatch(/^measure\.plan\.measurements\[0\]\.max: /);
    expect(bad({ sheet: [{ ...row, value_s: 'big' }] })).toBe('measure.sheet[0].value_s must be a finite number (seconds)');
    expect(bad({ sheet: [], glitchWidth: '2' })).toMatch(/^measure\.glitchWidth is "2"/);
    expect(bad({ sheet: [], extra: 1 })).toMatch(/unknown field 'extra'/);
  });
});
