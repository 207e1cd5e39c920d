// Edges of a 1-bit net from its change list, in one pass.
// - Several changes at one timestamp collapse to the last one, the settled value. If they left the
//   net where it started but passed through another state, that timestamp is a zero-width glitch.
// - rise = 0→1, fall = 1→0. VHDL weak states count as their strong value (L = 0, H = 1): a weak
//   driver still defines the logic level, and only the strength differs.
// - Any change into x, z, U, W or '-' opens an unknown span and the change out of it closes it; neither
//   is an edge, because the transition's timing is undefined (so power-up x→1 is no tPLH).
// - The first value of a dump is not an edge (there is no earlier state to leave).
// Bits of vectors follow the same rules (vectorBitEdges.ts), with the same state table.

import type { Signal } from '../model/dump';
import { type EdgeList, edgeListOf } from './types';

/**
 * Logic code → state: 0 and 1 (EdgeDir.Fall/Rise of the edge that enters them), or a distinct value
 * of 4 or more for each non-logic state. 256 entries, so any byte reads in bounds.
 */
export const STATE = new Uint8Array(256).fill(12);
STATE.set([0, 1, 4, 5, 6, 7, 0, 1, 10]);
/** Settled state before the first change. */
export const NO_STATE = 255;

export function logicEdges(times: Float64Array, sig: Signal, label: string): EdgeList {
  const n = sig.count;
  const idx = sig.timeIndex;
  const codes = sig.logic;
  const ticks = new Float64Array(n);
  const dir = new Uint8Array(n);
  const unknown: number[] = [];
  const unknownState: number[] = [];
  const zeroWidth: number[] = [];
  const last = n - 1;
  let count = 0;
  let settled = NO_STATE;
  for (let i = 0; i < n; i++) {
    const ti = idx[i];
    let state = STATE[codes[i]];
    if (i < last && idx[i + 1] === ti) {
      // Collapse this timestamp, noting whether it passed through another state.
      let passed = state !== settled;
      while (i < last && idx[i + 1] === ti) {
        i++;
        state = STATE[codes[i]];
        if (state !== settled) passed = true;
      }
      if (state === settled && passed && settled !== NO_STATE) zeroWidth.push(times[ti]);
    }
    if (state === settled) continue;
    if ((state | settled) <= 1) {
      ticks[count] = times[ti];
      dir[count++] = state; // EdgeDir.Rise = 1 enters state 1, EdgeDir.Fall = 0 enters state 0
    } else if (state <= 1) {
      if (settled !== NO_STATE) unknown.push(times[ti]); // closes the open span
    } else if (settled <= 1 || settled === NO_STATE) {
      unknown.push(times[ti]); // its end is pushed when the span closes
      unknownState.push(codes[i]);
    }
    settled = state;
  }
  if (unknown.length % 2 === 1) unknown.push(Number.NaN);
  return edgeListOf({
    label,
    source: 'logic',
    count,
    ticks: ticks.slice(0, count),
    dir: dir.slice(0, count),
    transition: null,
    unknown,
    unknownState,
    zeroWidth,
    runts: [],
    levels: null,
  });
}
