// Saving and restoring views: a view file round trip across a page reload, the view the
// browser remembers per file name, reopening the same file, and a broken view file.

import { readFileSync } from 'node:fs';
import { type Page, expect, test } from '@playwright/test';
import { caption, loadFile, loadPump, pumpVcd, settle, windowOf } from './helpers';

/** Arranges the pump view: no clk lane, enable renamed, duty in unsigned, A at 25 ns, 20–120 ns shown. */
async function arrange(page: Page): Promise<void> {
  await caption(page, 'clk').locator('.cap-remove').click();
  await expect(caption(page, 'clk')).toHaveCount(0);
  await caption(page, 'enable').locator('.cap-name').dblclick();
  await page.locator('.cap-rename').fill('pump_on');
  await page.keyboard.press('Enter');
  await caption(page, 'duty').locator('.cap-more').click();
  await page.locator('#lane-radix').selectOption('unsigned');
  await page.click('#tab-cursors');
  const timeA = page.locator('.cursor-row[data-cursor="A"] .cursor-time');
  await timeA.fill('25ns');
  await timeA.press('Enter');
  // Zoom to about 20–120 ns by dragging along the ruler.
  await page.click('#zoom-fit');
  await settle(page);
  const box = (await page.locator('#lanes').boundingBox())!;
  const w = await windowOf(page);
  const xOf = (ns: number) => box.x + (ns - w.t0) / w.tpp;
  await page.mouse.move(xOf(20), box.y - 20);
  await page.mouse.down();
  await page.mouse.move(xOf(120), box.y - 20, { steps: 5 });
  await page.mouse.up();
  await settle(page);
}

async function expectArranged(page: Page, window: { t0: number; tpp: number }): Promise<void> {
  await expect(caption(page, 'clk')).toHaveCount(0);
  await expect(caption(page, 'pump_on')).toBeVisible();
  await expect(page.locator('.cursor-row[data-cursor="A"] .cursor-time')).toHaveValue('25 ns');
  await settle(page);
  const w = await windowOf(page);
  expect(w.t0).toBeCloseTo(window.t0, 6);
  // Times are stored in seconds and read back to a millionth of a tick.
  expect(Math.abs(w.tpp / window.tpp - 1)).toBeLessThan(1e-6);
  // duty holds 0x12 = 18 from 20 ns; read at the active cursor (B at 100 ns → 0x7f = 127).
  await expect(caption(page, 'duty').locator('.cap-value')).toHaveText('127');
}

test('a saved view file brings back lanes, names, radix, cursors and zoom after a page reload', async ({ page }) => {
  await loadPump(page);
  await arrange(page);
  const arranged = await windowOf(page);
  const download = page.waitForEvent('download');
  await page.click('#save-view');
  const file = await (await download).path();
  const saved = JSON.parse(readFileSync(file, 'utf8'));
  expect(saved.format).toBe('midrail-view');
  expect(saved.version).toBe(1);

  // A fresh page with nothing remembered: the dump opens with its default lanes. Storage is
  // cleared after the reload, since the page stores the view a moment after each change and a
  // store still pending at the reload would otherwise land after the clear.
  await page.reload();
  await page.evaluate(() => localStorage.clear());
  await loadFile(page, 'pump.vcd', pumpVcd());
  await expect(caption(page, 'clk')).toBeVisible();
  const chooser = page.waitForEvent('filechooser');
  await page.click('#load-view');
  await (await chooser).setFiles(file);
  await expect(page.locator('#notice')).toContainText('view restored');
  await expectArranged(page, arranged);
});

test('the browser remembers the last view of each file name', async ({ page }) => {
  await loadPump(page);
  await arrange(page);
  const arranged = await windowOf(page);
  // The view is stored shortly after the last change; wait until it is there.
  await expect
    .poll(() => page.evaluate(() => JSON.parse(localStorage.getItem('midrail.view:pump.vcd') ?? '{"window":{"start":0}}').window.start))
    .toBeCloseTo(arranged.t0 * arranged.tickSeconds, 12);
  await page.reload();
  await loadFile(page, 'pump.vcd', pumpVcd());
  await expect(page.locator('#notice')).toContainText('restored your last view of pump.vcd');
  await expectArranged(page, arranged);
});

test('opening the same file again keeps the shown lanes, cursors and zoom', async ({ page }) => {
  await loadPump(page);
  await arrange(page);
  const arranged = await windowOf(page);
  await loadFile(page, 'pump.vcd', pumpVcd());
  await expect(page.locator('#notice')).toContainText('reloaded pump.vcd');
  await expectArranged(page, arranged);
});

test('a view file with a bad field is refused with a message naming the field', async ({ page }) => {
  await loadPump(page);
  const bad = {
    format: 'midrail-view',
    version: 1,
    dump: 'pump.vcd',
    window: { start: 0, end: 1e-7 },
    cursors: [{ name: 'A', time: 1e-8 }],
    activeCursor: 0,
    referenceCursor: 0,
    lanes: [{ net: 'pump.duty', radix: 'octal' }],
  };
  const chooser = page.waitForEvent('filechooser');
  await page.click('#load-view');
  await (await chooser).setFiles({ name: 'bad-view.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(bad)) });
  await expect(page.locator('#error-panel')).toBeVisible();
  await expect(page.locator('#error-title')).toHaveText('Could not restore bad-view.json');
  await expect(page.locator('#error-text')).toHaveText(/lanes\[0\]\.radix is "octal"; expected one of hex, bin, unsigned, signed, ascii/);
  // Nothing changed on screen.
  await expect(caption(page, 'clk')).toBeVisible();
});
