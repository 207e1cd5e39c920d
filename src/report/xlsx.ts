// .xlsx export with exceljs: one sheet per measurement (worst rows first), a summary sheet and a
// provenance sheet. Numbers are numeric cells in seconds (unit in the header); every text cell is a
// plain string cell passed through the formula-injection guard (no formula or hyperlink cells are
// ever made from dump text). exceljs is loaded on first use, so the viewer pays for it only when
// exporting. Only writes workbooks: reading untrusted .xlsx is what exceljs's advisories are about.

import type { Workbook } from 'exceljs';
import { neutralizeText } from './inject';
import { type Provenance, provenanceRows } from './provenance';
import { type Cell, type MeasurementSheet, SUMMARY_KEYS } from './sheet';

const FORBIDDEN = /[[\]:*?/\\]/g;

/** Excel sheet names: at most 31 characters, none of []:*?/\, no apostrophe at either end, unique. */
export function sheetName(title: string, taken: Set<string>): string {
  const base = title.replace(FORBIDDEN, '_').replace(/^'+|'+$/g, '').slice(0, 31) || 'sheet';
  let name = base;
  for (let k = 2; taken.has(name.toLowerCase()); k++) name = `${base.slice(0, 31 - `(${k})`.length - 1)} (${k})`;
  taken.add(name.toLowerCase());
  return name;
}

/** A cell for exceljs: finite numbers stay numeric, text is neutralised against formula injection. */
export function cellValue(c: Cell): string | number | null {
  if (c === null || c === undefined) return null;
  if (typeof c === 'number') return Number.isFinite(c) ? c : null;
  return neutralizeText(c);
}

/** A new exceljs workbook; exceljs is loaded on first use. */
export async function newWorkbook(): Promise<Workbook> {
  const mod = (await import('exceljs')) as unknown as { default?: { Workbook: new () => Workbook }; Workbook?: new () => Workbook };
  const Ctor = mod.default?.Workbook ?? mod.Workbook;
  if (!Ctor) throw new Error('exceljs did not load');
  return new Ctor();
}

export async function writeXlsx(sheets: MeasurementSheet[], provenance: Provenance): Promise<Uint8Array> {
  const wb = await newWorkbook();
  wb.creator = 'midrail';
  const taken = new Set<string>(['summary', 'provenance']);
  const summary = wb.addWorksheet('Summary');
  summary.addRow(['measurement', ...SUMMARY_KEYS]);
  for (const s of sheets) {
    const ws = wb.addWorksheet(sheetName(s.title, taken));
    ws.addRow(s.columns);
    for (const r of s.rows) ws.addRow(r.map(cellValue));
    ws.getRow(1).font = { bold: true };
    for (const sum of s.summary) summary.addRow([cellValue(s.title), ...SUMMARY_KEYS.map((k) => cellValue(sum[k] ?? null))]);
  }
  summary.getRow(1).font = { bold: true };
  const prov = wb.addWorksheet('Provenance');
  prov.addRow(['field', 'value']);
  for (const [k, v] of provenanceRows(provenance)) prov.addRow([k, cellValue(v)]);
  for (const s of sheets) for (const [k, v] of s.settings) prov.addRow([cellValue(`${s.title}: ${k}`), cellValue(v)]);
  prov.getRow(1).font = { bold: true };
  const buf = await wb.xlsx.writeBuffer();
  return new Uint8Array(buf as ArrayBuffer);
}
