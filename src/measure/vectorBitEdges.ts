// Edges of the bits of a vector net, every chosen bit in ONE pass over the vector's changes, a
// 32-bit word at a time: per change, the bits whose planes differ from the settled ones are found
// with a few word operations, and those that went 0↔1 (known before and after) are handed on as one
// mask per word, so the work grows with the number of bits that switch, not with the width. Each bit
// follows the 1-bit rules of settle.ts (same state table as logicEdges.ts): rise/fall between 0 and
// 1, unknown spans for x/z/U/W/-, weak L/H as 0/1, same-timestamp changes collapsed, zero-width
// glitches per bit. Changes holding states beyond 0/1/x/z (kept as text) go bit by bit.

import { type Net, type Signal, wordsFor } from '../model/dump';
import { bitCode } from '../model/lookup';
import { EdgeCollector } from './edgeCollector';
import { type BitEvents, NO_STATE, STATE, isEdge } from './settle';
import type { EdgeList } from './types';

/** Declared index of bit position p (0 = rightmost). */
export function declaredBit(net: Net, p: number): number {
  return net.msb >= net.lsb ? net.lsb + p : net.lsb - p;
}

/** Logic code of a bit from the two planes: 0, 1, 2 (x) or 3 (z), as in lookup.bitCode. */
function planeCode(v: number, u: number): number {
  return u ? (v ? 3 : 2) : v;
}

function hasTextIn(sig: Signal, from: number, to: number): boolean {
  for (let k = from; k <= to; k++) if (sig.texts.has(k)) return true;
  return false;
}

/**
 * Tells `sink` every settled-state change of the bits of a vector signal: bit position p
 * (0 = rightmost) reports as slot `slotOf[p]`; positions with a negative slot are skipped. Times go
 * as indices into the dump's `times`.
 */
export function walkVectorBits(sig: Signal, slotOf: Int32Array, sink: BitEvents): void {
  const width = sig.width;
  const words = wordsFor(width);
  const mask = new Uint32Array(words);
  for (let p = 0; p < width; p++) if (slotOf[p] >= 0) mask[p >>> 5] |= 1 << (p & 31);
  // Planes of the settled value, valid after a change of 0/1/x/z bits only ("plain").
  const sv = new Uint32Array(words);
  const su = new Uint32Array(words);
  // Settled states bit by bit, used (and valid) only around changes kept as text.
  const settled = new Uint8Array(width).fill(NO_STATE);
  const passed = new Uint32Array(words);
  const state = { plainBefore: false };
  const n = sig.count;
  const idx = sig.timeIndex;
  const anyText = sig.texts.size > 0;
  for (let i = 0; i < n; i++) {
    const ti = idx[i];
    let end = i;
    while (end + 1 < n && idx[end + 1] === ti) end++;
    if (state.plainBefore && !(anyText && hasTextIn(sig, i, end))) plainGroup(sig, i, end, ti, slotOf, mask, sv, su, passed, sink);
    else textGroup(sig, i, end, ti, slotOf, settled, sv, su, state, sink);
    const base = end * 2 * words;
    for (let w = 0; w < words; w++) {
      sv[w] = sig.planes[base + w];
      su[w] = sig.planes[base + words + w];
    }
    i = end;
  }
}

