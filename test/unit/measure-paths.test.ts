// Delay and glitch measurements take a fast path for 1-bit nets, walking their change lists directly
// (delay.ts pairLogicNets, glitches.ts logicGlitches), and the general path through edge lists for
// everything else (a bit of a vector goes through vectorBitEdges and pairEdges / PulseFinder). The
// same waveform carried by a 1-bit net and by a bit of a vector must measure the same on both paths,
// whatever x/z/U/L/H states and same-timestamp changes it holds. (The rules themselves are checked
// against outside sources in the other measure-* tests; this one proves the two paths agree.)

import { describe, expect, it } from 'vitest';
import { findGlitches, measureDelay } from '../../src/measure';
import type { DelayResult, GlitchResult } from '../../src/measure';
import { resolveNet, resolveNetList } from '../../src/model/netref';
import { buildDump } from './measure-dumps';

/** Deterministic pseudo-random values (32-bit LCG, Numerical Recipes constants, from memory). */
function lcg(seed: number): () => number {
  let x = seed >>> 0;
  return () => (x = (Math.imul(x, 1664525) + 1013904223) >>> 0) / 2 ** 32;
}

const STATES = '0101010101xzULH';

/** A random 1-bit waveform: mostly 0/1, some non-logic states, some timestamps written twice or thrice. */
function waveform(rnd: () => number, changes: number): Array<[number, string]> {
  const out: Array<[number, string]> = [[0, STATES[Math.floor(rnd() * STATES.length)]]];
  let t = 0;
  for (let k = 1; k < changes; k++) {
    if (rnd() > 0.15) t += 1 + Math.floor(rnd() * 6);
    out.push([t, STATES[Math.floor(rnd() * STATES.length)]]);
  }
  return out;
}

/** The same waveform as a 1-bit net and as bit 0 of a 2-bit vector (bit 1 held at 0). */
function twins(seed: number) {
  const rnd = lcg(seed);
  const a = waveform(rnd, 300);
  const y = waveform(rnd, 300);
  const asBit = (w: Array<[number, string]>): Array<[number, string]> => w.map(([t, v]) => [t, `0${v}`]);
  return buildDump([
    { path: 'top.a', kind: 'logic', changes: a },
    { path: 'top.y', kind: 'logic', changes: y },
    { path: 'top.va', kind: 'vector', width: 2, changes: asBit(a) },
    { path: 'top.vy', kind: 'vector', width: 2, changes: asBit(y) },
  ]);
}

/** A result with the net names replaced, so results on the twin nets compare equal. */
function renamed<T>(r: T, names: Record<string, string>): T {
  return JSON.parse(JSON.stringify(r), (_k, v: unknown) => (typeof v === 'string' && v in names ? names[v] : v)) as T;
}

describe('the 1-bit fast paths and the edge-list paths', () => {
  it('pair and sum the same delays, unpaired edges and unknown spans', () => {
    let paired = 0;
    let unpairedUnknown = 0;
    for (let seed = 1; seed <= 12; seed++) {
      const dump = twins(seed);
      for (const windowS of [undefined, 4e-9]) {
        const fast: DelayResult = measureDelay(dump, { from: resolveNet(dump, 'top.a'), to: resolveNet(dump, 'top.y'), windowS });
        const listed: DelayResult = measureDelay(dump, { from: resolveNet(dump, 'top.va[0]'), to: resolveNet(dump, 'top.vy[0]'), windowS });
        expect(renamed(listed, { 'top.va[0]': 'top.a', 'top.vy[0]': 'top.y' }), `seed ${seed}`).toEqual(JSON.parse(JSON.stringify(fast)));
        // The counts the fast path sums must be those of the records built on first read.
        expect(fast.tPLH.count + fast.tPHL.count).toBe(fast.pairs.length);
        expect(fast.unpaired).toBe(fast.unpaired_edges.length);
        paired += fast.pairs.length;
        unpairedUnknown += fast.unpaired_edges.filter((u) => u.reason === 'from-unknown').length;
      }
    }
    // The random data must exercise the rules, or this test proves little.
    expect(paired).toBeGreaterThan(500);
    expect(unpairedUnknown).toBeGreaterThan(10);
  });

  it('find the same glitches and unknown spans', () => {
    let glitches = 0;
    for (let seed = 1; seed <= 12; seed++) {
      const dump = twins(seed);
      for (const maxWidthS of [2e-9, 5e-9]) {
        const fast: GlitchResult = findGlitches(dump, { maxWidthS, nets: resolveNetList(dump, 'top.a,top.y') });
        const listed: GlitchResult = findGlitches(dump, { maxWidthS, nets: resolveNetList(dump, 'top.va[0],top.vy[0]') });
        expect(renamed(listed, { 'top.va[0]': 'top.a', 'top.vy[0]': 'top.y' }), `seed ${seed}`).toEqual(JSON.parse(JSON.stringify(fast)));
        glitches += fast.count;
      }
    }
    expect(glitches).toBeGreaterThan(200);
  });
});
