// Edges of a real-valued net by IEEE 181-2011 rules.
// - State levels: histogram-mode (stateLevels.ts), min/max for few samples, or given by the user.
// - State boundaries (± BOUNDARY_PERCENT of the amplitude around each state level) act as hysteresis:
//   a transition counts only when the waveform leaves one state's band and enters the other's, so
//   noise around the reference level never makes extra edges.
// - The edge instant is the reference-level crossing placed by linear interpolation. If noise makes the
//   waveform cross the reference level several times inside one transition, the rule is: the LAST
//   crossing in the transition's direction before the far band is entered.
// - Transition duration: from the last crossing of the start-side reference level (10 % for a rise,
//   90 % for a fall) before the edge instant to the first crossing of the end-side one after it.
// - Runt: the waveform crosses the reference level and returns to the band it left without reaching
//   the far band. Reported from its first reference crossing to its last return crossing.
// - Sampling: a VCD real holds its value until the next change. With sampleTicks = the shortest
//   interval between successive samples, a held value stays flat until sampleTicks before the next
//   sample and ramps linearly to it. For a uniformly sampled waveform this is plain linear
//   interpolation between samples; a long flat stretch (written once) stays flat as the dump says.
// - NaN (no data, e.g. $dumpoff) opens an unknown span and resets the state machine.

import type { Signal } from '../model/dump';
import { MeasureError } from './errors';
import { type LevelSpec, levelValue } from './level';
import { LevelHistogram, rangeStateLevels } from './stateLevels';
import { EdgeDir, type EdgeList, type RealLevels, type StateMethod, edgeListOf } from './types';
import { closeSpans, groupEnd } from './settle';

/** State-boundary half-width in % of the amplitude (a usual default for IEEE 181 tools, common practice). */
export const BOUNDARY_PERCENT = 2;
/** Lower and upper reference levels for the transition duration (IEEE 181 defaults). */
export const LOWER_PERCENT = 10;
export const UPPER_PERCENT = 90;

export interface RealEdgeOptions {
  level: LevelSpec;
  /** User-given state levels instead of the histogram. */
  states?: { low: number; high: number };
}

const NONE = -1;
const LOW = 0;
const HIGH = 1;

/**
 * Index of the change holding the next settled sample after the one at change `prev` (−1: the
 * first): same-timestamp changes collapse to the last one, and a value equal to the sample before is
 * no new sample. −1 when there is none. (Indices only, so no number is boxed if this is not inlined.)
 */
function nextSample(idx: Uint32Array, reals: Float64Array, prev: number, last: number): number {
  for (let i = prev + 1; i <= last; i++) {
    i = groupEnd(idx, i, last);
    if (prev < 0 || !Object.is(reals[i], reals[prev])) return i;
  }
  return -1;
}

/** Timestamps whose changes left the value where it was but passed through another: zero-width glitches. */
function realZeroWidths(times: Float64Array, sig: Signal): number[] {
  const out: number[] = [];
  const idx = sig.timeIndex;
  const reals = sig.reals;
  const last = sig.count - 1;
  for (let i = 0; i <= last; i++) {
    const end = groupEnd(idx, i, last);
    if (i > 0 && end > i && Object.is(reals[end], reals[i - 1])) {
      for (let k = i; k < end; k++) {
        if (!Object.is(reals[k], reals[i - 1])) {
          out.push(times[idx[i]]);
          break;
        }
      }
    }
    i = end;
  }
  return out;
}

/** Instant at which the ramp from v0 (starting at rampStart) to v1 (sampleTicks later) crosses `level`. */
function cross(rampStart: number, sampleTicks: number, v0: number, v1: number, level: number): number {
  return rampStart + (sampleTicks * (level - v0)) / (v1 - v0);
}

/** Samples, finite samples, their range, the shortest interval between successive finite ones, the last sample's tick. */
function sampleRange(times: Float64Array, sig: Signal): { m: number; finite: number; min: number; max: number; sampleTicks: number; lastTick: number } {
  const idx = sig.timeIndex;
  const reals = sig.reals;
  const last = sig.count - 1;
  let m = 0;
  let finite = 0;
  let min = Infinity;
  let max = -Infinity;
  let sampleTicks = Infinity;
  let t0 = Number.NaN;
  let v0 = Number.NaN;
  for (let e = nextSample(idx, reals, -1, last); e >= 0; e = nextSample(idx, reals, e, last)) {
    const t = times[idx[e]];
    const v = reals[e];
    if (Number.isFinite(v)) {
      finite++;
      if (v < min) min = v;
      if (v > max) max = v;
      if (m > 0 && Number.isFinite(v0) && t - t0 < sampleTicks) sampleTicks = t - t0;
    }
    m++;
    t0 = t;
    v0 = v;
  }
  return { m, finite, min, max, sampleTicks, lastTick: t0 };
}

