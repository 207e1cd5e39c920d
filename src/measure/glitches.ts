// Glitch search, O(n) in the changes: a glitch is a pulse (two successive opposite edges with no
// unknown span between them) strictly narrower than the chosen width: `high` = rise then fall,
// `low` = fall then rise. A timestamp where several changes left the net where it started is a
// `zero-width` glitch. Runts on real nets are always reported, whatever their width, because a pulse
// that never reaches a valid level is a defect at any width. Default targets: every 1-bit net, every
// bit of every vector (all bits of a vector in one pass) and every real net.
// The search runs as the edges are found, without building edge lists: 1-bit nets straight from their
// change lists (logicGlitches), the bits of each vector in one pass (PulseFinder fed by
// walkVectorBits), real nets from their edge lists. What it finds is kept in typed arrays; the
// `glitches` records, sorted by time then net name, are built on first read by merging the per-net
// lists, which come nearly sorted already, and `unknown_spans` is listed on first read too.

import type { Dump, Signal } from '../model/dump';
import { type NetRef, allBitRefs, distinctNets } from '../model/netref';
import { EdgeCollector } from './edgeCollector';
import { bitSlots, edgeList } from './edges';
import { logicSpans } from './logicEdges';
import { MeasureError } from './errors';
import { lazyField } from './lazy';
import type { LevelSpec } from './level';
import { secondsOf, windowTicks } from './ticks';
import { EdgeDir, type EdgeList, type Glitch, type GlitchPolarity, type GlitchResult, type UnknownSpan } from './types';
import { type BitEvents, NO_STATE, STATE, groupEnd, isEdge, isZeroWidth } from './settle';
import { unknownSpans } from './unknown';
import { walkVectorBits } from './vectorBitEdges';

export interface GlitchOptions {
  maxWidthS: number;
  /** Nets or bits to search; a whole vector stands for each of its bits. Default: all (see above). */
  nets?: NetRef[];
  level?: LevelSpec;
}

/** Whole vectors become their bits; 1-bit nets, bits and real nets stay as they are. */
export function glitchTargets(dump: Dump, nets?: NetRef[]): NetRef[] {
  if (!nets) {
    const out = allBitRefs(dump);
    for (const net of distinctNets(dump)) {
      if (dump.signals[net.signal].kind === 'real') out.push({ net, bit: null, label: net.path });
    }
    return out;
  }
  const out: NetRef[] = [];
  for (const ref of nets) {
    const net = ref.net;
    if (ref.bit === null && dump.signals[net.signal].kind === 'vector') {
      const step = net.msb >= net.lsb ? -1 : 1;
      for (let b = net.msb; ; b += step) {
        out.push({ net, bit: b, label: `${net.path}[${b}]` });
        if (b === net.lsb) break;
      }
    } else out.push(ref);
  }
  return out;
}

const POLARITIES: readonly GlitchPolarity[] = ['low', 'high', 'zero-width', 'runt'];
const LOW = 0;
const HIGH = 1;
const ZERO = 2;
const RUNT = 3;

const CHUNK_BITS = 12;
const CHUNK = 1 << CHUNK_BITS;
const CHUNK_MASK = CHUNK - 1;

/**
 * Glitches found so far, in typed arrays of fixed-size chunks: adding one never copies the earlier
 * ones, and only the chunks in use are allocated.
 */
export class GlitchSink {
  count = 0;
  private fill = CHUNK;
  private t = new Float64Array(0);
  private w = new Float64Array(0);
  private g = new Int32Array(0);
  private p = new Uint8Array(0);
  private readonly chunks: Array<{ t: Float64Array; w: Float64Array; g: Int32Array; p: Uint8Array }> = [];

  push(tick: number, width: number, target: number, polarity: number): void {
    if (this.fill === CHUNK) this.nextChunk();
    const k = this.fill++;
    this.t[k] = tick;
    this.w[k] = width;
    this.g[k] = target;
    this.p[k] = polarity;
    this.count++;
  }

  private nextChunk(): void {
    const c = { t: new Float64Array(CHUNK), w: new Float64Array(CHUNK), g: new Int32Array(CHUNK), p: new Uint8Array(CHUNK) };
    this.chunks.push(c);
    ({ t: this.t, w: this.w, g: this.g, p: this.p } = c);
    this.fill = 0;
  }

