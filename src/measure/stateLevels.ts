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
  if (finite === 0) return { low: Number.NaN, high: Number.NaN, method: 'min-max' };
  if (finite < MIN_HISTOGRAM_SAMPLES || max === min) return { low: min, high: max, method: 'min-max' };

  const bins = HISTOGRAM_BINS;
  const weight = new Float64Array(bins);
  const sum = new Float64Array(bins);
  const scale = bins / (max - min);
  for (let k = 0; k < n; k++) {
    const v = values[k];
    if (!Number.isFinite(v)) continue;
    const w = k + 1 < n ? times[k + 1] - times[k] : lastWeight;
    let b = Math.floor((v - min) * scale);
    if (b >= bins) b = bins - 1;
    weight[b] += w;
    sum[b] += w * v;
  }
  const half = bins / 2;
  // Lower half scanned upward and upper half downward, so a tie goes to the bin nearest the extreme.
  let lowBin = 0;
  for (let b = 1; b < half; b++) if (weight[b] > weight[lowBin]) lowBin = b;
  let highBin = bins - 1;
  for (let b = bins - 2; b >= half; b--) if (weight[b] > weight[highBin]) highBin = b;
  if (!(weight[lowBin] > 0) || !(weight[highBin] > 0)) return { low: min, high: max, method: 'min-max' };
  return { low: sum[lowBin] / weight[lowBin], high: sum[highBin] / weight[highBin], method: 'histogram-mode' };
}
