// The worst-case sheet: any set of measurements as tables, one row per edge pair, skew event, glitch
// or edge, worst first, plus summary rows per measurement. Cells are numbers (seconds, Hz), text or
// empty; the header names carry the unit (`_s` = seconds, `_hz` = hertz).

import type { DelayResult, DelayStats, EdgeResult, GlitchResult, SkewResult } from '../measure/types';

export type Cell = string | number | null;

export interface SummaryRow {
  /** What the row summarises: tPLH, tPHL, tpd, fmax, skew, glitches, ... */
  item: string;
  count?: number | null;
  min_s?: number | null;
  max_s?: number | null;
  mean_s?: number | null;
  std_s?: number | null;
  worst_time_s?: number | null;
  value?: Cell;
  unit?: string;
  note?: string;
}

export const SUMMARY_KEYS = ['item', 'count', 'min_s', 'max_s', 'mean_s', 'std_s', 'worst_time_s', 'value', 'unit', 'note'] as const;

export interface MeasurementSheet {
  /** e.g. `delay top.a → top.y`; shown as the sheet's title and in the CSV's measurement column. */
  title: string;
  measurement: 'delay' | 'skew' | 'glitches' | 'edges';
  /** Column names of `rows`; the first is always `row` (pair, event, glitch, edge). */
  columns: string[];
  rows: Cell[][];
  summary: SummaryRow[];
  /** Settings that produced the numbers (levels, windows), for the provenance sheet. */
  settings: Array<[string, Cell]>;
}

function statsRow(item: string, s: DelayStats): SummaryRow {
  return { item, count: s.count, min_s: s.min_s, max_s: s.max_s, mean_s: s.mean_s, std_s: s.std_s, worst_time_s: s.worst_time_s };
}

export function delaySheet(r: DelayResult): MeasurementSheet {
  const pairs = [...r.pairs].sort((a, b) => b.delay_s - a.delay_s || a.to_time_s - b.to_time_s);
  return {
    title: `delay ${r.from} → ${r.to}`,
    measurement: 'delay',
    columns: ['row', 'kind', 'from', 'from_edge', 'from_time_s', 'to', 'to_edge', 'to_time_s', 'delay_s'],
    rows: pairs.map((p) => ['pair', p.kind, r.from, p.from_edge, p.from_time_s, r.to, p.to_edge, p.to_time_s, p.delay_s]),
    summary: [
      statsRow('tPLH', r.tPLH),
      statsRow('tPHL', r.tPHL),
      statsRow('tPD', r.tPD),
      { item: 'tpd', value: r.tpd_s, unit: 's', note: 'max(tPLH max, tPHL max, tPD max)' },
      { item: 'tsk(p)', value: r.tskp_s, unit: 's', note: '|mean tPHL − mean tPLH|' },
      { item: 'tsk(p) worst', value: r.tskp_worst_s, unit: 's', note: '|max tPHL − max tPLH|' },
      { item: 'fmax', value: r.fmax_hz, unit: 'Hz', note: `1/tpd. ${r.caution}` },
      { item: 'unpaired', count: r.unpaired },
      { item: 'unknown spans', count: r.unknown_spans.length },
    ],
    settings: [
      ['from', r.from],
      ['to', r.to],
      ['level', r.level],
      ['window_s', r.window_s],
    ],
  };
}

export function skewSheet(r: SkewResult): MeasurementSheet {
  const events = [...r.events].sort((a, b) => b.skew_s - a.skew_s || a.time_s - b.time_s);
  return {
    title: `skew ${r.nets.length} nets`,
    measurement: 'skew',
    columns: ['row', 'edge', 'time_s', 'skew_s', 'edges', 'earliest', 'latest'],
    rows: events.map((e) => ['event', e.edge, e.time_s, e.skew_s, e.edges, e.earliest, e.latest]),
    summary: [
      { item: 'skew', count: r.events.length, max_s: r.max_skew_s, mean_s: r.mean_skew_s },
      ...r.offsets.map((o): SummaryRow => ({ item: 'mean offset', count: o.events, mean_s: o.mean_offset_s, note: `${o.net} from ${r.ref}` })),
      { item: 'unknown spans', count: r.unknown_spans.length },
    ],
    settings: [
      ['nets', r.nets.join(',')],
      ['edge', r.edge],
      ['window_s', r.window_s],
      ['window from', r.window_source],
      ['reference net', r.ref],
    ],
  };
}

export function glitchSheet(r: GlitchResult): MeasurementSheet {
  const glitches = [...r.glitches].sort((a, b) => a.width_s - b.width_s || a.start_s - b.start_s);
  const byPolarity = new Map<string, number>();
  for (const g of r.glitches) byPolarity.set(g.polarity, (byPolarity.get(g.polarity) ?? 0) + 1);
  return {
    title: `glitches < ${r.max_width_s} s`,
    measurement: 'glitches',
    columns: ['row', 'net', 'start_s', 'width_s', 'polarity'],
    rows: glitches.map((g) => ['glitch', g.net, g.start_s, g.width_s, g.polarity]),
    summary: [
      { item: 'glitches', count: r.count, min_s: glitches.length > 0 ? glitches[0].width_s : null },
      ...[...byPolarity].map(([p, n]): SummaryRow => ({ item: `glitches ${p}`, count: n })),
      { item: 'nets searched', count: r.nets },
      { item: 'unknown spans', count: r.unknown_spans.length },
    ],
    settings: [['max_width_s', r.max_width_s]],
  };
}

export function edgesSheet(r: EdgeResult): MeasurementSheet {
  const real = r.low !== undefined;
  const transitions = r.edges.map((e) => e.transition_s).filter((x): x is number => typeof x === 'number');
  const summary: SummaryRow[] = [
    { item: 'rise', count: r.edges.filter((e) => e.edge === 'rise').length },
    { item: 'fall', count: r.edges.filter((e) => e.edge === 'fall').length },
    { item: 'change', count: r.edges.filter((e) => e.edge === 'change').length },
  ];
  if (transitions.length > 0) {
    summary.push({
      item: 'transition 10–90 %',
      count: transitions.length,
      min_s: Math.min(...transitions),
      max_s: Math.max(...transitions),
      mean_s: transitions.reduce((a, b) => a + b, 0) / transitions.length,
    });
  }
  if (r.runts) summary.push({ item: 'runts', count: r.runts.length });
  summary.push({ item: 'zero-width glitches', count: r.zero_width_s.length }, { item: 'unknown spans', count: r.unknown_spans.length });
  const settings: Array<[string, Cell]> = [
    ['net', r.net],
    ['level', r.level],
  ];
  if (real) settings.push(['low state', r.low!], ['high state', r.high!], ['state method', r.state_method!], ['reference value', r.reference_value!]);
  return {
    title: `edges ${r.net}`,
    measurement: 'edges',
    columns: real ? ['row', 'net', 'time_s', 'edge', 'transition_s'] : ['row', 'net', 'time_s', 'edge'],
    rows: r.edges.map((e) => (real ? ['edge', r.net, e.time_s, e.edge, e.transition_s ?? null] : ['edge', r.net, e.time_s, e.edge])),
    summary,
    settings,
  };
}
