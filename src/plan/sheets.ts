// A check result as tables for .xlsx and CSV: a summary with one row per dump × measurement
// (worst value, limits, margin, verdict), one table per measurement with the worst items of every
// dump, and the provenance (each dump's name, size and SHA-256, the plan's SHA-256, tool version).
// Values are numbers in their unit (seconds, Hz, %, count), named in a `unit` column.

import type { Cell } from '../report/index';
import type { CheckDocument } from './result';

export interface Table {
  /** Sheet or file name before sanitising: `Summary`, a measurement id, `Provenance`. */
  name: string;
  columns: string[];
  rows: Cell[][];
}

const SUMMARY_COLUMNS = [
  'dump',
  'measurement',
  'kind',
  'quantity',
  'status',
  'worst',
  'unit',
  'worst_time_s',
  'limit_min',
  'limit_max',
  'margin',
  'count',
  'violations',
  'min',
  'max',
  'mean',
  'message',
];

export function summaryTable(doc: CheckDocument): Table {
  const rows: Cell[][] = [];
  for (const d of doc.dumps) {
    if (d.error !== null) {
      rows.push([d.file, null, null, null, 'error', null, null, null, null, null, null, null, null, null, null, null, d.error]);
      continue;
    }
    for (const m of d.measurements) {
      rows.push([d.file, m.id, m.kind, m.quantity, m.status, m.worst, m.unit, m.worst_time_s, m.limit_min, m.limit_max, m.margin, m.count, m.violations, m.min, m.max, m.mean, m.message]);
    }
  }
  return { name: 'Summary', columns: SUMMARY_COLUMNS, rows };
}

/** One table per measurement of the plan: each dump's worst items, worst first. */
export function worstTables(doc: CheckDocument): Table[] {
  return doc.plan.measurements.map((pm) => {
    const rows: Cell[][] = [];
    for (const d of doc.dumps) {
      const m = d.measurements.find((x) => x.id === pm.id);
      if (!m) continue;
      // A glitch measurement limits a count; its items are glitches whose value is a width in seconds.
      const unit = m.kind === 'glitch' ? 's' : m.unit;
      m.worst_items.forEach((w, k) => rows.push([d.file, k + 1, w.time_s, w.value, unit, w.margin, m.status, w.what]));
    }
    return { name: pm.id, columns: ['dump', 'rank', 'time_s', 'value', 'unit', 'margin', 'status', 'what'], rows };
  });
}

export function provenanceTable(doc: CheckDocument): Table {
  const rows: Cell[][] = [
    ['plan', doc.plan.file, null, doc.plan.sha256, null, doc.plan.name],
    ['tool', `midrail ${doc.tool_version}`, null, null, null, null],
    ['generated (UTC)', doc.generated_at, null, null, null, doc.hostname],
  ];
  for (const d of doc.dumps) rows.push(['dump', d.file, d.bytes, d.sha256, d.timescale, d.error]);
  rows.push(['caution', doc.caution, null, null, null, null]);
  return { name: 'Provenance', columns: ['what', 'name', 'bytes', 'sha256', 'timescale', 'note'], rows };
}

export function checkTables(doc: CheckDocument): Table[] {
  return [summaryTable(doc), ...worstTables(doc), provenanceTable(doc)];
}
