// The worst-case sheet: rows gathered from many measurements (a net pair or group, the edge, the
// value, the limits and the margin), as tab-separated text for the clipboard and as report sheets
// for the same .xlsx/CSV writers the CLI uses. Pure.

import { neutralizeText } from '../../report/inject';
import type { Cell, MeasurementSheet, SummaryRow } from '../../report/sheet';
import { PAIR_KINDS } from '../../measure/index';
import { marginOf } from './limitcheck';
import { EDGE_WORDS, GLITCH_KINDS, type Items, type LimitValues, SKEW_KINDS } from './types';

export type RowKind = 'delay' | 'skew' | 'glitch';

export interface WorstRow {
  /** Id of the measurement the row came from. */
  measurement: string;
  kind: RowKind;
  /** `from → to` for a delay, the group for a skew, the net for a glitch. */
  nets: string;
  /** tPLH / tPHL / tPD with the edges, a skew event's edge, a glitch's polarity. */
  edge: string;
  /** When: the effect edge of a pair, the first edge of an event, the start of a glitch (s). */
  time_s: number;
  /** Delay, skew or glitch width (s). */
  value_s: number;
  limit_min_s: number | null;
  limit_max_s: number | null;
  margin_s: number | null;
  /** What the canvas jumps to (s). */
  start_s: number;
  end_s: number;
}

export const ROW_KEYS = ['measurement', 'kind', 'nets', 'edge', 'time_s', 'value_s', 'limit_min_s', 'limit_max_s', 'margin_s', 'start_s', 'end_s'] as const;
/** Columns shown and copied, in order. */
export const SHEET_COLUMNS = ['measurement', 'nets', 'edge', 'time_s', 'value_s', 'limit_min_s', 'limit_max_s', 'margin_s'] as const;
/** The same in exports, where the report writers' own `measurement` column names the sheet. */
export const EXPORT_COLUMNS = ['measurement_id', ...SHEET_COLUMNS.slice(1)];

export interface RowSource {
  id: string;
  kind: RowKind;
  items: Items;
  limits: LimitValues;
  /** Text of the nets column for item i. */
  nets: (i: number) => string;
  /** Delay pairs: the cause edge direction of each pair. */
  fromDir?: Uint8Array;
  tickSeconds: number;
}

function edgeText(src: RowSource, i: number): string {
  const k = src.items.kind[i];
  if (src.kind === 'delay') {
    const name = PAIR_KINDS[k];
    const to = k === 0 ? 'rise' : k === 1 ? 'fall' : 'change';
    const from = src.fromDir ? EDGE_WORDS[src.fromDir[i]] : '?';
    return `${name} (${from} → ${to})`;
  }
  if (src.kind === 'skew') return SKEW_KINDS[k] ?? '?';
  return GLITCH_KINDS[k] ?? '?';
}

/** One sheet row for item i of a measurement. */
export function rowOf(src: RowSource, i: number): WorstRow {
  const it = src.items;
  const count = src.limits.unit === 'count';
  return {
    measurement: src.id,
    kind: src.kind,
    nets: src.nets(i),
    edge: edgeText(src, i),
    time_s: it.time[i],
    value_s: it.value[i],
    limit_min_s: count ? null : src.limits.min,
    limit_max_s: count ? null : src.limits.max,
    margin_s: count ? null : marginOf(it.value[i], src.limits),
    start_s: it.start[i] * src.tickSeconds,
    end_s: it.end[i] * src.tickSeconds,
  };
}

/**
 * The `n` worst items: smallest margin when limits are set, else the largest value (the narrowest
 * glitch for glitches); ties keep time order. Only items that count toward the limits.
 */
export function worstItems(src: RowSource, n: number): number[] {
  const it = src.items;
  const limited = !(src.limits.min === null && src.limits.max === null) && src.limits.unit !== 'count';
  const bad = (i: number) => (limited ? -(marginOf(it.value[i], src.limits) as number) : src.kind === 'glitch' ? -it.value[i] : it.value[i]);
  const kept: Array<{ i: number; b: number }> = [];
  for (let i = 0; i < it.count; i++) {
    if (!(it.flags[i] & 1)) continue;
    const b = bad(i);
    if (kept.length < n || b > kept[kept.length - 1].b) {
      let at = kept.length;
      while (at > 0 && kept[at - 1].b < b) at--;
      kept.splice(at, 0, { i, b });
      if (kept.length > n) kept.pop();
    }
  }
  return kept.map((k) => k.i);
}

/** A text cell for tab-separated text: no tabs or line breaks inside, and the formula guard. */
function tsvText(s: string): string {
  return neutralizeText(s.replace(/[\t\r\n]+/g, ' '));
}

function tsvCell(v: string | number | null): string {
  if (v === null) return '';
  if (typeof v === 'number') return Number.isFinite(v) ? String(v) : '';
  return tsvText(v);
}

/** Header and rows as tab-separated text, numbers in seconds as plain numbers. */
export function rowsToTsv(rows: WorstRow[]): string {
  const lines = [SHEET_COLUMNS.join('\t')];
  for (const r of rows) lines.push(SHEET_COLUMNS.map((c) => tsvCell(r[c])).join('\t'));
  return lines.join('\r\n') + '\r\n';
}

const SHEET_OF: Record<RowKind, { title: string; measurement: MeasurementSheet['measurement'] }> = {
  delay: { title: 'worst delay pairs', measurement: 'delay' },
  skew: { title: 'worst skew events', measurement: 'skew' },
  glitch: { title: 'worst glitches', measurement: 'glitches' },
};

/**
 * The gathered rows as report sheets, one per kind of measurement (the report writers give each
 * its own sheet, add the summary and provenance sheets and apply the formula-injection guard).
 * Summary rows: per measurement, the rows gathered and their smallest, largest and mean value.
 */
export function worstSheets(rows: WorstRow[]): MeasurementSheet[] {
  const out: MeasurementSheet[] = [];
  for (const kind of ['delay', 'skew', 'glitch'] as const) {
    const mine = rows.filter((r) => r.kind === kind);
    if (mine.length === 0) continue;
    const summary: SummaryRow[] = [];
    for (const id of [...new Set(mine.map((r) => r.measurement))]) {
      const v = mine.filter((r) => r.measurement === id);
      const values = v.map((r) => r.value_s);
      const margins = v.map((r) => r.margin_s).filter((m): m is number => m !== null);
      summary.push({
        item: id,
        count: v.length,
        min_s: Math.min(...values),
        max_s: Math.max(...values),
        mean_s: values.reduce((a, b) => a + b, 0) / values.length,
        value: margins.length > 0 ? Math.min(...margins) : null,
        unit: margins.length > 0 ? 's' : undefined,
        note: margins.length > 0 ? 'value = smallest margin of the rows gathered' : 'rows gathered in the viewer',
      });
    }
    out.push({
      title: SHEET_OF[kind].title,
      measurement: SHEET_OF[kind].measurement,
      columns: ['row', ...EXPORT_COLUMNS],
      rows: mine.map((r): Cell[] => ['worst', ...SHEET_COLUMNS.map((c) => r[c])]),
      summary,
      settings: [['rows', mine.length]],
    });
  }
  return out;
}
