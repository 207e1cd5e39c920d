// .xlsx export read back with exceljs: a net named =HYPERLINK("x") must come back as a plain string
// cell with a leading apostrophe, never a formula or hyperlink (OWASP CSV Injection guidance applies
// to XLSX too, since users re-save as CSV); numbers must stay numeric cells.
// SHA-256 check value: "abc" → ba7816bf…f20015ad (FIPS 180-2 appendix B.1 example, from memory).

import ExcelJS from 'exceljs';
import { describe, expect, it } from 'vitest';
import { findGlitches, measureDelay } from '../../src/measure';
import { resolveNet } from '../../src/model/netref';
import { delaySheet, glitchSheet, provenanceFor, sha256Hex, sheetName, writeXlsx } from '../../src/report';
import { buildDump } from './measure-dumps';

const HOSTILE = '=HYPERLINK("x")';

describe('sha256Hex', () => {
  it('matches the FIPS 180-2 test vector for "abc"', async () => {
    expect(await sha256Hex(new TextEncoder().encode('abc'))).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });
});

describe('sheetName', () => {
  it('keeps Excel sheet names legal and unique', () => {
    const taken = new Set<string>();
    expect(sheetName('edges top.bus[3]', taken)).toBe('edges top.bus_3_');
    const long = 'delay top.some.very.long.path.a → top.y';
    const a = sheetName(long, taken);
    const b = sheetName(long, taken);
    expect(a.length).toBeLessThanOrEqual(31);
    expect(b.length).toBeLessThanOrEqual(31);
    expect(a).not.toBe(b);
  });
});

describe('writeXlsx', () => {
  const dump = buildDump(
    [
      { path: HOSTILE, kind: 'logic', changes: [[0, '0'], [10, '1'], [11, '0'], [30, '1']] },
      { path: 'top.y', kind: 'logic', changes: [[0, '1'], [12, '0'], [33, '0'], [34, '1']] },
    ],
    { source: 'hostile.vcd' },
  );

  it('writes measurement, summary and provenance sheets with inert text and numeric seconds', async () => {
    const delay = measureDelay(dump, { from: resolveNet(dump, HOSTILE), to: resolveNet(dump, 'top.y') });
    const glitches = findGlitches(dump, { maxWidthS: 2e-9 });
    const fileBytes = new TextEncoder().encode('abc');
    const prov = await provenanceFor(dump, fileBytes, '9.9.9', new Date('2026-01-02T03:04:05Z'));
    const bytes = await writeXlsx([delaySheet(delay), glitchSheet(glitches)], prov);

    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
    const names = wb.worksheets.map((w) => w.name);
    expect(names[0]).toBe('Summary');
    expect(names).toContain('Provenance');
    expect(names).toHaveLength(4);

    // Every cell of every sheet: no formulas, no hyperlinks, no text starting with a trigger.
    let hostileSeen = 0;
    for (const ws of wb.worksheets) {
      ws.eachRow((row) =>
        row.eachCell((cell) => {
          expect(cell.type, `${ws.name}!${cell.address}`).not.toBe(ExcelJS.ValueType.Formula);
          expect(cell.type).not.toBe(ExcelJS.ValueType.Hyperlink);
          if (typeof cell.value === 'string') {
            expect(/^[=+\-@\t\r\n]/.test(cell.value), `${ws.name}!${cell.address}: ${cell.value}`).toBe(false);
            if (cell.value === `'${HOSTILE}`) hostileSeen++;
          }
        }),
      );
    }
    expect(hostileSeen).toBeGreaterThan(0);

    // Delay sheet: header with units, numbers as numeric cells.
    const ds = wb.worksheets[1];
    const header = (ds.getRow(1).values as unknown[]).slice(1);
    expect(header).toContain('delay_s');
    const col = header.indexOf('delay_s') + 1;
    expect(ds.getRow(2).getCell(col).type).toBe(ExcelJS.ValueType.Number);
    expect(ds.getRow(2).getCell(col).value).toBe(4e-9); // worst pair first: rise at 30 → rise at 34
    expect(ds.getRow(2).getCell(header.indexOf('from') + 1).value).toBe(`'${HOSTILE}`);

    // Provenance: name, size, SHA-256, timescale, version.
    const prov2 = new Map<string, unknown>();
    wb.getWorksheet('Provenance')!.eachRow((row) => prov2.set(String(row.getCell(1).value), row.getCell(2).value));
    expect(prov2.get('dump')).toBe('hostile.vcd');
    expect(prov2.get('dump size (bytes)')).toBe(3);
    expect(prov2.get('dump SHA-256')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
    expect(prov2.get('timescale')).toBe('1 ns');
    expect(prov2.get('tool')).toBe('midrail 9.9.9');
    expect(prov2.get(`delay ${HOSTILE} → top.y: level`)).toBe('50%');
  });
});
