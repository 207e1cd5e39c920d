// Time ruler marks: a 1-2-5 step in seconds chosen so labels stay a readable distance apart,
// with labels in the SI unit that suits each time (fs to s).

import { formatTime } from '../model/units';

export interface RulerMark {
  /** Pixel x. */
  x: number;
  /** Label text for major marks, '' for minor ones. */
  label: string;
}

/** Smallest 1·10^k, 2·10^k or 5·10^k at least `min`. */
export function niceStep(min: number): number {
  if (!(min > 0) || !Number.isFinite(min)) return 1;
  const p = 10 ** Math.floor(Math.log10(min));
  for (const m of [1, 2, 5, 10]) if (m * p >= min * (1 - 1e-12)) return m * p;
  return 10 * p;
}

/**
 * Marks for a window starting at `startSeconds`, `secondsPerPixel` wide per pixel, `width` px.
 * Major marks at least `minGap` px apart carry labels; four minor marks sit between each pair.
 */
export function rulerMarks(startSeconds: number, secondsPerPixel: number, width: number, minGap = 90): RulerMark[] {
  const marks: RulerMark[] = [];
  if (!(secondsPerPixel > 0) || width <= 0) return marks;
  const step = niceStep(minGap * secondsPerPixel);
  const minor = step / 5;
  const first = Math.ceil(startSeconds / minor - 1e-9);
  const last = Math.floor((startSeconds + width * secondsPerPixel) / minor + 1e-9);
  if (last - first > 4 * width) return marks; // cannot happen with a sane minGap; guards a loop
  const end = startSeconds + width * secondsPerPixel;
  // Enough digits to tell neighbouring labels apart at this step.
  const span = Math.max(Math.abs(startSeconds), Math.abs(end), step);
  const digits = Math.min(15, Math.max(3, Math.ceil(Math.log10(span / step)) + 2));
  for (let k = first; k <= last; k++) {
    const t = k * minor;
    const x = (t - startSeconds) / secondsPerPixel;
    const major = k % 5 === 0;
    marks.push({ x, label: major ? formatTime(Math.abs(t) < minor * 1e-6 ? 0 : t, digits) : '' });
  }
  return marks;
}
