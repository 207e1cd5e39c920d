// The default glitch width: 10 % of the shortest clock-like period in the dump.
// A net is clock-like when it is a 1-bit net whose first rising edges come at a steady rate: at
// least 8 intervals between successive rises, and at least 90 % of them within 2 % of their median
// (common practice: a free-running clock has a fixed period; gated or data nets do not). Only the
// first 64 rises of each net are read, so guessing costs a few hundred steps per net, whatever the
// dump's size. With no clock-like net it is 10 % of the shortest typical interval between changes
// of any 1-bit net (the median of its first 64 intervals), so only pulses far shorter than the
// dump's usual activity are marked.
// Pure.

import { type Dump, Logic } from '../../model/dump';
import { ticksToSeconds } from '../../measure/ticks';
import type { WidthChoice } from './types';

const RISES = 65;
const MIN_INTERVALS = 8;

/** Period in ticks of one signal when it is clock-like, else null. */
export function clockPeriodTicks(times: Float64Array, timeIndex: Uint32Array, logic: Uint8Array, count: number): number | null {
  const rises: number[] = [];
  let prev = -1;
  for (let i = 0; i < count && rises.length < RISES; i++) {
    const c = logic[i];
    if (c === Logic.L1 && prev === Logic.L0) {
      const t = times[timeIndex[i]];
      if (rises.length === 0 || t > rises[rises.length - 1]) rises.push(t);
    }
    prev = c;
  }
  if (rises.length < MIN_INTERVALS + 1) return null;
  const gaps = rises.slice(1).map((t, k) => t - rises[k]);
  const sorted = [...gaps].sort((a, b) => a - b);
  const median = sorted[sorted.length >> 1];
  if (!(median > 0)) return null;
  const steady = gaps.filter((g) => Math.abs(g - median) <= 0.02 * median).length;
  return steady >= 0.9 * gaps.length ? median : null;
}

/** The default glitch width and where it came from (see the top of this file). */
export function defaultGlitchWidth(dump: Dump): WidthChoice {
  let best = Infinity;
  let bestNet: string | null = null;
  const done = new Set<number>();
  for (const net of dump.nets) {
    if (done.has(net.signal)) continue;
    done.add(net.signal);
    const sig = dump.signals[net.signal];
    if (sig.kind !== 'logic' || sig.width !== 1 || sig.count < 2 * (MIN_INTERVALS + 1)) continue;
    const p = clockPeriodTicks(dump.times, sig.timeIndex, sig.logic, sig.count);
    if (p !== null && p < best) {
      best = p;
      bestNet = net.path;
    }
  }
  const ts = dump.timescale;
  if (bestNet !== null) {
    return { seconds: ticksToSeconds(ts, best) / 10, source: 'clock', clock: bestNet, periodS: ticksToSeconds(ts, best) };
  }
  let typical = Infinity;
  for (const net of dump.nets) {
    const sig = dump.signals[net.signal];
    if (sig.kind !== 'logic' || sig.count < 3) continue;
    typical = Math.min(typical, typicalIntervalTicks(dump.times, sig.timeIndex, sig.count));
  }
  const ticks = Number.isFinite(typical) ? typical : Math.max(1, dump.endTick);
  return { seconds: ticksToSeconds(ts, ticks) / 10, source: 'fallback', clock: null, periodS: ticksToSeconds(ts, ticks) };
}

/** Median interval between the first changes of a signal at distinct times, in ticks. */
export function typicalIntervalTicks(times: Float64Array, timeIndex: Uint32Array, count: number): number {
  const gaps: number[] = [];
  for (let i = 1; i < count && gaps.length < RISES; i++) {
    const g = times[timeIndex[i]] - times[timeIndex[i - 1]];
    if (g > 0) gaps.push(g);
  }
  if (gaps.length === 0) return Infinity;
  gaps.sort((a, b) => a - b);
  return gaps[gaps.length >> 1];
}
