// Run-to-run comparison of two dumps of the same stimulus: for each net present in both, its edges
// matched in order (match.ts) with the shift new − base, and the first time its value differs for
// longer than a tolerance (differ.ts). Comparing a zero-delay run with a timed one gives every net's
// delay relative to the ideal at once. Pure: no DOM, no Node APIs.

import type { Dump, Net, Timescale } from '../model/dump';
import { type NetRef, bitSignal, resolveNetList } from '../model/netref';
import { edgeList, glitchTargets, ticksToSeconds, windowTicks } from '../measure/index';
import { type Run, firstDifference } from './differ';
import { type EdgeSeries, matchEdges } from './match';

export interface CompareOptions {
  /** Net list or glob (as on the command line); default every net present in both dumps. */
  nets?: string;
  /** A difference must last longer than this to count (seconds, default 0: any difference). */
  toleranceS?: number;
  /** Edges further apart than this are never matched (seconds); default unbounded. */
  windowS?: number;
  /** Compare each bit of a vector as a net of its own (its bits may switch at different times). */
  bits?: boolean;
}

export interface NetComparison {
  net: string;
  /** Signal kind in the base dump (logic, vector, real, ...). */
  kind: string;
  base_edges: number;
  new_edges: number;
  matched: number;
  added: number;
  missing: number;
  mean_shift_s: number | null;
  min_shift_s: number | null;
  max_shift_s: number | null;
  /** Base-run time of the matched edge with the largest |shift|. */
  worst_shift_time_s: number | null;
  /** Start of this net's first difference lasting longer than the tolerance; null if none. */
  first_difference_s: number | null;
}

export interface FirstDifference {
  net: string;
  time_s: number;
  /** null when the difference lasts to the end of the shorter run. */
  duration_s: number | null;
  base_value: string;
  new_value: string;
}

export interface CompareResult {
  base: string;
  new: string;
  tolerance_s: number;
  window_s: number | null;
  nets: NetComparison[];
  /** The earliest of the nets' first differences (ties: first net in base order). */
  first_difference: FirstDifference | null;
  /** Nets compared only by path: present in one dump and not the other. */
  only_in_base: string[];
  only_in_new: string[];
  /** Nets present in both whose kind or width differ, so they cannot be compared. */
  incomparable: Array<{ net: string; reason: string }>;
}

export class CompareError extends Error {}

/**
 * Both runs are compared in ticks of the finer timescale, so shifts and durations are exact
 * integers until the one conversion to seconds (standard timescales differ by powers of ten).
 */
function commonClock(base: Dump, next: Dump): { ts: Timescale; base: Run; next: Run } {
  const fine = base.timescale.seconds <= next.timescale.seconds ? base.timescale : next.timescale;
  const factor = (ts: Timescale) => {
    const r = ts.seconds / fine.seconds;
    return Math.abs(r - Math.round(r)) < 1e-9 * r ? Math.round(r) : r;
  };
  return { ts: fine, base: { dump: base, factor: factor(base.timescale) }, next: { dump: next, factor: factor(next.timescale) } };
}

function series(run: Run, ref: NetRef): EdgeSeries {
  const list = edgeList(run.dump, ref);
  const times = new Float64Array(list.count);
  for (let k = 0; k < list.count; k++) times[k] = list.ticks[k] * run.factor;
  return { times, dir: list.dir };
}

/** One entry per distinct path, in dump order. */
function distinctNets(dump: Dump): Map<string, Net> {
  const out = new Map<string, Net>();
  for (const n of dump.nets) if (!out.has(n.path)) out.set(n.path, n);
  return out;
}

function counterpart(next: Map<string, Net>, ref: NetRef): NetRef | null {
  const net = next.get(ref.net.path);
  if (!net) return null;
  return { net, bit: ref.bit, label: ref.label };
}

function whyIncomparable(base: Dump, a: NetRef, next: Dump, b: NetRef): string | null {
  const sa = base.signals[a.net.signal];
  const sb = next.signals[b.net.signal];
  if (a.bit !== null) {
    const lo = Math.min(b.net.msb, b.net.lsb);
    const hi = Math.max(b.net.msb, b.net.lsb);
    if (sb.kind !== 'vector' || a.bit < lo || a.bit > hi) return `bit ${a.bit} does not exist in the new dump's ${b.net.path}`;
    return null;
  }
  if (sa.kind !== sb.kind) return `a ${sa.kind} in the base dump but a ${sb.kind} in the new one`;
  if (sa.width !== sb.width) return `${sa.width} bits wide in the base dump but ${sb.width} in the new one`;
  return null;
}

export function compareDumps(base: Dump, next: Dump, opts: CompareOptions = {}): CompareResult {
  const clock = commonClock(base, next);
  const s = (ticks: number | null) => (ticks === null ? null : ticksToSeconds(clock.ts, ticks));
  const tolerance = windowTicks(clock.ts, opts.toleranceS ?? 0);
  const window = opts.windowS === undefined ? null : windowTicks(clock.ts, opts.windowS);
  const baseNets = distinctNets(base);
  const newNets = distinctNets(next);
  const result: CompareResult = {
    base: base.source,
    new: next.source,
    tolerance_s: opts.toleranceS ?? 0,
    window_s: opts.windowS ?? null,
    nets: [],
    first_difference: null,
    only_in_base: [],
    only_in_new: [],
    incomparable: [],
  };
  let refs: NetRef[];
  if (opts.nets !== undefined) refs = resolveNetList(base, opts.nets);
  else refs = [...baseNets.values()].map((net) => ({ net, bit: null, label: net.path }));
  // Whole vectors become their bits (the glitch search's expansion).
  if (opts.bits) refs = glitchTargets(base, refs);
  for (const path of newNets.keys()) if (!baseNets.has(path) && opts.nets === undefined) result.only_in_new.push(path);

  let firstAt: number | null = null;
  for (const ref of refs) {
    const other = counterpart(newNets, ref);
    if (!other) {
      result.only_in_base.push(ref.label);
      continue;
    }
    const why = whyIncomparable(base, ref, next, other);
    if (why) {
      result.incomparable.push({ net: ref.label, reason: why });
      continue;
    }
    const a = series(clock.base, ref);
    const b = series(clock.next, other);
    const m = matchEdges(a, b, window);
    const diff = firstDifference(clock.base, bitSignal(base, ref), clock.next, bitSignal(next, other), tolerance);
    result.nets.push({
      net: ref.label,
      kind: base.signals[ref.net.signal].kind,
      base_edges: a.times.length,
      new_edges: b.times.length,
      matched: m.matched,
      added: m.added,
      missing: m.missing,
      mean_shift_s: s(m.meanShift),
      min_shift_s: s(m.minShift),
      max_shift_s: s(m.maxShift),
      worst_shift_time_s: s(m.worstTime),
      first_difference_s: diff ? s(diff.start) : null,
    });
    if (diff && (firstAt === null || diff.start < firstAt)) {
      firstAt = diff.start;
      result.first_difference = { net: ref.label, time_s: s(diff.start)!, duration_s: s(diff.duration), base_value: diff.baseValue, new_value: diff.newValue };
    }
  }
  if (result.nets.length === 0) {
    throw new CompareError(`no net is present in both ${base.source} and ${next.source}, so there is nothing to compare`);
  }
  return result;
}
