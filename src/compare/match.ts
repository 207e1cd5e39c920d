// Matching the edges of one net in two runs of the same stimulus (a base run and a new run).
//
// Rule: an edge of the base run and an edge of the new run are matched when they have the same
// direction (rise, fall, change), each is the other's nearest edge of that direction, and they
// are at most `window` apart when a window is given. Mutual nearest neighbours keep the matching
// in time order and make an extra pulse in one run (two opposite edges between matched ones)
// show up as two added or missing edges instead of shifting every later match. On a tie the
// match with the positive shift wins, since a timed run lags a zero-delay one.
//
// The matching is unambiguous while each net's shift stays below half the interval between its
// like edges (for a clock, half its period); beyond that no rule can tell a late edge from an
// early next one.

/** Times are in any one unit for both series (the compare module uses ticks of a common timescale). */
export interface EdgeSeries {
  /** Edge instants, ascending. */
  times: Float64Array;
  /** Direction code per edge (measure's EdgeDir: 0 fall, 1 rise, 2 change). */
  dir: Uint8Array;
}

export interface MatchResult {
  matched: number;
  added: number;
  missing: number;
  /** new − base over matched edges; null when none matched. */
  meanShift: number | null;
  minShift: number | null;
  maxShift: number | null;
  /** Base time of the matched edge with the largest |shift|. */
  worstTime: number | null;
  /** Base-run index → new-run index, -1 where unmatched. */
  baseToNew: Int32Array;
}

/** Indices of edges of one direction. */
function ofDirection(s: EdgeSeries, d: number): number[] {
  const out: number[] = [];
  for (let i = 0; i < s.dir.length; i++) if (s.dir[i] === d) out.push(i);
  return out;
}

/**
 * For each a-time, the index (into b) of the nearest b-time, -1 if b is empty. Both ascending.
 * `preferLater` picks the later b on a tie.
 */
function nearestIn(a: number[], b: number[], ta: Float64Array, tb: Float64Array, preferLater: boolean): Int32Array {
  const out = new Int32Array(a.length).fill(-1);
  if (b.length === 0) return out;
  let k = 0;
  for (let i = 0; i < a.length; i++) {
    const t = ta[a[i]];
    // Advance k to the last b at or before t.
    while (k + 1 < b.length && tb[b[k + 1]] <= t) k++;
    let best = k;
    if (k + 1 < b.length) {
      const dBefore = Math.abs(t - tb[b[k]]);
      const dAfter = Math.abs(tb[b[k + 1]] - t);
      if (tb[b[k]] > t) best = k; // every b is after t: k = 0 is nearest
      else if (dAfter < dBefore || (dAfter === dBefore && preferLater)) best = k + 1;
    }
    out[i] = best;
  }
  return out;
}

export function matchEdges(base: EdgeSeries, next: EdgeSeries, window: number | null): MatchResult {
  const baseToNew = new Int32Array(base.times.length).fill(-1);
  let matched = 0;
  let sum = 0;
  let min = Infinity;
  let max = -Infinity;
  let worstAbs = -1;
  let worstTime: number | null = null;
  for (const d of [0, 1, 2]) {
    const b = ofDirection(base, d);
    const n = ofDirection(next, d);
    if (b.length === 0 || n.length === 0) continue;
    // Base edge → nearest new edge, preferring a later (positive-shift) one on a tie;
    // new edge → nearest base edge, preferring an earlier one, which is the same preference.
    const bn = nearestIn(b, n, base.times, next.times, true);
    const nb = nearestIn(n, b, next.times, base.times, false);
    for (let i = 0; i < b.length; i++) {
      const j = bn[i];
      if (j < 0 || nb[j] !== i) continue;
      const shift = next.times[n[j]] - base.times[b[i]];
      if (window !== null && Math.abs(shift) > window) continue;
      baseToNew[b[i]] = n[j];
      matched++;
      sum += shift;
      if (shift < min) min = shift;
      if (shift > max) max = shift;
      if (Math.abs(shift) > worstAbs) {
        worstAbs = Math.abs(shift);
        worstTime = base.times[b[i]];
      }
    }
  }
  return {
    matched,
    added: next.times.length - matched,
    missing: base.times.length - matched,
    meanShift: matched > 0 ? sum / matched : null,
    minShift: matched > 0 ? min : null,
    maxShift: matched > 0 ? max : null,
    worstTime,
    baseToNew,
  };
}
