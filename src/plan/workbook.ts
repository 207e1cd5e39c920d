// A check result as an .xlsx workbook (Summary, one sheet per measurement, Provenance) and as CSV
// files, through the report module's formula-injection guard and sheet-name rules. exceljs is
// loaded on first use. Only writes workbooks.

import { cellValue, csvLine, newWorkbook, sheetName } from '../report/index';
import type { CheckDocument } from './result';
import { type Table, checkTables } from './sheets';

/** Any list of tables as a workbook, one sheet each, header row in bold. */
export async function tablesWorkbook(tables: Table[]): Promise<Uint8Array> {
  const wb = await newWorkbook();
  wb.creator = 'midrail';
  const taken = new Set<string>();
  for (const t of tables) {
    const ws = wb.addWorksheet(sheetName(t.name, taken));
    ws.addRow(t.columns);
    ws.getRow(1).font = { bold: true };
    for (const r of t.rows) ws.addRow(r.map(cellValue));
  }
  const buf = await wb.xlsx.writeBuffer();
  return new Uint8Array(buf as ArrayBuffer);
}

export function checkWorkbook(doc: CheckDocument): Promise<Uint8Array> {
  return tablesWorkbook(checkTables(doc));
}

/** A table as CSV text (RFC 4180, with the formula-injection guard). */
export function tableCsv(t: Table): string {
  let text = csvLine(t.columns);
  for (const r of t.rows) text += csvLine(r);
  return text;
}

/** File name → CSV text (RFC 4180): summary.csv, <measurement id>.csv, provenance.csv. */
export function checkCsvFiles(doc: CheckDocument): Map<string, string> {
  const out = new Map<string, string>();
  const tables = checkTables(doc);
  tables.forEach((t, k) => {
    const fixed = k === 0 || k === tables.length - 1; // Summary and Provenance
    // Measurement ids are restricted by the plan schema to letters, digits, '_', '.', '-'.
    const reserved = !fixed && ['summary', 'provenance'].includes(t.name.toLowerCase());
    const name = fixed ? `${t.name.toLowerCase()}.csv` : `${reserved ? 'measurement-' : ''}${t.name}.csv`;
    out.set(name, tableCsv(t));
  });
  return out;
}