/** Each finite sample into the histogram, weighted by how long it holds (to the next sample; the last one `lastWeight`). */
function fillHistogram(times: Float64Array, sig: Signal, histogram: LevelHistogram, lastWeight: number): void {
  const idx = sig.timeIndex;
  const reals = sig.reals;
  const last = sig.count - 1;
  let t0 = Number.NaN;
  let v0 = Number.NaN;
  for (let e = nextSample(idx, reals, -1, last); e >= 0; e = nextSample(idx, reals, e, last)) {
    const t = times[idx[e]];
    if (Number.isFinite(v0)) histogram.add(v0, t - t0);
    t0 = t;
    v0 = reals[e];
  }
  if (Number.isFinite(v0)) histogram.add(v0, lastWeight);
}

export function realEdges(times: Float64Array, sig: Signal, label: string, endTick: number, opts: RealEdgeOptions): EdgeList {
  const range = sampleRange(times, sig);
  const sampleTicks = Number.isFinite(range.sampleTicks) ? range.sampleTicks : 1;

  let low: number;
  let high: number;
  let method: StateMethod;
  if (opts.states) {
    ({ low, high } = opts.states);
    method = 'user';
  } else {
    let lv = rangeStateLevels(range.finite, range.min, range.max);
    if (!lv) {
      const histogram = new LevelHistogram(range.min, range.max);
      fillHistogram(times, sig, histogram, range.m > 0 ? Math.max(endTick - range.lastTick, sampleTicks) : 0);
      lv = histogram.levels();
    }
    ({ low, high, method } = lv);
  }
  const amp = high - low;
  const reference = levelValue(opts.level, low, high);
  const levels: RealLevels = {
    low,
    high,
    method,
    reference,
    lower: low + (LOWER_PERCENT / 100) * amp,
    upper: low + (UPPER_PERCENT / 100) * amp,
    boundary: (BOUNDARY_PERCENT / 100) * amp,
    sampleTicks,
  };
  const lowTop = low + levels.boundary;
  const highBottom = high - levels.boundary;
  if (amp > 0 && !(reference > lowTop && reference < highBottom)) {
    throw new MeasureError(
      `reference level ${opts.level.text} (${reference}) of net '${label}' is outside its transition region: ` +
        `state levels ${low} and ${high} (${method}), state boundaries end at ${lowTop} and ${highBottom}`,
    );
  }
  const found = findRealEdges(times, sig, levels);
  const { count } = found;
  return edgeListOf({
    label,
    source: 'real',
    count,
    ticks: found.ticks.subarray(0, count),
    dir: found.dir.subarray(0, count),
    transition: found.transition.subarray(0, count),
    unknown: found.unknown,
    unknownState: new Array<number>(found.unknown.length / 2).fill(-1),
    zeroWidth: realZeroWidths(times, sig),
    runts: found.runts,
    levels,
  });
}

/** Edge output that grows by doubling (a real net has far fewer edges than samples). */
class RealEdgeOutput {
  count = 0;
  ticks = new Float64Array(16);
  dir = new Uint8Array(16);
  transition = new Float64Array(16);
  readonly unknown: number[] = [];
  readonly runts: number[] = [];

  push(tick: number, dir: number, transition: number): void {
    if (this.count === this.ticks.length) {
      const n = 2 * this.count;
      const t = new Float64Array(n);
      t.set(this.ticks);
      this.ticks = t;
      const d = new Uint8Array(n);
      d.set(this.dir);
      this.dir = d;
      const tr = new Float64Array(n);
      tr.set(this.transition);
      this.transition = tr;
    }
    this.ticks[this.count] = tick;
    this.dir[this.count] = dir;
    this.transition[this.count++] = transition;
  }
}

