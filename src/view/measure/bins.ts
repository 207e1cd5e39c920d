// Histogram of a measurement's values: equal-width bins from the smallest to the largest value
// (about √n bins, at most 40; one bin when every value is the same), with min, max and mean.
// Pure.

export interface Bins {
  count: number;
  lo: number;
  /** Bin width; 0 when all values are equal (one bin). */
  width: number;
  counts: Int32Array;
  min: number;
  max: number;
  mean: number;
}

export const MAX_BINS = 40;

/** Bins of `values[i]` for the i that `take(i)` accepts (all when omitted). */
export function binValues(values: Float64Array, n: number, take?: (i: number) => boolean): Bins | null {
  let min = Infinity;
  let max = -Infinity;
  let sum = 0;
  let count = 0;
  for (let i = 0; i < n; i++) {
    if (take && !take(i)) continue;
    const v = values[i];
    if (!Number.isFinite(v)) continue;
    if (v < min) min = v;
    if (v > max) max = v;
    sum += v;
    count++;
  }
  if (count === 0) return null;
  const k = max > min ? Math.max(1, Math.min(MAX_BINS, Math.ceil(Math.sqrt(count)))) : 1;
  const width = max > min ? (max - min) / k : 0;
  const counts = new Int32Array(k);
  for (let i = 0; i < n; i++) {
    if (take && !take(i)) continue;
    const v = values[i];
    if (!Number.isFinite(v)) continue;
    counts[binOf(v, min, width, k)]++;
  }
  return { count, lo: min, width, counts, min, max, mean: sum / count };
}

/** The bin a value falls in: [lo + b·w, lo + (b+1)·w), the last bin closed at the top. */
export function binOf(v: number, lo: number, width: number, bins: number): number {
  if (width === 0) return 0;
  return Math.max(0, Math.min(bins - 1, Math.floor((v - lo) / width)));
}
