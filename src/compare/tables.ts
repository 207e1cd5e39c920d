// A comparison as tables for CSV and .xlsx: one row per net (numbers in seconds), the first
// difference, and the provenance of both dumps.

import type { Cell } from '../report/index';
import type { CompareResult } from './index';

export interface CompareTable {
  name: string;
  columns: string[];
  rows: Cell[][];
}

export interface DumpFacts {
  file: string;
  bytes: number;
  sha256: string;
  timescale: string;
}

export const NET_COLUMNS = ['net', 'kind', 'base_edges', 'new_edges', 'matched', 'added', 'missing', 'mean_shift_s', 'min_shift_s', 'max_shift_s', 'worst_shift_time_s', 'first_difference_s'];

export function netTable(r: CompareResult): CompareTable {
  return {
    name: 'Nets',
    columns: NET_COLUMNS,
    rows: r.nets.map((n) => [n.net, n.kind, n.base_edges, n.new_edges, n.matched, n.added, n.missing, n.mean_shift_s, n.min_shift_s, n.max_shift_s, n.worst_shift_time_s, n.first_difference_s]),
  };
}

export function compareTables(r: CompareResult, base: DumpFacts, next: DumpFacts, toolVersion: string): CompareTable[] {
  const f = r.first_difference;
  const differences: CompareTable = {
    name: 'First difference',
    columns: ['net', 'time_s', 'duration_s', 'base_value', 'new_value', 'tolerance_s'],
    rows: f ? [[f.net, f.time_s, f.duration_s, f.base_value, f.new_value, r.tolerance_s]] : [],
  };
  const others: CompareTable = {
    name: 'Not compared',
    columns: ['net', 'reason'],
    rows: [
      ...r.only_in_base.map((n): Cell[] => [n, 'only in the base dump']),
      ...r.only_in_new.map((n): Cell[] => [n, 'only in the new dump']),
      ...r.incomparable.map((x): Cell[] => [x.net, x.reason]),
    ],
  };
  const provenance: CompareTable = {
    name: 'Provenance',
    columns: ['what', 'name', 'bytes', 'sha256', 'timescale'],
    rows: [
      ['base dump', base.file, base.bytes, base.sha256, base.timescale],
      ['new dump', next.file, next.bytes, next.sha256, next.timescale],
      ['tolerance_s', r.tolerance_s, null, null, null],
      ['window_s', r.window_s, null, null, null],
      ['tool', `midrail ${toolVersion}`, null, null, null],
    ],
  };
  return [netTable(r), differences, others, provenance];
}