/** Changes i..end (one timestamp) of 0/1/x/z bits after a settled value of such bits: a word at a time. */
function plainGroup(
  sig: Signal,
  i: number,
  end: number,
  at: number,
  slotOf: Int32Array,
  mask: Uint32Array,
  sv: Uint32Array,
  su: Uint32Array,
  passed: Uint32Array,
  sink: BitEvents,
): void {
  const planes = sig.planes;
  const words = sv.length;
  const stride = 2 * words;
  if (end > i) {
    // Bits that differed from the settled value somewhere before the last change of the timestamp.
    passed.fill(0);
    for (let k = i; k < end; k++) {
      const kb = k * stride;
      for (let w = 0; w < words; w++) passed[w] |= (planes[kb + w] ^ sv[w]) | (planes[kb + words + w] ^ su[w]);
    }
  }
  const base = end * stride;
  for (let w = 0; w < words; w++) {
    const v = planes[base + w];
    const u = planes[base + words + w];
    const ov = sv[w];
    const ou = su[w];
    const changed = ((v ^ ov) | (u ^ ou)) & mask[w];
    if (end > i) {
      // Left where it was, through another state: zero-width glitches.
      for (let zw = passed[w] & ~changed & mask[w]; zw !== 0; ) {
        const b = 31 - Math.clz32(zw);
        zw ^= 1 << b;
        sink.zeroWidth(slotOf[(w << 5) + b], at);
      }
    }
    if (changed === 0) continue;
    // Known (0/1) before and after: edges (settle.ts isEdge), one call for the word.
    const edges = changed & ~u & ~ou;
    if (edges !== 0) sink.edges(slotOf, w, edges, v, at);
    // Into, out of or between x and z: unknown spans, bit by bit.
    for (let o = changed & ~edges; o !== 0; ) {
      const b = 31 - Math.clz32(o);
      o ^= 1 << b;
      const code = planeCode((v >>> b) & 1, (u >>> b) & 1);
      sink.other(slotOf[(w << 5) + b], at, STATE[planeCode((ov >>> b) & 1, (ou >>> b) & 1)], STATE[code], code);
    }
  }
}

/** Changes i..end (one timestamp) bit by bit through their logic codes: the first one, and any kept as text. */
function textGroup(
  sig: Signal,
  i: number,
  end: number,
  at: number,
  slotOf: Int32Array,
  settled: Uint8Array,
  sv: Uint32Array,
  su: Uint32Array,
  state: { plainBefore: boolean },
  sink: BitEvents,
): void {
  if (state.plainBefore) {
    // The settled states are in the planes.
    for (let p = 0; p < settled.length; p++) {
      const w = p >>> 5;
      const b = p & 31;
      settled[p] = STATE[planeCode((sv[w] >>> b) & 1, (su[w] >>> b) & 1)];
    }
  }
  let text = false;
  for (let k = i; k <= end; k++) if (sig.texts.has(k)) text = true;
  for (let p = 0; p < settled.length; p++) {
    const slot = slotOf[p];
    if (slot < 0) continue;
    const before = settled[p];
    let code = bitCode(sig, i, p);
    let now = STATE[code];
    let through = now !== before;
    for (let k = i + 1; k <= end; k++) {
      code = bitCode(sig, k, p);
      now = STATE[code];
      if (now !== before) through = true;
    }
    if (now === before) {
      if (through && before !== NO_STATE) sink.zeroWidth(slot, at);
      continue;
    }
    if (isEdge(before, now)) sink.edges(slotOf, p >>> 5, 1 << (p & 31), now << (p & 31), at);
    else sink.other(slot, at, before, now, code);
    settled[p] = now;
  }
  // After a change kept as text the planes hold x for its other states, so the next change goes
  // bit by bit too.
  state.plainBefore = !text;
}

/**
 * EdgeLists for the given bit positions (0 = rightmost) of a vector signal, labelled
 * `path[declared index]`. Positions outside the width are ignored.
 */
export function vectorBitEdges(times: Float64Array, sig: Signal, net: Net, positions: number[]): Map<number, EdgeList> {
  const slotOf = new Int32Array(sig.width).fill(-1);
  for (const p of positions) if (p >= 0 && p < sig.width) slotOf[p] = p;
  const edges = new EdgeCollector(sig.width, times);
  walkVectorBits(sig, slotOf, edges);
  const out = new Map<number, EdgeList>();
  for (let p = 0; p < sig.width; p++) if (slotOf[p] >= 0) out.set(p, edges.list(p, `${net.path}[${declaredBit(net, p)}]`));
  return out;
}
