import { describe, expect, it } from 'vitest';
import { TIMING_CAUTION, measureDelay, pairListOf } from '../../src/measure';
import { resolveNet } from '../../src/model/netref';
import { buildDump } from './measure-dumps';

function delay(nets: Parameters<typeof buildDump>[0], windowS?: number, unit: 'ns' | 'ps' = 'ns') {
  const dump = buildDump(nets, { unit });
  return measureDelay(dump, { from: resolveNet(dump, 'top.a'), to: resolveNet(dump, 'top.y'), windowS });
}

describe('measureDelay', () => {
  it('pairs each output edge with the latest input edge at or before it and names the kind by the output direction', () => {
    // An inverter with tPHL 2 and tPLH 3.
    const r = delay([
      { path: 'top.a', kind: 'logic', changes: [[0, '0'], [10, '1'], [30, '0'], [50, '1']] },
      { path: 'top.y', kind: 'logic', changes: [[0, '1'], [12, '0'], [33, '1'], [52, '0']] },
    ]);
    expect(r.pairs).toEqual([
      { kind: 'tPHL', from_edge: 'rise', from_time_s: 1e-8, to_edge: 'fall', to_time_s: 1.2e-8, delay_s: 2e-9 },
      { kind: 'tPLH', from_edge: 'fall', from_time_s: 3e-8, to_edge: 'rise', to_time_s: 3.3e-8, delay_s: 3e-9 },
      { kind: 'tPHL', from_edge: 'rise', from_time_s: 5e-8, to_edge: 'fall', to_time_s: 5.2e-8, delay_s: 2e-9 },
    ]);
    expect(r.tPHL).toEqual({ count: 2, min_s: 2e-9, max_s: 2e-9, mean_s: 2e-9, std_s: 0, worst_time_s: 1.2e-8 });
    expect(r.tPLH).toEqual({ count: 1, min_s: 3e-9, max_s: 3e-9, mean_s: 3e-9, std_s: 0, worst_time_s: 3.3e-8 });
    expect(r.tPD).toEqual({ count: 0, min_s: null, max_s: null, mean_s: null, std_s: null, worst_time_s: null });
    expect(r.unpaired).toBe(0);
    // tpd = greater of tPLH and tPHL (TI datasheet convention); tsk(p) = |tPHL − tPLH| (JESD65B pulse skew).
    expect(r.tpd_s).toBe(3e-9);
    expect(r.tskp_s).toBe(1e-9);
    expect(r.tskp_worst_s).toBe(1e-9);
    expect(r.fmax_hz).toBeCloseTo(1 / 3e-9, 0);
    expect(r.caution).toBe(TIMING_CAUTION);
  });

  it('computes count, min, max, mean, population standard deviation and the worst edge time', () => {
    const r = delay([
      { path: 'top.a', kind: 'logic', changes: [[0, '0'], [10, '1'], [20, '0'], [30, '1'], [40, '0'], [50, '1'], [60, '0']] },
      { path: 'top.y', kind: 'logic', changes: [[0, '0'], [12, '1'], [25, '0'], [34, '1'], [46, '0'], [53, '1'], [61, '0']] },
    ]);
    expect(r.tPLH.count).toBe(3);
    expect(r.tPLH.min_s).toBe(2e-9);
    expect(r.tPLH.max_s).toBe(4e-9);
    expect(r.tPLH.mean_s).toBe(3e-9);
    // delays 2, 4, 3 → population variance 2/3
    expect(r.tPLH.std_s).toBeCloseTo(Math.sqrt(2 / 3) * 1e-9, 20);
    expect(r.tPLH.worst_time_s).toBe(3.4e-8);
    expect(r.tPHL.max_s).toBe(6e-9);
    expect(r.tPHL.worst_time_s).toBe(4.6e-8);
    expect(r.tpd_s).toBe(6e-9);
  });

  it('reports output edges with no earlier input edge, or beyond the window, as unpaired', () => {
    const r = delay(
      [
        { path: 'top.a', kind: 'logic', changes: [[0, '0'], [10, '1'], [100, '0']] },
        { path: 'top.y', kind: 'logic', changes: [[0, '1'], [5, '0'], [8, '1'], [12, '0'], [60, '1']] },
      ],
      20e-9,
    );
    expect(r.pairs.map((p) => p.to_time_s)).toEqual([1.2e-8]);
    expect(r.unpaired).toBe(3);
    expect(r.unpaired_edges).toEqual([
      { to_edge: 'fall', to_time_s: 5e-9, reason: 'no-from-edge' },
      { to_edge: 'rise', to_time_s: 8e-9, reason: 'no-from-edge' },
      { to_edge: 'rise', to_time_s: 6e-8, reason: 'window' },
    ]);
    expect(r.window_s).toBe(20e-9);
  });

  it('keeps a pair exactly as long as the window (only longer ones are dropped), on a 1 ps timescale', () => {
    const r = delay(
      [
        { path: 'top.a', kind: 'logic', changes: [[0, '0'], [1000, '1']] },
        { path: 'top.y', kind: 'logic', changes: [[0, '0'], [3000, '1']] },
      ],
      2e-9,
      'ps',
    );
    expect(r.pairs).toHaveLength(1);
    expect(r.pairs[0].delay_s).toBe(2e-9);
  });

  it('does not blame an input edge for an output change that follows the input going unknown', () => {
    const r = delay([
      { path: 'top.a', kind: 'logic', changes: [[0, '0'], [10, '1'], [20, 'x'], [30, '0']] },
      { path: 'top.y', kind: 'logic', changes: [[0, '1'], [12, '0'], [33, '1']] },
    ]);
    expect(r.pairs).toHaveLength(1);
    expect(r.unpaired_edges).toEqual([{ to_edge: 'rise', to_time_s: 3.3e-8, reason: 'from-unknown' }]);
    expect(r.unknown_spans).toEqual([{ net: 'top.a', start_s: 2e-8, end_s: 3e-8, state: 'x' }]);
  });

  it('gives tPD pairs for a vector output', () => {
    const dump = buildDump([
      { path: 'top.a', kind: 'logic', changes: [[0, '0'], [10, '1'], [20, '0']] },
      { path: 'top.q', kind: 'vector', width: 4, changes: [[0, '0000'], [14, '0001'], [25, '0010']] },
    ]);
    const r = measureDelay(dump, { from: resolveNet(dump, 'a'), to: resolveNet(dump, 'q') });
    expect(r.pairs.map((p) => [p.kind, p.to_edge, p.delay_s])).toEqual([
      ['tPD', 'change', 4e-9],
      ['tPD', 'change', 5e-9],
    ]);
    expect(r.tPD.count).toBe(2);
    expect(r.tpd_s).toBe(5e-9);
    expect(r.tskp_s).toBeNull();
  });

  it('has null figures and no fmax when nothing pairs', () => {
    const r = delay([
      { path: 'top.a', kind: 'logic', changes: [[0, '0']] },
      { path: 'top.y', kind: 'logic', changes: [[0, '0'], [5, '1']] },
    ]);
    expect(r.pairs).toEqual([]);
    expect(r.tpd_s).toBeNull();
    expect(r.fmax_hz).toBeNull();
    expect(JSON.parse(JSON.stringify(r))).toEqual(r);
  });

  it('pairs every edge of a long clock and its buffered copy', () => {
    const n = 200_000;
    const a: Array<[number, string]> = [[0, '0']];
    const y: Array<[number, string]> = [[0, '0']];
    for (let k = 1; k <= n; k++) {
      a.push([10 * k, k % 2 ? '1' : '0']);
      y.push([10 * k + 3, k % 2 ? '1' : '0']);
    }
    const dump = buildDump([
      { path: 'top.a', kind: 'logic', changes: a },
      { path: 'top.y', kind: 'logic', changes: y },
    ]);
    const r = measureDelay(dump, { from: resolveNet(dump, 'a'), to: resolveNet(dump, 'y') });
    expect(r.pairs).toHaveLength(n);
    expect(r.tPLH).toMatchObject({ count: n / 2, min_s: 3e-9, max_s: 3e-9 });
    expect(r.tPHL).toMatchObject({ count: n / 2, min_s: 3e-9, max_s: 3e-9 });
  });
});

describe('measureDelay with keepLists (one measurement for the figures and the drawing)', () => {
  it('gives the same figures as the merged 1-bit walk, and pair lists that match the pairs', () => {
    const nets: Parameters<typeof buildDump>[0] = [
      { path: 'top.a', kind: 'logic', changes: [[0, '0'], [10, '1'], [20, 'x'], [25, '0'], [30, '1'], [50, '0']] },
      { path: 'top.y', kind: 'logic', changes: [[0, '1'], [12, '0'], [27, '1'], [33, '0'], [53, '1'], [90, '0']] },
    ];
    const dump = buildDump(nets, { unit: 'ns' });
    const opts = { from: resolveNet(dump, 'top.a'), to: resolveNet(dump, 'top.y'), windowS: 20e-9 };
    const plain = measureDelay(dump, opts);
    const kept = measureDelay(dump, { ...opts, keepLists: true });
    expect(JSON.parse(JSON.stringify(kept))).toEqual(JSON.parse(JSON.stringify(plain)));
    const lists = pairListOf(kept)!;
    expect(lists.pairs.count).toBe(kept.pairs.length);
    expect(lists.pairs.unpairedCount).toBe(kept.unpaired);
    expect(pairListOf(plain)).toBeUndefined();
  });
});
