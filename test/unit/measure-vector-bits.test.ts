// The bits of a vector are found in one pass over the vector (vectorBitEdges); a 1-bit net goes
// through logicEdges. Both must follow the same rules, so a bit must give exactly the edges, unknown
// spans and zero-width glitches of a 1-bit net carrying the same values.

import { describe, expect, it } from 'vitest';
import { edgeList, edgeLists } from '../../src/measure';
import { resolveNet } from '../../src/model/netref';
import { buildDump } from './measure-dumps';

/** Deterministic pseudo-random values (32-bit LCG, Numerical Recipes constants, from memory). */
function lcg(seed: number): () => number {
  let x = seed >>> 0;
  return () => (x = (Math.imul(x, 1664525) + 1013904223) >>> 0) / 2 ** 32;
}

describe('vector bits and 1-bit nets', () => {
  it('agree on edges, unknown spans and zero-width glitches for random 40-bit values', () => {
    const rnd = lcg(7);
    const width = 40; // two 32-bit words
    const vec: Array<[number, string]> = [];
    const bits: Array<Array<[number, string]>> = Array.from({ length: width }, () => []);
    let t = 0;
    for (let k = 0; k < 400; k++) {
      t += rnd() < 0.2 ? 0 : 1 + Math.floor(rnd() * 5); // some changes share a timestamp
      let text = '';
      for (let b = 0; b < width; b++) {
        const r = rnd();
        text += r < 0.45 ? '0' : r < 0.9 ? '1' : r < 0.95 ? 'x' : 'z';
      }
      vec.push([t, text]);
      for (let b = 0; b < width; b++) bits[b].push([t, text[width - 1 - b]]);
    }
    const dump = buildDump([
      { path: 'top.bus', kind: 'vector', width, changes: vec },
      ...bits.map((changes, b) => ({ path: `top.b${b}`, kind: 'logic' as const, changes })),
    ]);
    const refs = Array.from({ length: width }, (_, b) => resolveNet(dump, `top.bus[${b}]`));
    const together = edgeLists(dump, refs);
    for (let b = 0; b < width; b++) {
      const single = edgeList(dump, resolveNet(dump, `top.b${b}`));
      const alone = edgeList(dump, refs[b]);
      for (const got of [together[b], alone]) {
        expect(got.label).toBe(`top.bus[${b}]`);
        expect([...got.ticks], `bit ${b}`).toEqual([...single.ticks]);
        expect([...got.dir], `bit ${b}`).toEqual([...single.dir]);
        expect(got.unknown, `bit ${b}`).toEqual(single.unknown);
        expect(got.unknownState, `bit ${b}`).toEqual(single.unknownState);
        expect(got.zeroWidth, `bit ${b}`).toEqual(single.zeroWidth);
      }
    }
    // The random data must exercise every rule, or this test proves little.
    const all = together.reduce((n, l) => n + l.count, 0);
    expect(all).toBeGreaterThan(1000);
    expect(together.some((l) => l.unknown.length > 0)).toBe(true);
    expect(together.some((l) => l.zeroWidth.length > 0)).toBe(true);
  });

  it('reads bits holding VHDL states (U, L, H) through their text', () => {
    const dump = buildDump([{ path: 'top.v', kind: 'vector', width: 3, changes: [[0, '000'], [5, 'HL0'], [9, 'LU1'], [12, '101']] }]);
    const e = (b: number) => edgeList(dump, resolveNet(dump, `top.v[${b}]`));
    expect([...e(2).ticks]).toEqual([5, 9, 12]); // 0 → H(1) → L(0) → 1
    expect([...e(1).ticks]).toEqual([]);
    expect(e(1).unknown).toEqual([9, 12]); // U
    expect([...e(0).ticks]).toEqual([9]); // 0, 0, 1, 1
  });
});

describe('lazily built result lists', () => {
  it('behave as plain data for JSON, structured clone and assignment', async () => {
    const { measureDelay, findGlitches } = await import('../../src/measure');
    const dump = buildDump([
      { path: 'top.a', kind: 'logic', changes: [[0, '0'], [10, '1'], [11, '0']] },
      { path: 'top.y', kind: 'logic', changes: [[0, '0'], [12, '1'], [13, '0']] },
    ]);
    const r = measureDelay(dump, { from: resolveNet(dump, 'a'), to: resolveNet(dump, 'y') });
    const viaJson = JSON.parse(JSON.stringify(r));
    expect(viaJson.pairs).toHaveLength(2);
    expect(Object.keys(viaJson)).toEqual(Object.keys(r));
    expect(structuredClone(r).pairs).toEqual(viaJson.pairs);
    const g = findGlitches(dump, { maxWidthS: 2e-9 });
    expect(structuredClone(g).glitches).toEqual(g.glitches);
    g.glitches = [];
    expect(g.glitches).toEqual([]);
  });
});
