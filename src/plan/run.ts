// Running a plan on one dump: every measurement through the measurement engine, each item held
// against the limits. A measurement whose nets are missing from this dump is an error naming the
// JSON path of the field; the other measurements still run.

import type { Dump } from '../model/dump';
import { type NetRef, resolveNet, resolveNetList } from '../model/netref';
import { parseTime } from '../model/units';
import { type EdgeList, type LevelSpec, TIMING_CAUTION, edgeList, findGlitches, measureDelay, measureSkew } from '../measure/index';
import { type Verdict, hasLimits, judge, tidy } from './evaluate';
import { formatValue } from './format';
import { LevelMap } from './levels';
import { type Limits, limitsOf } from './limits';
import { type TimedValues, cycleFigures, pulseDurations } from './pulses';
import type { MeasurementOutcome, WorstItem } from './result';
import { WORST_KEPT } from './result';
import type { PathIssue } from './schemaCheck';
import type { DelaySpec, GlitchSpec, MeasurementSpec, PeriodSpec, Plan, PulseWidthSpec, SkewSpec } from './types';

/** An error that belongs to one field of the plan. */
class FieldError extends Error {
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(message);
  }
}

function net(dump: Dump, name: string, field: string): NetRef {
  try {
    return resolveNet(dump, name);
  } catch (err) {
    throw new FieldError(field, (err as Error).message);
  }
}

function netList(dump: Dump, names: string | string[], field: string): NetRef[] {
  try {
    return resolveNetList(dump, Array.isArray(names) ? names.join(',') : names);
  } catch (err) {
    throw new FieldError(field, (err as Error).message);
  }
}

function oneBit(dump: Dump, ref: NetRef, field: string): NetRef {
  const kind = dump.signals[ref.net.signal].kind;
  if (ref.bit === null && kind !== 'logic' && kind !== 'real') {
    throw new FieldError(field, `net '${ref.label}' is a ${kind} of width ${ref.net.width}; name one bit, such as ${ref.label}[${ref.net.lsb}]`);
  }
  return ref;
}

function limitText(l: Limits): string {
  if (l.minText !== null && l.maxText !== null) return `limits ${l.minText} to ${l.maxText}`;
  return l.maxText !== null ? `max ${l.maxText}` : `min ${l.minText}`;
}

function at(v: number): string {
  return formatValue(v, 's');
}

interface Measured {
  verdict: Verdict;
  /** Plural noun for the items: `pairs`, `events`, `pulses`, `cycles`. */
  noun: string;
  details: Record<string, unknown>;
}

function message(m: Measured, l: Limits): { status: 'pass' | 'fail'; text: string } {
  const v = m.verdict;
  const f = (x: number) => formatValue(x, l.unit);
  const w = v.worst;
  if (!hasLimits(l)) {
    if (!w) return { status: 'pass', text: `no ${m.noun} found; no limits set` };
    return { status: 'pass', text: `${v.count} ${m.noun}; worst ${l.quantity} ${f(w.value)} at ${at(w.time_s)} (${w.what}); no limits set` };
  }
  if (!w) return { status: 'fail', text: `no ${m.noun} found, so the ${l.quantity} ${limitText(l)} could not be checked` };
  const margin = v.margin as number;
  if (l.unit === 'count') {
    const found = `${v.count} ${v.count === 1 ? m.noun.replace(/es$/, '') : m.noun}`;
    const first = v.count > 0 ? `; first at ${at(w.time_s)}: ${w.what}` : '';
    return { status: margin < 0 ? 'fail' : 'pass', text: `${found} (${limitText(l)}): margin ${margin}${first}` };
  }
  if (v.violations > 0) {
    return {
      status: 'fail',
      text: `${l.quantity} ${f(w.value)} at ${at(w.time_s)} (${w.what}) breaks ${limitText(l)}: margin ${f(margin)}; ${v.violations} of ${v.count} ${m.noun} violate`,
    };
  }
  return { status: 'pass', text: `worst ${l.quantity} ${f(w.value)} at ${at(w.time_s)} (${w.what}): margin ${f(margin)} to ${limitText(l)}; ${v.count} ${m.noun}` };
}

