// Real nets as the measurement engine sees them: IEEE 181 state levels, the reference level and
// the edge instants at its crossings (src/measure). The viewer draws that reference level and
// snaps cursors to those instants, so a cursor lands exactly where `midrail delay` measures.
// Worked out once per net and level, then kept.

import type { Dump, Net, Signal } from '../model/dump';
import { edgeList } from '../measure/edges';
import { MESIAL, levelValue, parseLevel } from '../measure/level';
import type { AnalogSummary } from '../render/summary';

export interface RealInfo {
  /** The reference level's value (the dashed line). */
  reference: number;
  /** Edge instants in ticks, ascending (fractional: interpolated). */
  ticks: Float64Array;
  /** Why there are no edges, when the engine refused the net at this level. */
  error: string | null;
}

const cache = new WeakMap<Signal, Map<string, RealInfo>>();

export function realInfo(dump: Dump, net: Net, sig: Signal, level: string | null, summary: AnalogSummary): RealInfo {
  let perLevel = cache.get(sig);
  if (!perLevel) {
    perLevel = new Map();
    cache.set(sig, perLevel);
  }
  const key = level ?? '';
  let info = perLevel.get(key);
  if (info) return info;
  let spec = MESIAL;
  try {
    if (level) spec = parseLevel(level);
    const list = edgeList(dump, { net, bit: null, label: net.path }, { level: spec });
    const ref = list.levels ? list.levels.reference : levelValue(spec, summary.lo, summary.hi);
    info = { reference: ref, ticks: list.ticks.subarray(0, list.count), error: null };
  } catch (e) {
    info = { reference: levelValue(spec, summary.lo, summary.hi), ticks: new Float64Array(0), error: (e as Error).message };
  }
  perLevel.set(key, info);
  return info;
}

/** Index of the first tick at or after t. */
function lowerBound(ticks: Float64Array, t: number): number {
  let lo = 0;
  let hi = ticks.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (ticks[mid] < t) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** The instant nearest t within tol, or null. */
export function nearestInstant(ticks: Float64Array, t: number, tol: number): number | null {
  const k = lowerBound(ticks, t);
  let best: number | null = null;
  for (const c of [k - 1, k]) {
    if (c < 0 || c >= ticks.length) continue;
    if (Math.abs(ticks[c] - t) <= tol && (best === null || Math.abs(ticks[c] - t) < Math.abs(best - t))) best = ticks[c];
  }
  return best;
}

/** The next instant strictly after t (dir +1) or before it (dir -1), or null. */
export function nextInstant(ticks: Float64Array, t: number, dir: 1 | -1): number | null {
  if (dir > 0) {
    let k = lowerBound(ticks, t);
    while (k < ticks.length && ticks[k] <= t) k++;
    return k < ticks.length ? ticks[k] : null;
  }
  const k = lowerBound(ticks, t) - 1;
  return k >= 0 ? ticks[k] : null;
}
