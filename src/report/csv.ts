// CSV export (RFC 4180): CRLF line ends; a field holding a comma, quote, CR or LF is quoted with
// inner quotes doubled. Text fields are also passed through the formula-injection guard and then
// always quoted (OWASP's recipe), so a separator inside a name can never start a new cell. Numbers
// are written bare so spreadsheets read them as numbers.

import { neutralizeText } from './inject';
import { type Cell, type MeasurementSheet, SUMMARY_KEYS } from './sheet';

export function csvField(cell: Cell): string {
  if (cell === null || cell === undefined) return '';
  if (typeof cell === 'number') return Number.isFinite(cell) ? String(cell) : '';
  return `"${neutralizeText(cell).replace(/"/g, '""')}"`;
}

export function csvLine(cells: Cell[]): string {
  return cells.map(csvField).join(',') + '\r\n';
}

/**
 * One table for any set of measurements: each sheet's own columns, then the summary columns; summary
 * rows carry `summary` in the `row` column. With more than one sheet a leading `measurement` column
 * names the sheet each row belongs to, and the columns are the union of all sheets' columns.
 */
export function toCsv(sheets: MeasurementSheet[]): string {
  const multi = sheets.length > 1;
  const columns: string[] = multi ? ['measurement'] : [];
  const add = (c: string) => {
    if (!columns.includes(c)) columns.push(c);
  };
  for (const s of sheets) s.columns.forEach(add);
  add('row');
  SUMMARY_KEYS.forEach(add);
  let out = csvLine(columns);
  for (const s of sheets) {
    const pos = s.columns.map((c) => columns.indexOf(c));
    for (const r of s.rows) {
      const line: Cell[] = new Array<Cell>(columns.length).fill(null);
      if (multi) line[0] = s.title;
      r.forEach((v, k) => (line[pos[k]] = v));
      out += csvLine(line);
    }
    for (const sum of s.summary) {
      const line: Cell[] = new Array<Cell>(columns.length).fill(null);
      if (multi) line[0] = s.title;
      line[columns.indexOf('row')] = 'summary';
      for (const key of SUMMARY_KEYS) {
        const v = sum[key];
        if (v !== undefined) line[columns.indexOf(key)] = v;
      }
      out += csvLine(line);
    }
  }
  return out;
}