  /**
   * Every glitch found, in one array per field (index = order found): for reading them all, as
   * sorting and the viewer's item arrays do. Built on first call, and again if more were pushed.
   */
  flat(): { tick: Float64Array; width: Float64Array; target: Int32Array; polarity: Uint8Array } {
    const n = this.count;
    if (this.flatCache?.tick.length === n) return this.flatCache;
    const tick = new Float64Array(n);
    const width = new Float64Array(n);
    const target = new Int32Array(n);
    const polarity = new Uint8Array(n);
    for (let c = 0, at = 0; at < n; c++, at += CHUNK) {
      const k = Math.min(CHUNK, n - at);
      const chunk = this.chunks[c];
      tick.set(chunk.t.subarray(0, k), at);
      width.set(chunk.w.subarray(0, k), at);
      target.set(chunk.g.subarray(0, k), at);
      polarity.set(chunk.p.subarray(0, k), at);
    }
    this.flatCache = { tick, width, target, polarity };
    return this.flatCache;
  }

  private flatCache: { tick: Float64Array; width: Float64Array; target: Int32Array; polarity: Uint8Array } | null = null;

  /** Start tick, width in ticks, target index and polarity code of glitch k (in the order found). */
  tick(k: number): number {
    return this.chunks[k >>> CHUNK_BITS].t[k & CHUNK_MASK];
  }
  width(k: number): number {
    return this.chunks[k >>> CHUNK_BITS].w[k & CHUNK_MASK];
  }
  target(k: number): number {
    return this.chunks[k >>> CHUNK_BITS].g[k & CHUNK_MASK];
  }
  polarity(k: number): number {
    return this.chunks[k >>> CHUNK_BITS].p[k & CHUNK_MASK];
  }
}

/**
 * A pulse ends at `tick` (an edge in direction `dir`) when the slot's previous edge, `lastEdge`, is
 * less than maxTicks before it; −Infinity means an unknown span opened since (or no edge yet).
 * Returns the slot's new latest edge.
 */
function pulse(out: GlitchSink, lastEdge: number, tick: number, maxTicks: number, slot: number, dir: number): number {
  // A falling edge ends a high pulse (rise then fall); a rising one ends a low pulse.
  if (tick - lastEdge < maxTicks) out.push(lastEdge, tick - lastEdge, slot, dir === EdgeDir.Fall ? HIGH : LOW);
  return tick;
}

/**
 * Glitches of a 1-bit net straight from its change list by the settled-state rule (settle.ts), as
 * slot `slot`: no edge list is built.
 */
function logicGlitches(times: Float64Array, sig: Signal, maxTicks: number, slot: number, out: GlitchSink): void {
  const n = sig.count;
  const idx = sig.timeIndex;
  const codes = sig.logic;
  const last = n - 1;
  let settled = NO_STATE;
  let lastEdge = -Infinity;
  for (let i = 0; i < n; i++) {
    const ti = idx[i];
    const end = groupEnd(idx, i, last);
    if (end > i && isZeroWidth(codes, i, end, settled)) out.push(times[ti], 0, slot, ZERO);
    i = end;
    const state = STATE[codes[i]];
    if (state === settled) continue;
    if (isEdge(settled, state)) lastEdge = pulse(out, lastEdge, times[ti], maxTicks, slot, state);
    else if (state > 1) lastEdge = -Infinity; // an unknown span opened: no clean pulse across it
    settled = state;
  }
}

/**
 * Searches what the settled-state rule finds (settle.ts) for glitches as the walkers produce it, so
 * no edge list is built: a pulse is two successive edges of one slot with no unknown span opening
 * between them (two such edges are always opposite), strictly narrower than maxTicks. The slot is
 * the target's index.
 */
export class PulseFinder implements BitEvents {
  /** Tick of each slot's latest edge, or −Infinity when an unknown span opened after it (or none yet). */
  private readonly lastEdge: Float64Array;

  constructor(
    slots: number,
    private readonly times: Float64Array,
    private readonly maxTicks: number,
    readonly out: GlitchSink,
  ) {
    this.lastEdge = new Float64Array(slots).fill(-Infinity);
  }

