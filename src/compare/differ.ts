// The first time one net's value differs between two runs for longer than a tolerance.
// Several changes at one timestamp count as their settled (last) value. Before a net's first
// change its value is unknown (x), as a simulator starts it.

import type { Dump, Signal } from '../model/dump';
import { wordsFor } from '../model/dump';
import { valueText } from '../model/lookup';

/** One run's dump, with the factor that turns its ticks into ticks of the timescale both are compared on. */
export interface Run {
  dump: Dump;
  factor: number;
}

/** Times are ticks of the common timescale. */
export interface Difference {
  /** Start of the first difference that lasts longer than the tolerance. */
  start: number;
  /** How long it lasted; null when it lasts to the end of the shorter run. */
  duration: number | null;
  baseValue: string;
  newValue: string;
}

function tick(run: Run, sig: Signal, i: number): number {
  return run.dump.times[sig.timeIndex[i]] * run.factor;
}

/** Index of the settled change at the time of change i (the last one at that timestamp). */
function settled(sig: Signal, i: number): number {
  const t = sig.timeIndex[i];
  while (i + 1 < sig.count && sig.timeIndex[i + 1] === t) i++;
  return i;
}

function unknownText(sig: Signal): string {
  return sig.kind === 'real' ? 'NaN' : 'x'.repeat(Math.max(1, sig.width));
}

function text(sig: Signal, i: number): string {
  return i < 0 ? unknownText(sig) : valueText(sig, i);
}

/** Value equality across two signals, without building text in the common cases. */
function same(a: Signal, i: number, b: Signal, j: number): boolean {
  if (i < 0 || j < 0) return text(a, i) === text(b, j);
  if (a.kind === b.kind && a.width === b.width) {
    if (a.kind === 'logic' || a.kind === 'event') return a.logic[i] === b.logic[j];
    if (a.kind === 'real') return a.reals[i] === b.reals[j] || (Number.isNaN(a.reals[i]) && Number.isNaN(b.reals[j]));
    if (a.kind === 'vector' && !a.texts.has(i) && !b.texts.has(j)) {
      const w = 2 * wordsFor(a.width);
      for (let k = 0; k < w; k++) if (a.planes[i * w + k] !== b.planes[j * w + k]) return false;
      return true;
    }
  }
  return valueText(a, i) === valueText(b, j);
}

/**
 * Walks both change lists in time order. Returns the first difference lasting longer than
 * `tolerance` (any difference when it is 0), or null.
 */
export function firstDifference(base: Run, a: Signal, next: Run, b: Signal, tolerance: number): Difference | null {
  const end = Math.min(base.dump.endTick * base.factor, next.dump.endTick * next.factor);
  let i = -1; // settled change of a in effect
  let j = -1;
  let ni = 0; // next unread change
  let nj = 0;
  let openAt: number | null = null;
  let openBase = '';
  let openNew = '';
  while (ni < a.count || nj < b.count) {
    const ta = ni < a.count ? tick(base, a, ni) : Infinity;
    const tb = nj < b.count ? tick(next, b, nj) : Infinity;
    const t = Math.min(ta, tb);
    if (t > end) break;
    if (ta === t) {
      i = settled(a, ni);
      ni = i + 1;
    }
    if (tb === t) {
      j = settled(b, nj);
      nj = j + 1;
    }
    const differs = !same(a, i, b, j);
    if (differs && openAt === null) {
      openAt = t;
      openBase = text(a, i);
      openNew = text(b, j);
    } else if (!differs && openAt !== null) {
      const duration = t - openAt;
      if (duration > tolerance) return { start: openAt, duration, baseValue: openBase, newValue: openNew };
      openAt = null;
    }
  }
  // Still different when the shorter run ends: it lasts at least to there.
  if (openAt !== null && (end - openAt > tolerance || tolerance === 0)) {
    return { start: openAt, duration: null, baseValue: openBase, newValue: openNew };
  }
  return null;
}
