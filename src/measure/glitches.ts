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

export function findGlitches(dump: Dump, opts: GlitchOptions): GlitchResult {
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
  const result: GlitchResult = { max_width_s: opts.maxWidthS, nets: targets.length, count: sink.count, glitches: [], unknown_spans: [] };
  lazyField(result, 'glitches', () => sortedGlitches(dump, sink, targets));
  // The search only notes where unknown spans begin; the spans themselves are listed on first read.
  lazyField(result, 'unknown_spans', () => targetSpans(dump, targets, opts.level));
  return result;
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

/**
 * The glitch records, sorted by time, then net name: the glitches of each target, found nearly in
 * time order, are put in order (a run-detecting sort, linear on sorted input), then the targets'
 * lists are merged through a heap keyed by (time, rank of the net name): O(g log T) for g glitches
 * on T targets.
 */
function sortedGlitches(dump: Dump, sink: GlitchSink, targets: NetRef[]): Glitch[] {
  const T = targets.length;
  const n = sink.count;
  const byName = targets.map((_, i) => i).sort((a, b) => (targets[a].label < targets[b].label ? -1 : targets[a].label > targets[b].label ? 1 : a - b));
  const rank = new Int32Array(T);
  byName.forEach((t, r) => (rank[t] = r));
  // Stable counting sort by target, then each target's run by time (stable, so ties keep found order).
  const start = new Int32Array(T + 1);
  for (let k = 0; k < n; k++) start[sink.target(k) + 1]++;
  for (let t = 0; t < T; t++) start[t + 1] += start[t];
  const fill = start.slice(0, T);
  const order = new Uint32Array(n);
  for (let k = 0; k < n; k++) order[fill[sink.target(k)]++] = k;
  const tick = new Float64Array(n);
  for (let k = 0; k < n; k++) tick[k] = sink.tick(k);
  for (let t = 0; t < T; t++) {
    const run = order.subarray(start[t], start[t + 1]);
    let sorted = true;
    for (let k = 1; k < run.length && sorted; k++) sorted = tick[run[k - 1]] <= tick[run[k]];
    if (!sorted) run.set(Array.from(run).sort((x, y) => tick[x] - tick[y] || x - y));
  }
  // k-way merge: a heap of the targets with glitches left, keyed by the time of their next one.
  const head = start.slice(0, T);
  const heap = new Int32Array(T);
  const key = new Float64Array(T); // time of each target's next glitch
  let size = 0;
  const before = (a: number, b: number) => key[a] < key[b] || (key[a] === key[b] && rank[a] < rank[b]);
  const down = (i: number) => {
    const t = heap[i];
    for (;;) {
      const l = 2 * i + 1;
      if (l >= size) break;
      const c = l + 1 < size && before(heap[l + 1], heap[l]) ? l + 1 : l;
      if (!before(heap[c], t)) break;
      heap[i] = heap[c];
      i = c;
    }
    heap[i] = t;
  };
  for (let t = 0; t < T; t++) {
    if (start[t + 1] === start[t]) continue;
    key[t] = tick[order[start[t]]];
    heap[size++] = t;
  }
  for (let i = (size >> 1) - 1; i >= 0; i--) down(i);
  const s = secondsOf(dump.timescale);
  const out: Glitch[] = new Array(n);
  for (let k = 0; k < n; k++) {
    const t = heap[0];
    const g = order[head[t]++];
    out[k] = { net: targets[t].label, start_s: s(tick[g]), width_s: s(sink.width(g)), polarity: POLARITIES[sink.polarity(g)] };
    if (head[t] === start[t + 1]) heap[0] = heap[--size];
    else key[t] = tick[order[head[t]]];
    if (size > 0) down(0);
  }
  return out;
}
