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
import { histogramStateLevels } from './stateLevels';
import { EdgeDir, type EdgeList, type RealLevels, type StateMethod, edgeListOf } from './types';

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

/** Settled samples: same-timestamp changes collapsed to the last, repeated values dropped. */
function settledSamples(times: Float64Array, sig: Signal) {
  const n = sig.count;
  const st = new Float64Array(n);
  const sv = new Float64Array(n);
  const zeroWidth: number[] = [];
  let m = 0;
  let i = 0;
  while (i < n) {
    const ti = sig.timeIndex[i];
    const before = m > 0 ? sv[m - 1] : Number.NaN;
    let passed = false;
    let j = i;
    let v = sig.reals[i];
    while (j < n && sig.timeIndex[j] === ti) {
      v = sig.reals[j];
      if (m > 0 && !Object.is(v, before)) passed = true;
      j++;
    }
    if (m > 0 && Object.is(v, before)) {
      if (passed && j - i > 1) zeroWidth.push(times[ti]);
    } else {
      st[m] = times[ti];
      sv[m++] = v;
    }
    i = j;
  }
  return { st: st.subarray(0, m), sv: sv.subarray(0, m), m, zeroWidth };
}

/** Instant at which the ramp from v0 (starting at rampStart) to v1 (sampleTicks later) crosses `level`. */
function cross(rampStart: number, sampleTicks: number, v0: number, v1: number, level: number): number {
  return rampStart + (sampleTicks * (level - v0)) / (v1 - v0);
}

export function realEdges(times: Float64Array, sig: Signal, label: string, endTick: number, opts: RealEdgeOptions): EdgeList {
  const { st, sv, m, zeroWidth } = settledSamples(times, sig);

  let sampleTicks = Infinity;
  for (let k = 1; k < m; k++) {
    if (Number.isFinite(sv[k]) && Number.isFinite(sv[k - 1])) {
      const dt = st[k] - st[k - 1];
      if (dt < sampleTicks) sampleTicks = dt;
    }
  }
  if (!Number.isFinite(sampleTicks)) sampleTicks = 1;

  let low: number;
  let high: number;
  let method: StateMethod;
  if (opts.states) {
    ({ low, high } = opts.states);
    method = 'user';
  } else {
    const lastWeight = m > 0 ? Math.max(endTick - st[m - 1], sampleTicks) : 0;
    ({ low, high, method } = histogramStateLevels(sv, st, lastWeight));
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

  const ticks = new Float64Array(m);
  const dir = new Uint8Array(m);
  const transition = new Float64Array(m);
  const unknown: number[] = [];
  const runts: number[] = [];
  let count = 0;

  const { lower, upper } = levels;
  let state = NONE;
  let firstRef = Number.NaN; // first reference crossing away from the current state
  let lastRef = Number.NaN; // last reference crossing away from it
  let lastBack = Number.NaN; // last reference crossing back towards it
  let lastStart = Number.NaN; // last crossing of the start-side level (10 % rising, 90 % falling)
  let startAtRef = Number.NaN; // lastStart as it was at lastRef
  let endAfter = Number.NaN; // first crossing of the end-side level after lastRef
  let inUnknown = false;

  for (let k = 0; k < m; k++) {
    const v = sv[k];
    const t = st[k];
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
    if (amp > 0 && state !== NONE) {
      const v0 = sv[k - 1];
      const rampStart = t - sampleTicks;
      if (state === LOW) {
        if (v > v0) {
          if (v0 < lower && lower <= v) lastStart = cross(rampStart, sampleTicks, v0, v, lower);
          if (v0 < reference && reference <= v) {
            const c = cross(rampStart, sampleTicks, v0, v, reference);
            if (Number.isNaN(firstRef)) firstRef = c;
            lastRef = c;
            startAtRef = lastStart;
            endAfter = Number.NaN;
          }
          if (v0 < upper && upper <= v && !Number.isNaN(lastRef) && Number.isNaN(endAfter)) endAfter = cross(rampStart, sampleTicks, v0, v, upper);
        } else if (v < v0 && v < reference && reference <= v0) lastBack = cross(rampStart, sampleTicks, v0, v, reference);
      } else if (v < v0) {
        if (v < upper && upper <= v0) lastStart = cross(rampStart, sampleTicks, v0, v, upper);
        if (v < reference && reference <= v0) {
          const c = cross(rampStart, sampleTicks, v0, v, reference);
          if (Number.isNaN(firstRef)) firstRef = c;
          lastRef = c;
          startAtRef = lastStart;
          endAfter = Number.NaN;
        }
        if (v < lower && lower <= v0 && !Number.isNaN(lastRef) && Number.isNaN(endAfter)) endAfter = cross(rampStart, sampleTicks, v0, v, lower);
      } else if (v > v0 && v0 < reference && reference <= v) lastBack = cross(rampStart, sampleTicks, v0, v, reference);
    }
    if (!(amp > 0)) continue;
    if (state === LOW) {
      if (v >= highBottom) {
        ticks[count] = lastRef;
        dir[count] = EdgeDir.Rise;
        transition[count++] = endAfter - startAtRef;
        state = HIGH;
        firstRef = lastRef = lastBack = lastStart = startAtRef = endAfter = Number.NaN;
      } else if (v <= lowTop) {
        if (!Number.isNaN(firstRef)) runts.push(firstRef, lastBack, EdgeDir.Rise);
        firstRef = lastRef = lastBack = lastStart = startAtRef = endAfter = Number.NaN;
      }
    } else if (state === HIGH) {
      if (v <= lowTop) {
        ticks[count] = lastRef;
        dir[count] = EdgeDir.Fall;
        transition[count++] = endAfter - startAtRef;
        state = LOW;
        firstRef = lastRef = lastBack = lastStart = startAtRef = endAfter = Number.NaN;
      } else if (v >= highBottom) {
        if (!Number.isNaN(firstRef)) runts.push(firstRef, lastBack, EdgeDir.Fall);
        firstRef = lastRef = lastBack = lastStart = startAtRef = endAfter = Number.NaN;
      }
    } else if (v <= lowTop) state = LOW;
    else if (v >= highBottom) state = HIGH;
  }
  if (inUnknown) unknown.push(Number.NaN);
  return edgeListOf({
    label,
    source: 'real',
    count,
    ticks: ticks.slice(0, count),
    dir: dir.slice(0, count),
    transition: transition.slice(0, count),
    unknown,
    unknownState: new Array<number>(unknown.length / 2).fill(-1),
    zeroWidth,
    runts,
    levels,
  });
}
