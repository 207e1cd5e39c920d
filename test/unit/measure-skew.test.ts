// Skew on hand-built clock leaves. Expected figures are worked out by hand from the leaf delays
// written below: per event, skew = latest − earliest edge across the group (the spread of output
// delays, as JESD65B defines output skew for one switching event; common practice for clock trees).
import { describe, expect, it } from 'vitest';
import { MeasureError, measureSkew } from '../../src/measure';
import { resolveNet, resolveNetList } from '../../src/model/netref';
import { buildDump } from './measure-dumps';

/** A 20-tick-period clock delayed by `d` ticks. */
function leaf(path: string, d: number, cycles = 3): { path: string; kind: 'logic'; changes: Array<[number, string]> } {
  const changes: Array<[number, string]> = [[0, '0']];
  for (let k = 1; k <= 2 * cycles; k++) changes.push([10 * k + d, k % 2 ? '1' : '0']);
  return { path, kind: 'logic', changes };
}

describe('measureSkew', () => {
  const dump = buildDump([leaf('top.clk_leaf0', 1), leaf('top.clk_leaf1', 3), leaf('top.clk_leaf2', 2)]);

  it('groups edges into events and reports skew = latest − earliest with the nets at both ends', () => {
    const r = measureSkew(dump, { nets: resolveNetList(dump, 'top.clk_leaf*'), edge: 'rise' });
    expect(r.nets).toEqual(['top.clk_leaf0', 'top.clk_leaf1', 'top.clk_leaf2']);
    // Busiest net's shortest rise-to-rise interval is 20 → window 10.
    expect(r.window_s).toBe(1e-8);
    expect(r.window_source).toBe('busiest-net');
    expect(r.events).toEqual([
      { edge: 'rise', time_s: 1.1e-8, skew_s: 2e-9, edges: 3, earliest: 'top.clk_leaf0', latest: 'top.clk_leaf1' },
      { edge: 'rise', time_s: 3.1e-8, skew_s: 2e-9, edges: 3, earliest: 'top.clk_leaf0', latest: 'top.clk_leaf1' },
      { edge: 'rise', time_s: 5.1e-8, skew_s: 2e-9, edges: 3, earliest: 'top.clk_leaf0', latest: 'top.clk_leaf1' },
    ]);
    expect(r.max_skew_s).toBe(2e-9);
    expect(r.mean_skew_s).toBe(2e-9);
    expect(r.ref).toBe('top.clk_leaf0');
    expect(r.offsets).toEqual([
      { net: 'top.clk_leaf1', mean_offset_s: 2e-9, events: 3 },
      { net: 'top.clk_leaf2', mean_offset_s: 1e-9, events: 3 },
    ]);
  });

  it('groups both directions with --edge any, and uses a given reference net for offsets', () => {
    const r = measureSkew(dump, { nets: resolveNetList(dump, 'top.clk_leaf*'), ref: resolveNet(dump, 'clk_leaf2') });
    expect(r.edge).toBe('any');
    expect(r.window_s).toBe(5e-9); // shortest interval of any two edges is 10
    expect(r.events.map((e) => e.edge)).toEqual(['rise', 'fall', 'rise', 'fall', 'rise', 'fall']);
    expect(r.ref).toBe('top.clk_leaf2');
    expect(r.offsets).toEqual([
      { net: 'top.clk_leaf0', mean_offset_s: -1e-9, events: 6 },
      { net: 'top.clk_leaf1', mean_offset_s: 1e-9, events: 6 },
    ]);
  });

  it('lists single-net events with skew 0 and marks mixed-direction events', () => {
    const d = buildDump([
      { path: 'top.b0', kind: 'logic', changes: [[0, '0'], [10, '1'], [40, '0']] },
      { path: 'top.b1', kind: 'logic', changes: [[0, '1'], [11, '0']] },
    ]);
    const r = measureSkew(d, { nets: resolveNetList(d, 'top.b0,top.b1'), windowS: 5e-9 });
    expect(r.window_source).toBe('given');
    expect(r.events).toEqual([
      { edge: 'mixed', time_s: 1e-8, skew_s: 1e-9, edges: 2, earliest: 'top.b0', latest: 'top.b1' },
      { edge: 'fall', time_s: 4e-8, skew_s: 0, edges: 1, earliest: 'top.b0', latest: 'top.b0' },
    ]);
    expect(r.mean_skew_s).toBe(5e-10);
  });

  it('never puts two edges of one net into one event', () => {
    const d = buildDump([
      { path: 'top.p', kind: 'logic', changes: [[0, '0'], [10, '1'], [11, '0']] },
      { path: 'top.q', kind: 'logic', changes: [[0, '0'], [12, '1']] },
    ]);
    const r = measureSkew(d, { nets: resolveNetList(d, 'p,q'), windowS: 10e-9 });
    expect(r.events.map((e) => [e.time_s, e.edges])).toEqual([
      [1e-8, 1],
      [1.1e-8, 2],
    ]);
  });

  it('refuses a reference net outside the group', () => {
    expect(() => measureSkew(dump, { nets: resolveNetList(dump, 'clk_leaf0,clk_leaf1'), ref: resolveNet(dump, 'clk_leaf2') })).toThrow(MeasureError);
  });
});
