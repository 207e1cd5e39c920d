// --csv and --xlsx of the measurement commands on a dump with a hostile net name, =HYPERLINK("x").
// OWASP CSV Injection guidance: text starting with = + - @ tab CR LF must come out inert, in CSV and
// in .xlsx (read back here with exceljs). The provenance sheet's SHA-256 is checked against Node's own
// hash implementation (node:crypto), independent of the WebCrypto path the export uses.

import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import { afterAll, describe, expect, test } from 'vitest';
import { midrail } from './measure-cli';

const dir = mkdtempSync(join(tmpdir(), 'midrail-measure-export-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const HOSTILE = '=HYPERLINK("x")';
const VCD = join(dir, 'hostile.vcd');
// Hand-written VCD (IEEE 1364-2005 §18.2): a top-level net with a formula for a name drives top.y.
writeFileSync(
  VCD,
  `$timescale 1ps $end
$var wire 1 ! ${HOSTILE} $end
$scope module top $end
$var wire 1 " y $end
$upscope $end
$enddefinitions $end
#0
0!
1"
#1000
1!
#1200
0"
#3000
0!
#3300
1"
#5000
1!
#5001
0!
`,
);

describe('measurement exports', () => {
  test('delay --csv is RFC 4180 with the hostile name quoted and prefixed, numbers bare', () => {
    const r = midrail('delay', VCD, '--from', HOSTILE, '--to', 'top.y', '--csv');
    expect(r.code, r.stderr).toBe(0);
    const lines = r.stdout.split('\r\n');
    // Every text field is quoted (OWASP's recipe), the header included.
    expect(lines[0].startsWith('"row","kind","from","from_edge","from_time_s","to","to_edge","to_time_s","delay_s"')).toBe(true);
    // Worst pair first: 3000 → 3300 is 300 ps.
    expect(lines[1]).toMatch(/^"pair","tPLH","'=HYPERLINK\(""x""\)","fall",3e-9,"top.y","rise",3\.3e-9,3e-10,/);
    for (const line of lines) expect(line.startsWith('=')).toBe(false);
    expect(r.stdout).not.toMatch(/(^|,)=HYPERLINK/m);
  });

  test('glitches --csv keeps the hostile name inert', () => {
    const r = midrail('glitches', VCD, '--max-width', '2ps', '--csv');
    expect(r.code, r.stderr).toBe(0);
    expect(r.stdout).toContain(`"glitch","'=HYPERLINK(""x"")",5e-9,1e-12,"high"`);
  });

  test('delay --xlsx writes a workbook whose text cells are inert, numbers numeric, and provenance exact', async () => {
    const out = join(dir, 'delay.xlsx');
    const r = midrail('delay', VCD, '--from', HOSTILE, '--to', 'y', '--json', '--xlsx', out);
    expect(r.code, r.stderr).toBe(0);
    expect(JSON.parse(r.stdout).pairs).toHaveLength(2);

    const wb = new ExcelJS.Workbook();
    const bytes = readFileSync(out);
    await wb.xlsx.load(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer);
    expect(wb.worksheets.map((w) => w.name)).toEqual(['Summary', expect.stringMatching(/^delay /), 'Provenance']);
    let hostile = 0;
    for (const ws of wb.worksheets) {
      ws.eachRow((row) =>
        row.eachCell((cell) => {
          expect(cell.type).not.toBe(ExcelJS.ValueType.Formula);
          expect(cell.type).not.toBe(ExcelJS.ValueType.Hyperlink);
          if (typeof cell.value === 'string') {
            expect(/^[=+\-@\t\r\n]/.test(cell.value), `${ws.name}!${cell.address}`).toBe(false);
            if (cell.value === `'${HOSTILE}`) hostile++;
          }
        }),
      );
    }
    expect(hostile).toBe(3); // the from column of both pair rows, and the `from` setting on the provenance sheet
    const sheet = wb.worksheets[1];
    const header = (sheet.getRow(1).values as unknown[]).slice(1);
    const delayCell = sheet.getRow(2).getCell(header.indexOf('delay_s') + 1);
    expect(delayCell.type).toBe(ExcelJS.ValueType.Number);
    expect(delayCell.value).toBe(3e-10);

    const prov = new Map<string, unknown>();
    wb.getWorksheet('Provenance')!.eachRow((row) => prov.set(String(row.getCell(1).value), row.getCell(2).value));
    const file = readFileSync(VCD);
    expect(prov.get('dump')).toBe('hostile.vcd');
    expect(prov.get('dump size (bytes)')).toBe(file.length);
    expect(prov.get('dump SHA-256')).toBe(createHash('sha256').update(file).digest('hex'));
    expect(prov.get('timescale')).toBe('1 ps');
    expect(String(prov.get('tool'))).toMatch(/^midrail \d+\.\d+\.\d+/);

    const summary = wb.getWorksheet('Summary')!;
    const items = new Map<string, ExcelJS.Row>();
    const sh = (summary.getRow(1).values as unknown[]).slice(1);
    summary.eachRow((row, n) => n > 1 && items.set(String(row.getCell(sh.indexOf('item') + 1).value), row));
    expect(items.get('tpd')!.getCell(sh.indexOf('value') + 1).value).toBe(3e-10);
    expect(items.get('tPLH')!.getCell(sh.indexOf('count') + 1).value).toBe(1);
  });

  test('an --xlsx path that cannot be written is a clear exit-2 error', () => {
    const r = midrail('edges', VCD, '--net', 'top.y', '--xlsx', join(dir, 'no-such-folder', 'out.xlsx'));
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/cannot write workbook/);
  });
});
