// Running one measurement for the viewer: the engine's result for the panel's figures (the same
// calls `midrail delay`, `skew`, `glitches` and `check` make, so the numbers match the CLI), plus
// every item as typed arrays for the canvas and the table, each flagged against the limits.
// Pure: runs in the measuring worker, and in unit tests on an iverilog dump.

import type { Dump } from '../../model/dump';
import { type NetRef, resolveNet, resolveNetList } from '../../model/netref';
import { parseTime } from '../../model/units';
import {
  type DelayResult,
  type GlitchResult,
  type SkewResult,
  EdgeDir,
  glitchOrder,
  glitchResult,
  measureDelay,
  measureSkew,
  pairListOf,
  scanGlitches,
  secondsOf,
  secondsToTicks,
  ticksToSeconds,
} from '../../measure/index';
import { parseLevel } from '../../measure/level';
import { LevelMap } from '../../plan/levels';
import { runPlan } from '../../plan/run';
import { PLAN_FORMAT, PLAN_VERSION, type DelaySpec, type MeasurementSpec, type Plan, type SkewSpec } from '../../plan/types';
import { emptyItems, flagItems, limitValues } from './limitcheck';
import { type DelayView, GLITCH_KINDS, type GlitchView, type NetPick, SKEW_KINDS, type SkewView, type VerdictView, type WidthChoice } from './types';

export function pickOf(ref: NetRef): NetPick {
  return { label: ref.label, signal: ref.net.signal, bit: ref.bit };
}

function planOf(spec: MeasurementSpec, levels: Record<string, string> | undefined): Plan {
  const plan: Plan = { format: PLAN_FORMAT, version: PLAN_VERSION, measurements: [spec] };
  if (levels && Object.keys(levels).length > 0) plan.levels = levels;
  return plan;
}

/** The verdict `midrail check` gives this measurement (only when it has limits, or has no drawing of its own). */
function verdictOf(dump: Dump, spec: MeasurementSpec, levels: Record<string, string> | undefined) {
  return runPlan(dump, planOf(spec, levels))[0];
}

function hasLimits(spec: MeasurementSpec): boolean {
  return spec.min !== undefined || spec.max !== undefined;
}

const windowOf = (text: string | undefined) => (text === undefined ? undefined : parseTime(text));

export interface DelayRun {
  view: DelayView;
  result: DelayResult;
}

export function delayRun(dump: Dump, spec: DelaySpec, levels?: Record<string, string>): DelayRun {
  const map = new LevelMap(dump, planOf(spec, levels), []);
  const from = resolveNet(dump, spec.from);
  const to = resolveNet(dump, spec.to);
  const fromLevel = map.of(from, spec.level);
  const toLevel = map.of(to, spec.level);
  const windowS = windowOf(spec.window);
  // One measurement gives both the figures and the typed pair lists the canvas draws from.
  const result = measureDelay(dump, { from, to, fromLevel, toLevel, windowS, keepLists: true });
  const { from: fl, to: tl, pairs } = pairListOf(result)!;
  const ts = dump.timescale;
  const items = emptyItems(pairs.count);
  const fromDir = new Uint8Array(pairs.count);
  // Kind from the output edge, as the engine names it: rise tPLH, fall tPHL, a vector or event output tPD.
  const anyChange = tl.source !== 'logic' && tl.source !== 'real';
  let p = 0;
  for (let j = 0; j < tl.count; j++) {
    const fi = pairs.fromOf[j];
    if (fi < 0) continue; // unpaired (reason −1 − fi)
    const a = fl.ticks[fi];
    const b = tl.ticks[j];
    const d = tl.dir[j];
    items.start[p] = a;
    items.end[p] = b;
    items.time[p] = ticksToSeconds(ts, b);
    items.value[p] = ticksToSeconds(ts, b - a);
    items.kind[p] = anyChange || d === EdgeDir.Change ? 2 : d === EdgeDir.Rise ? 0 : 1;
    fromDir[p] = fl.dir[fi];
    p++;
  }
  const edge = spec.edge ?? 'any';
  const wanted = edge === 'rise' ? 0 : edge === 'fall' ? 1 : -1;
  const limits = limitValues(spec);
  const { judged, violations } = flagItems(items, limits, (i) => wanted < 0 || items.kind[i] === wanted);
  const r = result;
  const view: DelayView = {
    kind: 'delay',
    id: spec.id,
    from: pickOf(from),
    to: pickOf(to),
    figures: {
      level: spec.level ?? fromLevel?.text ?? r.level,
      window_s: r.window_s,
      unpaired: r.unpaired,
      tPLH: r.tPLH,
      tPHL: r.tPHL,
      tPD: r.tPD,
      tpd_s: r.tpd_s,
      tskp_s: r.tskp_s,
      tskp_worst_s: r.tskp_worst_s,
      fmax_hz: r.fmax_hz,
      caution: r.caution,
      unknown_spans: r.unknown_spans.length,
    },
    fromDir,
    limits,
    judged,
    violations,
    outcome: hasLimits(spec) ? verdictOf(dump, spec, levels) : null,
    items,
  };
  return { view, result };
}

