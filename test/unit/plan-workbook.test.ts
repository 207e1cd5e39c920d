// The check workbook and CSV files: one summary row per dump × measurement, a sheet of worst items
// per measurement, provenance; numbers stay numeric; text from dumps is neutralised against formula
// injection (OWASP CSV Injection guidance), checked by reading the .xlsx back with exceljs.
import ExcelJS from 'exceljs';
import { describe, expect, it } from 'vitest';
import { parseVcd } from '../../src/parse/vcd';
import { type CheckDocument, summarize } from '../../src/plan/result';
import { runPlan } from '../../src/plan/run';
import { toPlan } from '../../src/plan/validate';
import { checkCsvFiles, checkWorkbook } from '../../src/plan/workbook';

const VCD = `$timescale 1ns $end
$scope module top $end
$var wire 1 ! =HYPERLINK("x") $end
$var wire 1 " y $end
$upscope $end
$enddefinitions $end
#0
0! 0"
#10 1!
#13 1"
#20 0!
#22 0"
#40
`;

function doc(): CheckDocument {
  const plan = toPlan({ format: 'midrail-plan', version: 1, measurements: [{ id: 'delay', kind: 'delay', from: 'top.=HYPERLINK("x")', to: 'y', max: '2.5ns' }, { id: 'summary', kind: 'pulse-width', net: 'y' }] }, 'p.json');
  const dumps = [{ file: '@evil.vcd', bytes: 99, sha256: 'f00d', timescale: '1ns', end_s: 4e-8, error: null, warnings: [], elapsed_s: 0, measurements: runPlan(parseVcd(VCD, 'e.vcd'), plan) }];
  return {
    format: 'midrail-check-result',
    format_version: 1,
    tool: 'midrail',
    tool_version: '9.9.9',
    generated_at: '2026-01-01T00:00:00.000Z',
    hostname: 'h',
    plan: { file: 'p.json', name: null, sha256: 'beef', measurements: plan.measurements.map((m) => ({ id: m.id, kind: m.kind, quantity: '', unit: 's' as const })) },
    dumps,
    summary: summarize(dumps),
    caution: 'c',
  };
}

describe('check workbook', () => {
  it('has a summary, a sheet per measurement and provenance, with numeric cells and inert text', async () => {
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load((await checkWorkbook(doc())).buffer as ArrayBuffer);
    expect(wb.worksheets.map((w) => w.name)).toEqual(['Summary', 'delay', 'summary (2)', 'Provenance']);
    const s = wb.getWorksheet('Summary')!;
    const head = (s.getRow(1).values as unknown[]).slice(1);
    const row = (s.getRow(2).values as unknown[]).slice(1);
    expect(row[head.indexOf('dump')]).toBe("'@evil.vcd");
    expect(row[head.indexOf('status')]).toBe('fail');
    expect(typeof row[head.indexOf('worst')]).toBe('number');
    expect(row[head.indexOf('worst')]).toBeCloseTo(3e-9, 15);
    expect(row[head.indexOf('margin')]).toBeCloseTo(-5e-10, 15);
    const worst = wb.getWorksheet('delay')!;
    const what = String((worst.getRow(2).values as unknown[])[8]);
    expect(what).toContain('=HYPERLINK("x")');
    // No cell anywhere holds a formula.
    for (const ws of wb.worksheets) ws.eachRow((r) => r.eachCell((c) => expect(c.type).not.toBe(ExcelJS.ValueType.Formula)));
    const prov = JSON.stringify(wb.getWorksheet('Provenance')!.getSheetValues());
    expect(prov).toContain('f00d');
    expect(prov).toContain('beef');
    expect(prov).toContain('midrail 9.9.9');
  });

  it('writes one CSV per table and keeps a measurement named summary apart from the summary', () => {
    const files = checkCsvFiles(doc());
    expect([...files.keys()]).toEqual(['summary.csv', 'delay.csv', 'measurement-summary.csv', 'provenance.csv']);
    expect(files.get('summary.csv')!.split('\r\n')[1]).toMatch(/^"'@evil\.vcd","delay","delay","delay","fail",3e-9,"s",/);
  });
});
