// Measurements work in integer ticks (exact); seconds appear only at the result boundary.

import type { Timescale } from '../model/dump';

const DIVISOR: Record<string, number> = { s: 1, ms: 1e3, us: 1e6, ns: 1e9, ps: 1e12, fs: 1e15 };

/**
 * Seconds for a tick count. Dividing the exact integer product by an exactly representable power of
 * ten gives the correctly rounded double (2000 ticks of 1 ps → 2e-9 exactly as printed), which a
 * multiplication by a rounded tick length (1e-12) would not.
 */
export function ticksToSeconds(ts: Timescale, ticks: number): number {
  const div = DIVISOR[ts.unit];
  if (div === undefined) return ticks * ts.seconds;
  return (ticks * ts.magnitude) / div;
}

/** ticksToSeconds for one timescale, with the unit looked up once (for converting many times). */
export function secondsOf(ts: Timescale): (ticks: number) => number {
  const div = DIVISOR[ts.unit];
  const magnitude = ts.magnitude;
  const seconds = ts.seconds;
  return div === undefined ? (ticks) => ticks * seconds : (ticks) => (ticks * magnitude) / div;
}

/** Ticks for a time in seconds (may be fractional; callers compare, never index, with it). */
export function secondsToTicks(ts: Timescale, seconds: number): number {
  const div = DIVISOR[ts.unit];
  if (div === undefined) return seconds / ts.seconds;
  return (seconds * div) / ts.magnitude;
}

/**
 * A window or width given in seconds, as ticks. A value within a billionth of a whole tick count is
 * snapped to it, so `2ns` on a 1 ps timescale is exactly 2000 ticks and a pair of exactly that length
 * is not lost to rounding in the unit conversion.
 */
export function windowTicks(ts: Timescale, seconds: number): number {
  const x = secondsToTicks(ts, seconds);
  const r = Math.round(x);
  return Math.abs(x - r) <= 1e-9 * Math.max(1, Math.abs(x)) ? r : x;
}

/** 1 / (a duration in ticks), in hertz, as exactly as the unit conversion allows (1/8 ns → 125000000). */
export function ticksToHertz(ts: Timescale, ticks: number): number {
  const div = DIVISOR[ts.unit];
  if (div === undefined) return 1 / (ticks * ts.seconds);
  return div / (ticks * ts.magnitude);
}
