// One entry point for the edges of any net or bit, by the net's kind.

import type { Dump, Signal } from '../model/dump';
import { type NetRef, bitPosition } from '../model/netref';
import { type LevelSpec, MESIAL } from './level';
import { EdgeCollector } from './edgeCollector';
import { logicEdges } from './logicEdges';
import { realEdges } from './realEdges';
import { ticksToSeconds } from './ticks';
import { EDGE_NAMES, EdgeDir, type EdgeList, type EdgeResult, edgeListOf } from './types';
import { unknownSpans } from './unknown';
import { walkVectorBits } from './vectorBitEdges';
import { vectorEdges } from './vectorEdges';

export interface EdgeOptions {
  /** Reference level for real nets (default 50 %, the mesial level). Ignored for logic and vector nets. */
  level?: LevelSpec;
  /** State levels for real nets, instead of the histogram-mode estimate. */
  states?: { low: number; high: number };
}

/** Event and string nets: every settled change is a `change` edge. */
function changeEdges(times: Float64Array, sig: Signal, label: string): EdgeList {
  const ticks = new Float64Array(sig.count);
  let count = 0;
  for (let i = 0; i < sig.count; i++) {
    const tick = times[sig.timeIndex[i]];
    if (count === 0 || ticks[count - 1] !== tick) ticks[count++] = tick;
  }
  return edgeListOf({
    label,
    source: 'other',
    count,
    ticks: ticks.slice(0, count),
    dir: new Uint8Array(count).fill(EdgeDir.Change),
    transition: null,
    unknown: [],
    unknownState: [],
    zeroWidth: [],
    runts: [],
    levels: null,
  });
}

/** Edges in ticks and typed arrays (the viewer draws markers from this). */
export function edgeList(dump: Dump, ref: NetRef, opts: EdgeOptions = {}): EdgeList {
  const sig = dump.signals[ref.net.signal];
  if (ref.bit !== null) {
    if (sig.kind !== 'vector') return logicEdges(dump.times, sig, ref.label);
    return edgeLists(dump, [ref], opts)[0];
  }
  switch (sig.kind) {
    case 'logic':
      return logicEdges(dump.times, sig, ref.label);
    case 'vector':
      return vectorEdges(dump.times, sig, ref.label);
    case 'real':
      return realEdges(dump.times, sig, ref.label, dump.endTick, { level: opts.level ?? MESIAL, states: opts.states });
    default:
      return changeEdges(dump.times, sig, ref.label);
  }
}

/**
 * Slot per bit position of each vector signal whose bits are asked for (slot = index in `refs`);
 * a bit asked for twice (or through an alias net of the same signal) is found once, in its first slot.
 */
export function bitSlots(dump: Dump, refs: NetRef[]): { slotsBySignal: Map<number, Int32Array>; sameAs: Int32Array } {
  const slotsBySignal = new Map<number, Int32Array>();
  const sameAs = new Int32Array(refs.length).fill(-1);
  refs.forEach((ref, i) => {
    const sig = dump.signals[ref.net.signal];
    if (ref.bit === null || sig.kind !== 'vector') return;
    const p = bitPosition(ref.net, ref.bit);
    if (p < 0 || p >= sig.width) return;
    let slotOf = slotsBySignal.get(ref.net.signal);
    if (!slotOf) slotsBySignal.set(ref.net.signal, (slotOf = new Int32Array(sig.width).fill(-1)));
    if (slotOf[p] < 0) slotOf[p] = i;
    else sameAs[i] = slotOf[p];
  });
  return { slotsBySignal, sameAs };
}

/**
 * Edge lists of many nets and bits, in the order given. Bits of one vector are found together in one
 * pass over its changes, so searching every bit of a wide bus costs about one pass, not one per bit.
 */
export function edgeLists(dump: Dump, refs: NetRef[], opts: EdgeOptions = {}): EdgeList[] {
  const { slotsBySignal, sameAs } = bitSlots(dump, refs);
  const bits = new EdgeCollector(refs.length, dump.times);
  for (const [signal, slotOf] of slotsBySignal) walkVectorBits(dump.signals[signal], slotOf, bits);
  return refs.map((ref, i) => {
    const sig = dump.signals[ref.net.signal];
    if (ref.bit === null || sig.kind !== 'vector') return edgeList(dump, ref, opts);
    const slot = sameAs[i] >= 0 ? sameAs[i] : i;
    return bits.list(slot, ref.label);
  });
}

/** The `midrail edges` result. */
export function findEdges(dump: Dump, ref: NetRef, opts: EdgeOptions = {}): EdgeResult {
  const list = edgeList(dump, ref, opts);
  const ts = dump.timescale;
  const s = (ticks: number) => ticksToSeconds(ts, ticks);
  const level = (opts.level ?? MESIAL).text;
  const result: EdgeResult = list.levels
    ? {
        net: ref.label,
        level,
        low: list.levels.low,
        high: list.levels.high,
        state_method: list.levels.method,
        reference_value: list.levels.reference,
        edges: [],
        zero_width_s: [],
        unknown_spans: [],
      }
    : { net: ref.label, level, edges: [], zero_width_s: [], unknown_spans: [] };
  for (let k = 0; k < list.count; k++) {
    const edge = { time_s: s(list.ticks[k]), edge: EDGE_NAMES[list.dir[k]] } as EdgeResult['edges'][number];
    if (list.transition) {
      const d = list.transition[k];
      edge.transition_s = Number.isFinite(d) ? s(d) : null;
    }
    result.edges.push(edge);
  }
  if (list.levels) {
    result.runts = [];
    for (let k = 0; k + 2 < list.runts.length; k += 3) {
      result.runts.push({
        start_s: s(list.runts[k]),
        width_s: s(list.runts[k + 1] - list.runts[k]),
        polarity: list.runts[k + 2] === EdgeDir.Rise ? 'high' : 'low',
      });
    }
  }
  result.zero_width_s = list.zeroWidth.map(s);
  result.unknown_spans = unknownSpans(dump, list);
  return result;
}
