// The worst-case sheet (Copy, .xlsx and CSV through the CLI's report writers), measurement plans
// opened and saved in the viewer, and measurements kept in saved views. The dumps are iverilog's
// (samples/README.md gives the gate delays); plan verdicts are checked against `midrail check`.

import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import ExcelJS from 'exceljs';
import { expect, test } from '@playwright/test';
import { caption, settle } from './helpers';
import { ROOT, SHOTS, figure, laneMenu, midrailJson, openSample, showNet } from './measure-steps';

test.use({ permissions: ['clipboard-read', 'clipboard-write'] });

test('the worst tPHL pairs go to the sheet; Copy gives tab-separated rows; .xlsx and CSV come back with the rows, the full table and the provenance', async ({ page }) => {
  await page.setViewportSize({ width: 1440, height: 860 });
  await openSample(page);
  await showNet(page, 'dut.clk_log', 'clk_log');
  await laneMenu(page, 'clk_ref', 'menu-delay-from');
  await laneMenu(page, 'clk_log', 'menu-delay-to');
  // samples/README.md: clk_log follows a clk_ref rise by 0.45 ns and a fall by 0.39 ns (two inverters).
  await expect.poll(() => figure(page, 'tPHL.max_s')).toBe(0.39e-9);
  expect(await figure(page, 'tPLH.max_s')).toBe(0.45e-9);
  // A 0.4 ns limit: every tPHL pair holds it with 10 ps to spare.
  await page.locator('#m-max').fill('0.4ns');
  await page.locator('#m-max').press('Enter');
  await expect(page.locator('#measure-verdict .chip')).toHaveText('fail'); // the 0.45 ns tPLH pairs break it
  await page.locator('#measure-hist-kind').selectOption({ label: 'tPHL' });
  await page.click('#measure-add-worst');
  await page.click('#tab-worst');
  await expect(page.locator('#sheet-count')).toHaveText('10 rows');

  await page.click('#sheet-copy');
  await expect(page.locator('#notice')).toContainText('10 rows copied');
  const text = await page.evaluate(() => navigator.clipboard.readText());
  expect(text.endsWith('\r\n')).toBe(true);
  const lines = text.slice(0, -2).split('\r\n').map((l) => l.split('\t'));
  expect(lines[0]).toEqual(['measurement', 'nets', 'edge', 'time_s', 'value_s', 'limit_min_s', 'limit_max_s', 'margin_s']);
  expect(lines).toHaveLength(11);
  for (const cells of lines.slice(1)) {
    expect(cells).toHaveLength(8);
    expect(cells[1]).toBe('hub_bench.clk_ref -> hub_bench.dut.clk_log');
    expect(cells[2]).toBe('tPHL (fall → fall)');
    expect(Number(cells[4])).toBe(0.39e-9);
    expect(cells[5]).toBe('');
    expect(Number(cells[6])).toBe(0.4e-9);
    expect(Number(cells[7])).toBe(10e-12);
  }

  const xlsx = page.waitForEvent('download');
  await page.click('#sheet-xlsx');
  const file = await (await xlsx).path();
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.readFile(file);
  const worst = wb.getWorksheet('worst delay pairs')!;
  expect(worst.getRow(1).values).toEqual([undefined, 'row', 'measurement_id', ...lines[0].slice(1)]);
  expect(worst.rowCount).toBe(11);
  expect(worst.getRow(2).getCell(6).value).toBe(0.39e-9); // value_s, a number
  // The measurement's full table in the CLI's layout (`midrail delay --xlsx`), worst first.
  const full = wb.worksheets.find((ws) => ws.name.startsWith('delay hub_bench.clk_ref'))!;
  expect(full.getRow(1).values).toEqual([undefined, 'row', 'kind', 'from', 'from_edge', 'from_time_s', 'to', 'to_edge', 'to_time_s', 'delay_s']);
  expect(full.getRow(2).getCell(9).value).toBe(0.45e-9);
  const prov = wb.getWorksheet('Provenance')!;
  const sha = createHash('sha256').update(readFileSync(ROOT + 'samples/sensor_hub.vcd')).digest('hex');
  const provRows = new Map<string, unknown>();
  prov.eachRow((r) => provRows.set(String(r.getCell(1).value), r.getCell(2).value));
  expect(provRows.get('dump SHA-256')).toBe(sha);
  expect(wb.getWorksheet('Summary')!.getRow(1).getCell(2).value).toBe('item');

  const csv = page.waitForEvent('download');
  await page.click('#sheet-csv');
  const csvText = readFileSync(await (await csv).path(), 'utf8');
  const csvLines = csvText.trimEnd().split('\r\n');
  expect(csvLines[0].startsWith('"measurement","row","measurement_id","nets","edge","time_s","value_s"')).toBe(true);
  expect(csvLines.filter((l) => l.includes('"worst delay pairs","worst"')).length).toBe(10);
  await settle(page);
  await page.screenshot({ path: SHOTS + 'sheet.png' });
});