export interface SkewRun {
  view: SkewView;
  result: SkewResult;
}

export function skewRun(dump: Dump, spec: SkewSpec, levels?: Record<string, string>): SkewRun {
  const map = new LevelMap(dump, planOf(spec, levels), []);
  const nets = resolveNetList(dump, Array.isArray(spec.nets) ? spec.nets.join(',') : spec.nets);
  const ref = spec.ref === undefined ? undefined : resolveNet(dump, spec.ref);
  const level = map.common(nets, spec.level);
  const result = measureSkew(dump, { nets, edge: spec.edge, windowS: windowOf(spec.window), ref, level });
  const ts = dump.timescale;
  const n = result.events.length;
  const items = emptyItems(n);
  const edges = new Int32Array(n);
  const earliest = new Int32Array(n);
  const latest = new Int32Array(n);
  const index = new Map(nets.map((r, i) => [r.label, i]));
  result.events.forEach((e, i) => {
    items.start[i] = secondsToTicks(ts, e.time_s);
    items.end[i] = secondsToTicks(ts, e.time_s + e.skew_s);
    items.time[i] = e.time_s;
    items.value[i] = e.skew_s;
    items.kind[i] = SKEW_KINDS.indexOf(e.edge);
    edges[i] = e.edges;
    earliest[i] = index.get(e.earliest) ?? -1;
    latest[i] = index.get(e.latest) ?? -1;
  });
  const limits = limitValues(spec);
  const { judged, violations } = flagItems(items, limits, () => true);
  const view: SkewView = {
    kind: 'skew',
    id: spec.id,
    nets: nets.map(pickOf),
    figures: {
      edge: result.edge,
      window_s: result.window_s,
      window_source: result.window_source,
      ref: result.ref,
      max_skew_s: result.max_skew_s,
      mean_skew_s: result.mean_skew_s,
      offsets: result.offsets,
      unknown_spans: result.unknown_spans.length,
    },
    edges,
    earliest,
    latest,
    limits,
    judged,
    violations,
    outcome: hasLimits(spec) ? verdictOf(dump, spec, levels) : null,
    items,
  };
  return { view, result };
}

/** A plan measurement the viewer only shows a verdict for. */
export function verdictRun(dump: Dump, spec: MeasurementSpec, levels?: Record<string, string>): VerdictView {
  return { kind: 'verdict', id: spec.id, outcome: verdictOf(dump, spec, levels) };
}

export interface GlitchRun {
  view: GlitchView;
  result: GlitchResult;
}

/** Glitches narrower than `width` on every loaded net and bit (the engine's default targets). */
export function glitchRun(dump: Dump, width: WidthChoice, level?: string): GlitchRun {
  const began = typeof performance !== 'undefined' ? performance.now() : Date.now();
  const opts = { maxWidthS: width.seconds, level: level === undefined ? undefined : parseLevel(level) };
  const scan = scanGlitches(dump, opts);
  // Items straight from the search's typed arrays, in the records' order (time, then net name);
  // the records themselves are built only if a sheet asks for them.
  const result = glitchResult(dump, scan, opts);
  const { targets, sink } = scan;
  const order = glitchOrder(scan);
  const seconds = secondsOf(dump.timescale);
  const n = order.length;
  const items = emptyItems(n);
  const target = new Int32Array(n);
  const found = sink.flat();
  for (let i = 0; i < n; i++) {
    const g = order[i];
    const a = found.tick[g];
    const w = found.width[g];
    items.start[i] = a;
    items.end[i] = a + w;
    items.time[i] = seconds(a);
    items.value[i] = seconds(w);
    items.kind[i] = found.polarity[g];
    items.flags[i] = 1;
    target[i] = found.target[g];
  }
  // Glitch indices grouped by target, each group in time order (a counting sort keeps the order).
  const targetStart = new Int32Array(targets.length + 1);
  for (let i = 0; i < n; i++) targetStart[target[i] + 1]++;
  for (let t = 0; t < targets.length; t++) targetStart[t + 1] += targetStart[t];
  const fill = targetStart.slice(0, targets.length);
  const byTarget = new Int32Array(targetStart[targets.length]);
  for (let i = 0; i < n; i++) byTarget[fill[target[i]]++] = i;
  const startByTarget = new Float64Array(byTarget.length);
  const endByTarget = new Float64Array(byTarget.length);
  for (let j = 0; j < byTarget.length; j++) {
    startByTarget[j] = items.start[byTarget[j]];
    endByTarget[j] = items.end[byTarget[j]];
  }
  const view: GlitchView = {
    kind: 'glitch-scan',
    width,
    targets: targets.map(pickOf),
    paths: targets.map((t) => t.net.path),
    target,
    items,
    targetStart,
    byTarget,
    startByTarget,
    endByTarget,
    elapsedMs: (typeof performance !== 'undefined' ? performance.now() : Date.now()) - began,
  };
  return { view, result };
}