  edges(slotOf: Int32Array, w: number, bits: number, value: number, at: number): void {
    const tick = this.times[at];
    const last = this.lastEdge;
    for (let m = bits; m !== 0; ) {
      const b = 31 - Math.clz32(m);
      m ^= 1 << b;
      const slot = slotOf[(w << 5) + b];
      last[slot] = pulse(this.out, last[slot], tick, this.maxTicks, slot, (value >>> b) & 1);
    }
  }

  other(slot: number, _at: number, _prev: number, state: number): void {
    if (state > 1) this.lastEdge[slot] = -Infinity; // an unknown span opened: no clean pulse across it
  }

  zeroWidth(slot: number, at: number): void {
    this.out.push(this.times[at], 0, slot, ZERO);
  }

  /** Feeds a real net's edge list in time order, then its zero-width glitches and runts. */
  feed(list: EdgeList, slot: number): void {
    const u = list.unknown;
    let ui = 0; // span starts are at even indices; no edge lies inside a span
    for (let k = 0; k < list.count; k++) {
      const t = list.ticks[k];
      for (; ui < u.length && u[ui] < t; ui += 2) this.lastEdge[slot] = -Infinity;
      this.lastEdge[slot] = pulse(this.out, this.lastEdge[slot], t, this.maxTicks, slot, list.dir[k]);
    }
    const zw = list.zeroWidth;
    for (let k = 0; k < zw.length; k++) this.out.push(zw[k], 0, slot, ZERO);
    const r = list.runts;
    for (let k = 0; k + 2 < r.length; k += 3) this.out.push(r[k], r[k + 1] - r[k], slot, RUNT);
  }

  /** Slot `to` (an alias of the same bit) gets the glitches found for slot `from`. */
  copySlot(from: number, to: number): void {
    const o = this.out;
    for (let k = 0, n = o.count; k < n; k++) if (o.target(k) === from) o.push(o.tick(k), o.width(k), to, o.polarity(k));
  }
}

/** What one search found: the targets searched and their glitches, in the order found. */
export interface GlitchScan {
  targets: NetRef[];
  sink: GlitchSink;
}

/** The search itself (see the top of this file); findGlitches wraps it into records. */
export function scanGlitches(dump: Dump, opts: GlitchOptions): GlitchScan {
  if (!(opts.maxWidthS > 0)) throw new MeasureError(`the glitch width limit must be a positive time, not ${opts.maxWidthS}`);
  const ts = dump.timescale;
  const maxTicks = windowTicks(ts, opts.maxWidthS);
  const targets = glitchTargets(dump, opts.nets);
  const sink = new GlitchSink();
  const finder = new PulseFinder(targets.length, dump.times, maxTicks, sink);
  // Every bit of a vector in one pass over its changes.
  const { slotsBySignal, sameAs } = bitSlots(dump, targets);
  for (const [signal, slotOf] of slotsBySignal) walkVectorBits(dump.signals[signal], slotOf, finder);
  for (let t = 0; t < targets.length; t++) {
    const ref = targets[t];
    const sig = dump.signals[ref.net.signal];
    if (sig.kind === 'vector' && ref.bit !== null) {
      if (sameAs[t] >= 0) finder.copySlot(sameAs[t], t);
    } else if (sig.kind === 'logic') logicGlitches(dump.times, sig, maxTicks, t, sink);
    else if (sig.kind === 'real') finder.feed(edgeList(dump, ref, { level: opts.level }), t);
    // Event and string nets have only `change` edges: no pulses, no unknown spans.
  }
  return { targets, sink };
}

/** A search's result: its count now, its records and unknown spans listed on first read. */
export function glitchResult(dump: Dump, scan: GlitchScan, opts: GlitchOptions): GlitchResult {
  const { targets, sink } = scan;
  const result: GlitchResult = { max_width_s: opts.maxWidthS, nets: targets.length, count: sink.count, glitches: [], unknown_spans: [] };
  lazyField(result, 'glitches', () => sortedGlitches(dump, scan));
  // The search only notes where unknown spans begin; the spans themselves are listed on first read.
  lazyField(result, 'unknown_spans', () => targetSpans(dump, targets, opts.level));
  return result;
}

export function findGlitches(dump: Dump, opts: GlitchOptions): GlitchResult {
  return glitchResult(dump, scanGlitches(dump, opts), opts);
}