test('Open plan runs the sample plan on the slow corner: pass and fail per measurement as `midrail check` gives them, violations counted and marked; Save plan writes it back', async ({ page }) => {
  await openSample(page, 'sensor_hub_slow.vcd');
  await page.click('#tab-measure');
  const chooser = page.waitForEvent('filechooser');
  await page.click('#plan-open');
  await (await chooser).setFiles(ROOT + 'samples/plans/sensor_hub.plan.json');
  await expect(page.locator('#plan-note')).toContainText(/plan sensor hub timing: \d+ pass, \d+ fail/);
  const check = midrailJson('check', 'samples/sensor_hub_slow.vcd', '--plan', 'samples/plans/sensor_hub.plan.json');
  const outcomes = check.dumps[0].measurements as Array<{ id: string; status: string; violations: number }>;
  expect(outcomes.some((m) => m.status === 'fail')).toBe(true);
  for (const m of outcomes) await expect(page.locator(`.m-item[data-id="${m.id}"] .chip`)).toHaveText(m.status);
  const failing = outcomes.find((m) => m.status === 'fail' && m.violations > 0)!;
  await page.locator(`.m-item[data-id="${failing.id}"]`).click();
  await expect(page.locator('#measure-violations')).toContainText(`${failing.violations} of `);
  await expect(page.locator(`.m-item[data-id="${failing.id}"] .m-viol`)).toHaveText(`${failing.violations} ⚑`);

  const saved = page.waitForEvent('download');
  await page.click('#plan-save');
  const plan = JSON.parse(readFileSync(await (await saved).path(), 'utf8'));
  const original = JSON.parse(readFileSync(ROOT + 'samples/plans/sensor_hub.plan.json', 'utf8'));
  expect(plan.format).toBe('midrail-plan');
  expect(plan.measurements).toEqual(original.measurements);
  expect(plan.levels).toEqual(original.levels);
});

test('measurements and the worst-case sheet are part of the saved view and of the view the browser remembers', async ({ page }) => {
  await openSample(page);
  await showNet(page, 'dut.clk_spi', 'clk_spi');
  await laneMenu(page, 'clk_ref', 'menu-delay-from');
  await laneMenu(page, 'clk_spi', 'menu-delay-to');
  await page.locator('#m-max').fill('0.7ns');
  await page.locator('#m-max').press('Enter');
  await expect(page.locator('#measure-violations')).toContainText('303 of 303 pairs');
  await page.click('#measure-add-worst');
  const download = page.waitForEvent('download');
  await page.click('#save-view');
  const view = JSON.parse(readFileSync(await (await download).path(), 'utf8'));
  expect(view.measure.plan.measurements).toEqual([{ id: 'delay_clk_ref_clk_spi', kind: 'delay', from: 'hub_bench.clk_ref', to: 'hub_bench.dut.clk_spi', max: '0.7ns' }]);
  expect(view.measure.sheet).toHaveLength(10);

  // The browser keeps it for this file name…
  await expect.poll(() => page.evaluate(() => JSON.parse(localStorage.getItem('midrail.view:sensor_hub.vcd') ?? '{}').measure?.sheet?.length ?? 0)).toBe(10);
  await page.reload();
  await expect(page.locator('#file-name')).toHaveText('sensor_hub.vcd');
  await expect(page.locator('.m-item[data-id="delay_clk_ref_clk_spi"] .chip')).toHaveText('fail');
  // …and a view file brings it back on a page that has forgotten it.
  await page.evaluate(() => localStorage.clear());
  await page.reload();
  await expect(page.locator('#file-name')).toHaveText('sensor_hub.vcd');
  await expect(page.locator('.m-item')).toHaveCount(0);
  await page.evaluate(() => localStorage.clear());
  const chooser = page.waitForEvent('filechooser');
  await page.click('#load-view');
  await (await chooser).setFiles({ name: 'hub.midrail-view.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(view)) });
  await expect(page.locator('.m-item[data-id="delay_clk_ref_clk_spi"] .chip')).toHaveText('fail');
  await expect(caption(page, 'clk_spi')).toBeVisible();
  await page.click('#tab-worst');
  await expect(page.locator('#sheet-count')).toHaveText('10 rows');
});
