// Finding times on one signal: the edge nearest a pointer (for snapping cursors), the next or
// previous edge, and the next or previous time the signal takes a value. Digital signals use
// change times; real signals use the linearly interpolated crossing of a reference level
// (the mesial-instant rule of IEEE 181, from memory; the plot draws reals linearly too).

import type { Dump, Signal } from '../model/dump';
import { changeInEffectAt, changeTick, firstChangeAtOrAfter, valueText } from '../model/lookup';

/** True when change i holds a different value from change i-1 (a real edge, not a rewrite). */
export function isEdge(sig: Signal, i: number): boolean {
  if (i <= 0) return false; // the first value written is a start, not a transition
  if (sig.kind === 'logic') return sig.logic[i] !== sig.logic[i - 1];
  if (sig.kind === 'event') return true;
  if (sig.kind === 'real') return sig.reals[i] !== sig.reals[i - 1];
  return valueText(sig, i) !== valueText(sig, i - 1);
}

/** The change time nearest `tick` within `tol` ticks, or null. */
export function nearestChange(dump: Dump, sig: Signal, tick: number, tol: number): number | null {
  const k = firstChangeAtOrAfter(dump, sig, tick);
  let best: number | null = null;
  for (const c of [k - 1, k]) {
    if (c < 0 || c >= sig.count) continue;
    const t = changeTick(dump, sig, c);
    if (Math.abs(t - tick) <= tol && (best === null || Math.abs(t - tick) < Math.abs(best - tick))) best = t;
  }
  return best;
}

/** Interpolated time where the line from sample a to sample b meets `level`, or null. */
function crossing(dump: Dump, sig: Signal, a: number, level: number): number | null {
  const va = sig.reals[a];
  const vb = sig.reals[a + 1];
  if (!Number.isFinite(va) || !Number.isFinite(vb)) return null;
  // A segment crosses when it starts on one side and ends on or past the level.
  if ((va < level && vb >= level) || (va > level && vb <= level)) {
    const ta = changeTick(dump, sig, a);
    const tb = changeTick(dump, sig, a + 1);
    return ta + ((level - va) / (vb - va)) * (tb - ta);
  }
  return null;
}

/** Most samples looked at around the pointer when snapping to a real signal. */
const SNAP_SCAN_LIMIT = 4096;

/** The reference-level crossing nearest `tick` within `tol`, or null. */
export function nearestCrossing(dump: Dump, sig: Signal, level: number, tick: number, tol: number): number | null {
  const from = Math.max(0, changeInEffectAt(dump, sig, tick - tol));
  const to = Math.min(sig.count - 1, firstChangeAtOrAfter(dump, sig, tick + tol));
  let best: number | null = null;
  for (let a = from; a < to && a - from < SNAP_SCAN_LIMIT; a++) {
    const t = crossing(dump, sig, a, level);
    if (t !== null && Math.abs(t - tick) <= tol && (best === null || Math.abs(t - tick) < Math.abs(best - tick))) best = t;
  }
  return best;
}

/** Next (dir +1) or previous (dir -1) edge strictly after/before `tick`, or null. */
export function nextEdge(dump: Dump, sig: Signal, tick: number, dir: 1 | -1): number | null {
  if (dir > 0) {
    for (let i = firstChangeAtOrAfter(dump, sig, tick); i < sig.count; i++) {
      const t = changeTick(dump, sig, i);
      if (t > tick && isEdge(sig, i)) return t;
    }
  } else {
    for (let i = firstChangeAtOrAfter(dump, sig, tick) - 1; i >= 0; i--) {
      const t = changeTick(dump, sig, i);
      if (t < tick && isEdge(sig, i)) return t;
    }
  }
  return null;
}

/** Next or previous crossing of `level` on a real signal strictly after/before `tick`. */
export function nextCrossing(dump: Dump, sig: Signal, level: number, tick: number, dir: 1 | -1): number | null {
  if (dir > 0) {
    for (let a = Math.max(0, changeInEffectAt(dump, sig, tick)); a + 1 < sig.count; a++) {
      const t = crossing(dump, sig, a, level);
      if (t !== null && t > tick) return t;
    }
  } else {
    for (let a = Math.min(sig.count - 2, firstChangeAtOrAfter(dump, sig, tick)); a >= 0; a--) {
      const t = crossing(dump, sig, a, level);
      if (t !== null && t < tick) return t;
    }
  }
  return null;
}

/**
 * Next or previous time a digital signal starts holding `bits` (MSB-first bit text as
 * valueText writes it), strictly after/before `tick`.
 */
export function nextValue(dump: Dump, sig: Signal, bits: string, tick: number, dir: 1 | -1): number | null {
  const same = (i: number) => valueText(sig, i) === bits;
  if (dir > 0) {
    for (let i = firstChangeAtOrAfter(dump, sig, tick); i < sig.count; i++) {
      const t = changeTick(dump, sig, i);
      if (t > tick && same(i) && (i === 0 || !same(i - 1))) return t;
    }
  } else {
    for (let i = firstChangeAtOrAfter(dump, sig, tick) - 1; i >= 0; i--) {
      const t = changeTick(dump, sig, i);
      if (t < tick && same(i) && (i === 0 || !same(i - 1))) return t;
    }
  }
  return null;
}
