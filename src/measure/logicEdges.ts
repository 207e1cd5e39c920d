// Edges of a 1-bit net from its change list, in one pass, by the settled-state rule (settle.ts):
// several changes at one timestamp collapse to the last one, and if they left the net where it
// started through another state, that timestamp is a zero-width glitch; rise 0→1, fall 1→0; unknown
// spans for x, z, U, W and '-'. Bits of vectors follow the same rules (vectorBitEdges.ts).

import type { Signal } from '../model/dump';
import { NO_STATE, STATE, closeSpans, groupEnd, isEdge, isZeroWidth, spanChange } from './settle';
import { type EdgeList, edgeListOf } from './types';

export function logicEdges(times: Float64Array, sig: Signal, label: string): EdgeList {
  // A 1-bit net has at most one edge per change; the list views these arrays, never copies them.
  const ticks = new Float64Array(sig.count);
  const dir = new Uint8Array(sig.count);
  const unknown: number[] = [];
  const unknownState: number[] = [];
  const zeroWidth: number[] = [];
  const count = walkEdges(times, sig, ticks, dir, unknown, unknownState, zeroWidth);
  closeSpans(unknown);
  return edgeListOf({
    label,
    source: 'logic',
    count,
    ticks: ticks.subarray(0, count),
    dir: dir.subarray(0, count),
    transition: null,
    unknown,
    unknownState,
    zeroWidth,
    runts: [],
    levels: null,
  });
}

/** The walk itself; returns the edge count. */
function walkEdges(
  times: Float64Array,
  sig: Signal,
  ticks: Float64Array,
  dir: Uint8Array,
  unknown: number[],
  unknownState: number[],
  zeroWidth: number[],
): number {
  const n = sig.count;
  const idx = sig.timeIndex;
  const codes = sig.logic;
  const last = n - 1;
  let count = 0;
  let settled = NO_STATE;
  for (let i = 0; i < n; i++) {
    const ti = idx[i];
    const end = groupEnd(idx, i, last);
    if (end > i && isZeroWidth(codes, i, end, settled)) zeroWidth.push(times[ti]);
    i = end;
    const state = STATE[codes[i]];
    if (state === settled) continue;
    if (isEdge(settled, state)) {
      ticks[count] = times[ti];
      dir[count++] = state; // EdgeDir.Rise = 1 enters state 1, EdgeDir.Fall = 0 enters state 0
    } else spanChange(unknown, unknownState, times[ti], settled, state, codes[i]);
    settled = state;
  }
  return count;
}

/**
 * Only the unknown spans of a 1-bit signal, as logicEdges lists them, from change `i` on with the
 * settled state before it being `settled` (the whole signal by default), added to `spans`.
 */
export function logicSpans(
  times: Float64Array,
  sig: Signal,
  spans: { unknown: number[]; unknownState: number[] } = { unknown: [], unknownState: [] },
  i = 0,
  settled = NO_STATE,
): { unknown: number[]; unknownState: number[] } {
  const idx = sig.timeIndex;
  const last = sig.count - 1;
  for (; i <= last; i++) {
    const ti = idx[i];
    i = groupEnd(idx, i, last);
    const state = STATE[sig.logic[i]];
    if (state !== settled && !isEdge(settled, state)) spanChange(spans.unknown, spans.unknownState, times[ti], settled, state, sig.logic[i]);
    settled = state;
  }
  closeSpans(spans.unknown);
  return spans;
}
