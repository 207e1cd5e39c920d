import { describe, expect, it } from 'vitest';
import { EdgeDir, edgeList, findEdges } from '../../src/measure';
import { resolveNet } from '../../src/model/netref';
import { buildDump } from './measure-dumps';

describe('edges of a 1-bit net', () => {
  it('finds rises (0→1) and falls (1→0) and reports times in seconds', () => {
    const dump = buildDump([{ path: 'top.a', kind: 'logic', changes: [[0, '0'], [10, '1'], [25, '0'], [40, '1']] }]);
    const r = findEdges(dump, resolveNet(dump, 'top.a'));
    expect(r.edges).toEqual([
      { time_s: 1e-8, edge: 'rise' },
      { time_s: 2.5e-8, edge: 'fall' },
      { time_s: 4e-8, edge: 'rise' },
    ]);
    expect(r.unknown_spans).toEqual([]);
    expect(r.low).toBeUndefined();
  });

  it('keeps edges in typed arrays of ticks for the viewer', () => {
    const dump = buildDump([{ path: 'top.a', kind: 'logic', changes: [[0, '0'], [10, '1'], [25, '0']] }]);
    const list = edgeList(dump, resolveNet(dump, 'a'));
    expect(list.ticks).toBeInstanceOf(Float64Array);
    expect([...list.ticks]).toEqual([10, 25]);
    expect([...list.dir]).toEqual([EdgeDir.Rise, EdgeDir.Fall]);
  });

  it('treats changes into and out of x, z and U as unknown spans, not edges (power-up x→1 is no rise)', () => {
    const dump = buildDump([
      { path: 'top.a', kind: 'logic', changes: [[0, 'x'], [5, '1'], [10, '0'], [20, 'z'], [30, 'x'], [35, '1'], [50, 'U'], [60, '0']] },
    ]);
    const r = findEdges(dump, resolveNet(dump, 'top.a'));
    expect(r.edges).toEqual([{ time_s: 1e-8, edge: 'fall' }]);
    expect(r.unknown_spans).toEqual([
      { net: 'top.a', start_s: 0, end_s: 5e-9, state: 'x' },
      { net: 'top.a', start_s: 2e-8, end_s: 3.5e-8, state: 'z' },
      { net: 'top.a', start_s: 5e-8, end_s: 6e-8, state: 'U' },
    ]);
  });

  it('leaves the end of an unknown span open (null) when the dump ends inside it', () => {
    const dump = buildDump([{ path: 'top.a', kind: 'logic', changes: [[0, '0'], [7, 'x']] }], { end: 20 });
    expect(findEdges(dump, resolveNet(dump, 'top.a')).unknown_spans).toEqual([{ net: 'top.a', start_s: 7e-9, end_s: null, state: 'x' }]);
  });

  it('collapses several changes at one timestamp to the settled (last) one', () => {
    const dump = buildDump([{ path: 'top.a', kind: 'logic', changes: [[0, '0'], [10, 'x'], [10, '1'], [20, '0'], [20, '1'], [20, '0']] }]);
    const r = findEdges(dump, resolveNet(dump, 'top.a'));
    // At 10: 0 → (x, 1) settles at 1: a rise, not an unknown span. At 20: 1 → (0, 1, 0) settles at 0: one fall.
    expect(r.edges).toEqual([
      { time_s: 1e-8, edge: 'rise' },
      { time_s: 2e-8, edge: 'fall' },
    ]);
    expect(r.unknown_spans).toEqual([]);
    expect(r.zero_width_s).toEqual([]);
  });

  it('reports a timestamp whose changes leave the net where it started as a zero-width glitch', () => {
    const dump = buildDump([{ path: 'top.a', kind: 'logic', changes: [[0, '0'], [10, '1'], [10, '0'], [20, '0'], [20, '0']] }]);
    const r = findEdges(dump, resolveNet(dump, 'top.a'));
    expect(r.edges).toEqual([]);
    // Repeated writes of the same value (20) are not a glitch: the net never left 0.
    expect(r.zero_width_s).toEqual([1e-8]);
  });

  it('counts VHDL weak L/H as 0/1', () => {
    const dump = buildDump([{ path: 'top.a', kind: 'logic', changes: [[0, 'L'], [10, 'H'], [20, '0'], [30, '1'], [40, 'L']] }]);
    const r = findEdges(dump, resolveNet(dump, 'top.a'));
    expect(r.edges.map((e) => e.edge)).toEqual(['rise', 'fall', 'rise', 'fall']);
  });

  it('treats a bit of a vector as a 1-bit net', () => {
    const dump = buildDump([{ path: 'top.bus', kind: 'vector', width: 4, changes: [[0, '0000'], [10, '1000'], [20, '1001'], [30, '0xx1']] }]);
    const r = findEdges(dump, resolveNet(dump, 'top.bus[3]'));
    expect(r.net).toBe('top.bus[3]');
    expect(r.edges).toEqual([
      { time_s: 1e-8, edge: 'rise' },
      { time_s: 3e-8, edge: 'fall' },
    ]);
    const bit0 = findEdges(dump, resolveNet(dump, 'top.bus[0]'));
    expect(bit0.edges).toEqual([{ time_s: 2e-8, edge: 'rise' }]);
    const bit1 = findEdges(dump, resolveNet(dump, 'top.bus[1]'));
    expect(bit1.unknown_spans).toMatchObject([{ net: 'top.bus[1]', start_s: 3e-8, end_s: null, state: 'x' }]);
  });
});

describe('edges of a vector net', () => {
  it('gives a change edge for every settled change between known values', () => {
    const dump = buildDump([
      { path: 'top.bus', kind: 'vector', width: 4, changes: [[0, 'xxxx'], [5, '0000'], [10, '0101'], [10, '0110'], [20, '0110'], [30, '1x00'], [40, '1111'], [50, '0000'], [60, '0001'], [60, '0000']] },
    ]);
    const r = findEdges(dump, resolveNet(dump, 'top.bus'));
    expect(r.edges).toEqual([
      { time_s: 1e-8, edge: 'change' },
      { time_s: 5e-8, edge: 'change' },
    ]);
    expect(r.unknown_spans).toEqual([
      { net: 'top.bus', start_s: 0, end_s: 5e-9 },
      { net: 'top.bus', start_s: 3e-8, end_s: 4e-8 },
    ]);
    expect(r.zero_width_s).toEqual([6e-8]);
  });
});
