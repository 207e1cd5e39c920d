// Holding every measured item (pair, event, pulse, cycle) against a measurement's limits.
// margin = max − value and value − min; an item's margin is the smaller of the two, negative when
// it violates a limit. The worst item is the one with the smallest margin. Without limits the
// worst is the largest value (the smallest, for a pulse width), and margins are null.

import type { Limits } from './limits';
import { WORST_KEPT, type WorstItem } from './result';

/** A measured item described for people; only the few worst ones are ever described. */
export interface Item {
  time_s: number;
  value: number;
  what: string;
}

/** Every measured item as parallel arrays; `describe(i)` names item i. */
export interface Series {
  time_s: ArrayLike<number>;
  value: ArrayLike<number>;
  describe: (i: number) => string;
}

export interface Verdict {
  count: number;
  violations: number;
  min: number | null;
  max: number | null;
  mean: number | null;
  worst: Item | null;
  margin: number | null;
  worstItems: WorstItem[];
}

/**
 * Rounds away the binary noise of decimal arithmetic (20.01 ns − 20 ns = 1.0000000000001e-11) to
 * 12 significant digits: far finer than any delay or limit a person writes.
 */
export function tidy(x: number): number {
  return Number.isFinite(x) && x !== 0 ? Number(x.toPrecision(12)) : x;
}

/** limit − value (or value − limit), with a difference within rounding of the operands taken as 0. */
function distance(hi: number, lo: number): number {
  const d = hi - lo;
  return Math.abs(d) <= 1e-12 * Math.max(Math.abs(hi), Math.abs(lo)) ? 0 : d;
}

function rawMargin(value: number, limits: Limits): number {
  let m = Infinity;
  if (limits.max !== null) m = distance(limits.max, value);
  if (limits.min !== null) m = Math.min(m, distance(value, limits.min));
  return m;
}

export function marginOf(value: number, limits: Limits): number | null {
  return hasLimits(limits) ? tidy(rawMargin(value, limits)) : null;
}

export function hasLimits(limits: Limits): boolean {
  return limits.min !== null || limits.max !== null;
}

/**
 * `smallerIsWorse` orders items when there are no limits. Keeps only the WORST_KEPT worst items,
 * in one pass, so a measurement over millions of pairs keeps a bounded list.
 */
export function judge(items: Series, limits: Limits, smallerIsWorse = false): Verdict {
  const limited = hasLimits(limits);
  const n = items.value.length;
  // Badness: larger is worse. With limits it is −margin; without, the value (or −value).
  const kept: Array<{ i: number; bad: number }> = [];
  let violations = 0;
  let sum = 0;
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < n; i++) {
    const v = items.value[i];
    sum += v;
    if (v < min) min = v;
    if (v > max) max = v;
    const bad = limited ? -rawMargin(v, limits) : smallerIsWorse ? -v : v;
    if (limited && bad > 0) violations++;
    // Ties keep the earlier item, so the first occurrence of the worst value is reported.
    if (kept.length < WORST_KEPT || bad > kept[kept.length - 1].bad) {
      let at = kept.length;
      while (at > 0 && kept[at - 1].bad < bad) at--;
      kept.splice(at, 0, { i, bad });
      if (kept.length > WORST_KEPT) kept.pop();
    }
  }
  const described = kept.map(({ i }) => ({ time_s: items.time_s[i], value: items.value[i], what: items.describe(i) }));
  const worst = described.length > 0 ? described[0] : null;
  return {
    count: n,
    violations,
    min: n > 0 ? min : null,
    max: n > 0 ? max : null,
    mean: n > 0 ? tidy(sum / n) : null,
    worst,
    margin: worst ? marginOf(worst.value, limits) : null,
    worstItems: described.map((item) => ({ ...item, margin: marginOf(item.value, limits) })),
  };
}
