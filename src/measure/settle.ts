// The settled-state rule of 1-bit nets and of the bits of vectors, stated once. Each timestamp
// collapses to its last change, the settled state (groupEnd, isZeroWidth); every change of settled
// state is then an edge or part of an unknown span (isEdge, spanChange):
// - rise = 0→1, fall = 1→0 (the direction is the state entered: EdgeDir.Fall = 0, EdgeDir.Rise = 1);
// - a change into x, z, U, W or '-' opens an unknown span and the change back to 0/1 closes it;
//   neither is an edge, because the transition's timing is undefined (so power-up x→1 is no tPLH);
// - the first value of a dump is not an edge (there is no earlier state to leave).
// The walks over a 1-bit net's changes (logicEdges.ts for an edge list, delay.ts pairing two nets,
// glitches.ts searching one) apply these helpers inline, so none of them needs the others' output.
// For the bits of a vector, a receiver either records the edges (EdgeCollector, edgeCollector.ts) or
// searches them for glitches as they come (PulseFinder, glitches.ts).

/**
 * Logic code → state: 0 and 1 (EdgeDir.Fall/Rise of the edge that enters them), or a distinct value
 * of 4 or more for each non-logic state. VHDL weak states count as their strong value (L = 0, H = 1):
 * a weak driver still defines the logic level, and only the strength differs. 256 entries, so any
 * byte reads in bounds.
 */
export const STATE = new Uint8Array(256).fill(12);
STATE.set([0, 1, 4, 5, 6, 7, 0, 1, 10]);
/** Settled state before the first change. */
export const NO_STATE = 255;

/** Index of the last change at the timestamp of change i (`last` = count − 1): they collapse to it. */
export function groupEnd(idx: Uint32Array, i: number, last: number): number {
  const ti = idx[i];
  while (i < last && idx[i + 1] === ti) i++;
  return i;
}

/**
 * Changes i..end of one timestamp left a 1-bit net where it was settled (`settled`) but passed
 * through another state on the way: a zero-width glitch. Never at the first value of a dump.
 */
export function isZeroWidth(codes: Uint8Array, i: number, end: number, settled: number): boolean {
  if (settled === NO_STATE || STATE[codes[end]] !== settled) return false;
  for (let k = i; k < end; k++) if (STATE[codes[k]] !== settled) return true;
  return false;
}

/** A change of settled state between 0 and 1 is an edge; its direction is the state entered. */
export function isEdge(prev: number, state: number): boolean {
  return (state | prev) <= 1;
}

/**
 * Any other change of settled state: into a non-logic state from 0, 1 or the start opens an unknown
 * span (`code` is the logic code that opened it); back to 0 or 1 closes it; between non-logic
 * states, or from the start into 0 or 1, neither. Spans go to `unknown` as [start, end) tick pairs.
 */
export function spanChange(unknown: number[], unknownState: number[], tick: number, prev: number, state: number, code: number): void {
  if (state <= 1) {
    if (prev !== NO_STATE) unknown.push(tick); // closes the open span
  } else if (prev <= 1 || prev === NO_STATE) {
    unknown.push(tick); // its end is pushed when the span closes
    unknownState.push(code);
  }
}

/**
 * A span still open when the dump ends ends at NaN. (Kept out of the walks' hot functions: V8 compiles
 * a long loop while it runs, and code after it that has not run yet would throw that code away.)
 */
export function closeSpans(unknown: number[]): void {
  if (unknown.length % 2 === 1) unknown.push(Number.NaN);
}

/**
 * What the settled-state rule finds on the bits of a vector (vectorBitEdges.ts). Bit position p
 * reports as slot slotOf[p]. Times are given as `at`, an index into the dump's `times` (which the
 * receiver holds): a small integer, so nothing is boxed when V8 does not inline the call.
 */
export interface BitEvents {
  /**
   * The bits set in `bits` of 32-bit word w (bit b is position 32·w + b) made an edge at times[at],
   * each into its bit of `value` (1: rise, 0: fall). One call per word, not per bit.
   */
  edges(slotOf: Int32Array, w: number, bits: number, value: number, at: number): void;
  /** A change of settled state that is not an edge (see spanChange). */
  other(slot: number, at: number, prev: number, state: number, code: number): void;
  /** Several changes at one timestamp left the slot where it started, through another state. */
  zeroWidth(slot: number, at: number): void;
}
