// IEEE 181-2011 state levels of a bilevel waveform by the histogram-mode method: histogram the
// samples between their minimum and maximum, split the histogram into a lower and an upper half, and
// take the most populated bin of each half. The level is the mean of the samples inside that modal
// bin (not the bin's centre, which with coarse bins would bias the 10 % and 90 % points).
// A VCD real holds its value until the next change, so each sample is weighted by the time it holds.
// Signals with too few samples fall back to the min/max (peak-magnitude) method.

import type { StateMethod } from './types';

/** 100 bins and a split into two equal halves: the usual defaults for the histogram method (common practice). */
export const HISTOGRAM_BINS = 100;
/** Fewer finite samples than this: min/max instead of the histogram. */
export const MIN_HISTOGRAM_SAMPLES = 16;

export interface StateLevels {
  low: number;
  high: number;
  method: StateMethod;
}

/**
 * The levels when the histogram does not apply: no finite sample (NaN), too few samples or a flat
 * signal (min/max). Null when the histogram applies.
 */
export function rangeStateLevels(finite: number, min: number, max: number): StateLevels | null {
  if (finite === 0) return { low: Number.NaN, high: Number.NaN, method: 'min-max' };
  if (finite < MIN_HISTOGRAM_SAMPLES || max === min) return { low: min, high: max, method: 'min-max' };
  return null;
}

/** Time-weighted histogram of the samples between min and max (max > min). */
export class LevelHistogram {
  private readonly weight = new Float64Array(HISTOGRAM_BINS);
  private readonly sum = new Float64Array(HISTOGRAM_BINS);
  private readonly scale: number;

  constructor(
    private readonly min: number,
    private readonly max: number,
  ) {
    this.scale = HISTOGRAM_BINS / (max - min);
  }

  /** A finite sample `v` held for `w` ticks. */
  add(v: number, w: number): void {
    let b = Math.floor((v - this.min) * this.scale);
    if (b >= HISTOGRAM_BINS) b = HISTOGRAM_BINS - 1;
    this.weight[b] += w;
    this.sum[b] += w * v;
  }

  levels(): StateLevels {
    const { weight, sum } = this;
    const half = HISTOGRAM_BINS / 2;
    // Lower half scanned upward and upper half downward, so a tie goes to the bin nearest the extreme.
    let lowBin = 0;
    for (let b = 1; b < half; b++) if (weight[b] > weight[lowBin]) lowBin = b;
    let highBin = HISTOGRAM_BINS - 1;
    for (let b = HISTOGRAM_BINS - 2; b >= half; b--) if (weight[b] > weight[highBin]) highBin = b;
    if (!(weight[lowBin] > 0) || !(weight[highBin] > 0)) return { low: this.min, high: this.max, method: 'min-max' };
    return { low: sum[lowBin] / weight[lowBin], high: sum[highBin] / weight[highBin], method: 'histogram-mode' };
  }
}

/**
 * values[k] holds from times[k] to times[k+1]; the last one for `lastWeight` ticks.
 * Non-finite values (NaN marks no data) are skipped.
 */
export function histogramStateLevels(values: Float64Array, times: Float64Array, lastWeight: number): StateLevels {
  const n = values.length;
  let min = Infinity;
  let max = -Infinity;
  let finite = 0;
  for (let k = 0; k < n; k++) {
    const v = values[k];
    if (!Number.isFinite(v)) continue;
    finite++;
    if (v < min) min = v;
    if (v > max) max = v;
  }
  const fallback = rangeStateLevels(finite, min, max);
  if (fallback) return fallback;
  const histogram = new LevelHistogram(min, max);
  for (let k = 0; k < n; k++) {
    const v = values[k];
    if (Number.isFinite(v)) histogram.add(v, k + 1 < n ? times[k + 1] - times[k] : lastWeight);
  }
  return histogram.levels();
}