/** The unknown spans of every target, in target order: bits of vectors in one pass per vector, edges not kept. */
function targetSpans(dump: Dump, targets: NetRef[], level: LevelSpec | undefined): UnknownSpan[] {
  const { slotsBySignal, sameAs } = bitSlots(dump, targets);
  const bits = new EdgeCollector(targets.length, dump.times, false);
  for (const [signal, slotOf] of slotsBySignal) walkVectorBits(dump.signals[signal], slotOf, bits);
  return targets.flatMap((ref, t) => {
    const sig = dump.signals[ref.net.signal];
    if (sig.kind === 'vector' && ref.bit !== null) return unknownSpans(dump, bits.list(sameAs[t] >= 0 ? sameAs[t] : t, ref.label));
    if (sig.kind === 'logic') return unknownSpans(dump, { label: ref.label, ...logicSpans(dump.times, sig) });
    if (sig.kind === 'real') return unknownSpans(dump, edgeList(dump, ref, { level }));
    return [];
  });
}

/** Whether a Float64Array's low 32-bit word comes first in memory. */
const LITTLE_ENDIAN = new Uint8Array(new Uint32Array([1]).buffer)[0] === 1;

/**
 * The order of a search's glitches by time, then net name, then the order found, as indices into
 * its sink. Stable sorts in sequence: by the rank of the net name (counting sort), then by start
 * tick, 16 bits a pass from the lowest (a non-negative double orders as its bit pattern does).
 * Linear in the glitches: no comparisons, so a scan with a million glitches sorts in a few passes.
 */
export function glitchOrder({ targets, sink }: GlitchScan): Uint32Array {
  const T = targets.length;
  const { tick, target } = sink.flat();
  const n = tick.length;
  const byName = targets.map((_, i) => i).sort((a, b) => (targets[a].label < targets[b].label ? -1 : targets[a].label > targets[b].label ? 1 : a - b));
  const rank = new Int32Array(T);
  byName.forEach((t, r) => (rank[t] = r));
  let order = new Uint32Array(n);
  const start = new Int32Array(T + 1);
  for (let k = 0; k < n; k++) start[rank[target[k]] + 1]++;
  for (let r = 0; r < T; r++) start[r + 1] += start[r];
  for (let k = 0; k < n; k++) order[start[rank[target[k]]]++] = k;
  let negative = false;
  for (let k = 0; k < n && !negative; k++) negative = tick[k] < 0 || Object.is(tick[k], -0);
  if (negative) {
    // Not a dump's time (ticks count up from 0); keep the order right by comparing.
    return Uint32Array.from(Array.from(order).sort((x, y) => tick[x] - tick[y]));
  }
  const words = new Uint32Array(tick.buffer, tick.byteOffset, 2 * n);
  let next = new Uint32Array(n);
  const count = new Int32Array(0x10001);
  for (let pass = 0; pass < 4; pass++) {
    const word = LITTLE_ENDIAN ? pass >> 1 : 1 - (pass >> 1);
    const shift = (pass & 1) * 16;
    count.fill(0);
    for (let k = 0; k < n; k++) count[((words[2 * k + word] >>> shift) & 0xffff) + 1]++;
    // A pass where every key has the same digit would leave the order as it is.
    let same = false;
    for (let d = 1; d <= 0x10000 && !same; d++) same = count[d] === n;
    if (same) continue;
    for (let d = 0; d < 0x10000; d++) count[d + 1] += count[d];
    for (let i = 0; i < n; i++) {
      const k = order[i];
      next[count[(words[2 * k + word] >>> shift) & 0xffff]++] = k;
    }
    const swap = order;
    order = next;
    next = swap;
  }
  return order;
}

/** The glitch records, in glitchOrder. */
function sortedGlitches(dump: Dump, scan: GlitchScan): Glitch[] {
  const { targets, sink } = scan;
  const order = glitchOrder(scan);
  const { tick, width, target, polarity } = sink.flat();
  const s = secondsOf(dump.timescale);
  const out: Glitch[] = new Array(order.length);
  for (let k = 0; k < order.length; k++) {
    const g = order[k];
    out[k] = { net: targets[target[g]].label, start_s: s(tick[g]), width_s: s(width[g]), polarity: POLARITIES[polarity[g]] };
  }
  return out;
}