/** The edge state machine (rules at the top of the file) over the settled samples. */
function findRealEdges(times: Float64Array, sig: Signal, levels: RealLevels): RealEdgeOutput {
  const out = new RealEdgeOutput();
  const { unknown, runts } = out;
  const { low, high, reference, lower, upper, sampleTicks } = levels;
  const amp = high - low;
  const lowTop = low + levels.boundary;
  const highBottom = high - levels.boundary;
  const idx = sig.timeIndex;
  const reals = sig.reals;
  const last = sig.count - 1;
  let state = NONE;
  let firstRef = Number.NaN; // first reference crossing away from the current state
  let lastRef = Number.NaN; // last reference crossing away from it
  let lastBack = Number.NaN; // last reference crossing back towards it
  let lastStart = Number.NaN; // last crossing of the start-side level (10 % rising, 90 % falling)
  let startAtRef = Number.NaN; // lastStart as it was at lastRef
  let endAfter = Number.NaN; // first crossing of the end-side level after lastRef
  let inUnknown = false;
  let v0 = Number.NaN; // the sample before

  for (let e = nextSample(idx, reals, -1, last); e >= 0; e = nextSample(idx, reals, e, last)) {
    const v = reals[e];
    const t = times[idx[e]];
    const before = v0;
    v0 = v;
    if (!Number.isFinite(v)) {
      if (!inUnknown) unknown.push(t);
      inUnknown = true;
      state = NONE;
      firstRef = lastRef = lastBack = lastStart = startAtRef = endAfter = Number.NaN;
      continue;
    }
    if (inUnknown) {
      unknown.push(t);
      inUnknown = false;
    }
    if (!(amp > 0)) continue;
    if (state !== NONE) {
      const rampStart = t - sampleTicks;
      if (state === LOW) {
        if (v > before) {
          if (before < lower && lower <= v) lastStart = cross(rampStart, sampleTicks, before, v, lower);
          if (before < reference && reference <= v) {
            const c = cross(rampStart, sampleTicks, before, v, reference);
            if (Number.isNaN(firstRef)) firstRef = c;
            lastRef = c;
            startAtRef = lastStart;
            endAfter = Number.NaN;
          }
          if (before < upper && upper <= v && !Number.isNaN(lastRef) && Number.isNaN(endAfter)) endAfter = cross(rampStart, sampleTicks, before, v, upper);
        } else if (v < before && v < reference && reference <= before) lastBack = cross(rampStart, sampleTicks, before, v, reference);
      } else if (v < before) {
        if (v < upper && upper <= before) lastStart = cross(rampStart, sampleTicks, before, v, upper);
        if (v < reference && reference <= before) {
          const c = cross(rampStart, sampleTicks, before, v, reference);
          if (Number.isNaN(firstRef)) firstRef = c;
          lastRef = c;
          startAtRef = lastStart;
          endAfter = Number.NaN;
        }
        if (v < lower && lower <= before && !Number.isNaN(lastRef) && Number.isNaN(endAfter)) endAfter = cross(rampStart, sampleTicks, before, v, lower);
      } else if (v > before && before < reference && reference <= v) lastBack = cross(rampStart, sampleTicks, before, v, reference);
    }
    if (state === LOW) {
      if (v >= highBottom) {
        out.push(lastRef, EdgeDir.Rise, endAfter - startAtRef);
        state = HIGH;
        firstRef = lastRef = lastBack = lastStart = startAtRef = endAfter = Number.NaN;
      } else if (v <= lowTop) {
        if (!Number.isNaN(firstRef)) runts.push(firstRef, lastBack, EdgeDir.Rise);
        firstRef = lastRef = lastBack = lastStart = startAtRef = endAfter = Number.NaN;
      }
    } else if (state === HIGH) {
      if (v <= lowTop) {
        out.push(lastRef, EdgeDir.Fall, endAfter - startAtRef);
        state = LOW;
        firstRef = lastRef = lastBack = lastStart = startAtRef = endAfter = Number.NaN;
      } else if (v >= highBottom) {
        if (!Number.isNaN(firstRef)) runts.push(firstRef, lastBack, EdgeDir.Fall);
        firstRef = lastRef = lastBack = lastStart = startAtRef = endAfter = Number.NaN;
      }
    } else if (v <= lowTop) state = LOW;
    else if (v >= highBottom) state = HIGH;
  }
  closeSpans(unknown);
  return out;
}
