// Holding each measured item against a measurement's min/max limits, item by item, so violating
// edges can be marked on the canvas and counted. The rule is the plan's (src/plan/evaluate.ts):
// margin = max − value and value − min, a difference within 1e-12 of the operands counts as 0, an
// item violates when its margin is below 0. Pure.

import { tidy } from '../../plan/evaluate';
import { type Limits, limitsOf } from '../../plan/limits';
import type { MeasurementSpec } from '../../plan/types';
import { JUDGED, type Items, type LimitValues, VIOLATES } from './types';

/** limit − value with rounding noise of the operands taken as 0 (as the plan's verdicts do). */
function distance(hi: number, lo: number): number {
  const d = hi - lo;
  return Math.abs(d) <= 1e-12 * Math.max(Math.abs(hi), Math.abs(lo)) ? 0 : d;
}

/** The smaller distance to a limit (negative: violated), to 12 digits as the plan's; null without limits. */
export function marginOf(value: number, limits: LimitValues): number | null {
  if (limits.min === null && limits.max === null) return null;
  let m = Infinity;
  if (limits.max !== null) m = distance(limits.max, value);
  if (limits.min !== null) m = Math.min(m, distance(value, limits.min));
  return tidy(m);
}

export function limitValues(spec: MeasurementSpec): LimitValues {
  const l: Limits = limitsOf(spec);
  return { min: l.min, max: l.max, unit: l.unit };
}

/**
 * Sets JUDGED on the items `judged(i)` accepts and VIOLATES on those of them outside the limits
 * (per-item limits only: a count limit, as on glitches, is judged on the whole measurement).
 */
export function flagItems(items: Items, limits: LimitValues, judged: (i: number) => boolean): { judged: number; violations: number } {
  const perItem = limits.unit !== 'count' && (limits.min !== null || limits.max !== null);
  let nJudged = 0;
  let violations = 0;
  for (let i = 0; i < items.count; i++) {
    let f = 0;
    if (judged(i)) {
      f = JUDGED;
      nJudged++;
      if (perItem) {
        const m = marginOf(items.value[i], limits);
        if (m !== null && m < 0) {
          f |= VIOLATES;
          violations++;
        }
      }
    }
    items.flags[i] = f;
  }
  return { judged: nJudged, violations };
}

export function emptyItems(n: number): Items {
  return {
    count: n,
    start: new Float64Array(n),
    end: new Float64Array(n),
    time: new Float64Array(n),
    value: new Float64Array(n),
    kind: new Uint8Array(n),
    flags: new Uint8Array(n),
  };
}