function runDelay(dump: Dump, s: DelaySpec, levels: LevelMap): Measured {
  const from = net(dump, s.from, 'from');
  const to = net(dump, s.to, 'to');
  const r = measureDelay(dump, {
    from,
    to,
    fromLevel: levels.of(from, s.level),
    toLevel: levels.of(to, s.level),
    windowS: s.window === undefined ? undefined : parseTime(s.window),
  });
  const edge = s.edge ?? 'any';
  const wanted = edge === 'rise' ? 'tPLH' : edge === 'fall' ? 'tPHL' : null;
  const pairs = wanted === null ? r.pairs : r.pairs.filter((p) => p.kind === wanted);
  const items = {
    time_s: pairs.map((p) => p.to_time_s),
    value: pairs.map((p) => p.delay_s),
    describe: (i: number) => {
      const p = pairs[i];
      return `${p.kind} ${r.from} ${p.from_edge} at ${at(p.from_time_s)} → ${r.to} ${p.to_edge}`;
    },
  };
  return {
    verdict: judge(items, limitsOf(s)),
    noun: wanted ? `${wanted} pairs` : 'pairs',
    details: {
      from: r.from,
      to: r.to,
      level: r.level,
      window_s: r.window_s,
      unpaired: r.unpaired,
      tPLH: r.tPLH,
      tPHL: r.tPHL,
      tPD: r.tPD,
      tpd_s: r.tpd_s,
      tskp_s: r.tskp_s,
      fmax_hz: r.fmax_hz,
      unknown_spans: r.unknown_spans.length,
      caution: TIMING_CAUTION,
    },
  };
}

function runSkew(dump: Dump, s: SkewSpec, levels: LevelMap): Measured {
  const nets = netList(dump, s.nets, 'nets');
  const ref = s.ref === undefined ? undefined : net(dump, s.ref, 'ref');
  let level;
  try {
    level = levels.common(nets, s.level);
  } catch (err) {
    throw new FieldError('nets', (err as Error).message);
  }
  let r;
  try {
    r = measureSkew(dump, { nets, edge: s.edge, windowS: s.window === undefined ? undefined : parseTime(s.window), ref, level });
  } catch (err) {
    throw new FieldError(s.ref !== undefined ? 'ref' : 'nets', (err as Error).message);
  }
  const items = {
    time_s: r.events.map((e) => e.time_s),
    value: r.events.map((e) => e.skew_s),
    describe: (i: number) => {
      const e = r.events[i];
      return `${e.edge}, ${e.edges} edges, ${e.earliest} first, ${e.latest} last`;
    },
  };
  return {
    verdict: judge(items, limitsOf(s)),
    noun: 'events',
    details: { nets: r.nets, edge: r.edge, window_s: r.window_s, window_source: r.window_source, ref: r.ref, max_skew_s: r.max_skew_s, mean_skew_s: r.mean_skew_s, offsets: r.offsets, unknown_spans: r.unknown_spans.length },
  };
}

/** A glitch measurement limits the number found; its worst items are the first glitches in time. */
function runGlitch(dump: Dump, s: GlitchSpec, levels: LevelMap): Measured {
  const nets = s.nets === undefined ? undefined : netList(dump, s.nets, 'nets');
  let level;
  try {
    level = levels.common(nets ?? [], s.level);
  } catch (err) {
    throw new FieldError('nets', (err as Error).message);
  }
  const r = findGlitches(dump, { maxWidthS: parseTime(s.max_width), nets, level });
  const lim = limitsOf(s);
  const first = r.glitches[0];
  const margin = hasLimits(lim) ? Math.min(lim.max === null ? Infinity : lim.max - r.count, lim.min === null ? Infinity : r.count - lim.min) : null;
  const worstItems: WorstItem[] = r.glitches.slice(0, WORST_KEPT).map((g) => ({ time_s: g.start_s, value: g.width_s, margin: null, what: `${g.polarity} glitch on ${g.net}, ${at(g.width_s)} wide` }));
  const byPolarity: Record<string, number> = {};
  for (const g of r.glitches) byPolarity[g.polarity] = (byPolarity[g.polarity] ?? 0) + 1;
  return {
    verdict: {
      count: r.count,
      violations: margin !== null && margin < 0 ? r.count : 0,
      min: r.count,
      max: r.count,
      mean: r.count,
      worst: { time_s: first?.start_s ?? 0, value: r.count, what: first ? `${first.polarity} glitch on ${first.net}, ${at(first.width_s)} wide` : 'none found' },
      margin,
      worstItems,
    },
    noun: 'glitches',
    details: { max_width_s: r.max_width_s, nets: r.nets, by_polarity: byPolarity, first_s: first?.start_s ?? null, unknown_spans: r.unknown_spans.length },
  };
}

/** Edge lists of one dump by net and level, so several period and pulse measurements of one clock find its edges once. */
const edgeCache = new WeakMap<Dump, Map<string, EdgeList>>();

function edgesOf(dump: Dump, ref: NetRef, level: LevelSpec | undefined): EdgeList {
  let cache = edgeCache.get(dump);
  if (!cache) edgeCache.set(dump, (cache = new Map()));
  const key = `${ref.label}\u0000${level?.text ?? ''}`;
  let list = cache.get(key);
  if (!list) cache.set(key, (list = edgeList(dump, ref, { level })));
  return list;
}

function runPulseWidth(dump: Dump, s: PulseWidthSpec, levels: LevelMap): Measured {
  const ref = oneBit(dump, net(dump, s.net, 'net'), 'net');
  const polarity = s.polarity ?? 'high';
  const list = edgesOf(dump, ref, levels.of(ref, s.level));
  const items = { ...pulseDurations(list, dump.timescale, polarity), describe: () => `${polarity} pulse on ${ref.label}` };
  return { verdict: judge(items, limitsOf(s), true), noun: `${polarity} pulses`, details: { net: ref.label, polarity, unknown_spans: list.unknown.length / 2 } };
}

function stats(t: TimedValues): { count: number; min: number | null; max: number | null; mean: number | null } {
  const n = t.value.length;
  if (n === 0) return { count: 0, min: null, max: null, mean: null };
  let min = Infinity;
  let max = -Infinity;
  let sum = 0;
  for (const v of t.value) {
    min = Math.min(min, v);
    max = Math.max(max, v);
    sum += v;
  }
  return { count: n, min, max, mean: tidy(sum / n) };
}

function runPeriod(dump: Dump, s: PeriodSpec, levels: LevelMap): Measured {
  const ref = oneBit(dump, net(dump, s.net, 'net'), 'net');
  const edge = s.edge ?? 'rise';
  const list = edgesOf(dump, ref, levels.of(ref, s.level));
  const c = cycleFigures(list, dump.timescale, edge);
  const quantity = s.quantity ?? 'period';
  const noun = quantity === 'jitter' ? 'adjacent cycle pairs' : 'cycles';
  const items = { ...c[quantity], describe: () => `${edge}-to-${edge} cycle of ${ref.label}` };
  return {
    verdict: judge(items, limitsOf(s)),
    noun,
    details: {
      net: ref.label,
      edge,
      period_s: stats(c.period),
      frequency_hz: stats(c.frequency),
      duty_percent: stats(c.duty),
      jitter_s: stats(c.jitter),
      unknown_spans: list.unknown.length / 2,
    },
  };
}

function measure(dump: Dump, s: MeasurementSpec, levels: LevelMap): Measured {
  switch (s.kind) {
    case 'delay':
      return runDelay(dump, s, levels);
    case 'skew':
      return runSkew(dump, s, levels);
    case 'glitch':
      return runGlitch(dump, s, levels);
    case 'pulse-width':
      return runPulseWidth(dump, s, levels);
    case 'period':
      return runPeriod(dump, s, levels);
  }
}

function blank(s: MeasurementSpec, l: Limits): MeasurementOutcome {
  return {
    id: s.id,
    kind: s.kind,
    quantity: l.quantity,
    unit: l.unit,
    status: 'error',
    message: '',
    limit_min: l.min,
    limit_max: l.max,
    count: 0,
    violations: 0,
    min: null,
    max: null,
    mean: null,
    worst: null,
    worst_time_s: null,
    margin: null,
    worst_items: [],
    details: {},
    elapsed_s: 0,
  };
}

const clock = () => (typeof performance !== 'undefined' ? performance.now() : Date.now());

/** Runs one measurement of the plan; errors become an `error` outcome naming the field's JSON path. */
export function runMeasurement(dump: Dump, plan: Plan, index: number, levels: LevelMap, levelIssues: PathIssue[] = []): MeasurementOutcome {
  const spec = plan.measurements[index];
  const lim = limitsOf(spec);
  const out = blank(spec, lim);
  const start = clock();
  const base = `$.measurements[${index}]`;
  try {
    const m = measure(dump, spec, levels);
    const v = m.verdict;
    const verdict = message(m, lim);
    Object.assign(out, {
      status: verdict.status,
      message: verdict.text,
      count: v.count,
      violations: v.violations,
      min: v.min,
      max: v.max,
      mean: v.mean,
      worst: v.worst ? v.worst.value : null,
      worst_time_s: v.worst && v.count > 0 ? v.worst.time_s : null,
      margin: v.margin,
      worst_items: v.worstItems,
      details: m.details,
    });
  } catch (err) {
    const path = err instanceof FieldError ? `${base}.${err.field}` : base;
    out.message = `${path}: ${(err as Error).message}`;
  }
  // A `levels` key that matches no net in this dump is reported on every measurement's verdict line.
  if (levelIssues.length > 0 && out.status !== 'error') {
    out.status = 'error';
    out.message = levelIssues.map((i) => `${i.path}: ${i.message}`).join('; ');
  }
  out.elapsed_s = (clock() - start) / 1000;
  return out;
}

/** Every measurement of the plan on one dump, in plan order. */
export function runPlan(dump: Dump, plan: Plan): MeasurementOutcome[] {
  const issues: PathIssue[] = [];
  const levels = new LevelMap(dump, plan, issues);
  return plan.measurements.map((_, i) => runMeasurement(dump, plan, i, levels, issues));
}
