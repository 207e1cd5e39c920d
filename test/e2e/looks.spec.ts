// The two looks, photographed on the demo dump for the README, and the keyboard scheme.
// Screenshots go to test/e2e/shots/; the test checks the canvas really switched colours.

import { fileURLToPath } from 'node:url';
import { type Page, expect, test } from '@playwright/test';
import { caption, near, openViewer, rowPixels, settle } from './helpers';

const SHOTS = fileURLToPath(new URL('./shots/', import.meta.url));
/** Ruler colours of the two looks (src/render/theme.ts). */
const RULER = { paper: 0xe8e2d4, slate: 0x141925 };

/** Share of the ruler's top pixel row (above labels and cursor flags) in a colour. */
async function rulerShare(page: Page, color: number): Promise<number> {
  const w = await page.locator('#canvas-host canvas').evaluate((c) => (c as HTMLCanvasElement).width);
  const row = await rowPixels(page, 1, 0, w - 1);
  return row.filter((p) => near(p, color, 4)).length / row.length;
}

test('the demo dump in the paper and slate looks', async ({ page }) => {
  await page.setViewportSize({ width: 1440, height: 860 });
  await openViewer(page, '?dump=samples/sensor_hub.vcd');
  await expect(caption(page, 'clk_ref')).toBeVisible();
  // Show the analog front end's real nets and the first bus's bits, as a designer might.
  await page.locator('#net-filter-mode').selectOption('glob');
  await page.locator('#net-filter').fill('*.u_afe.v*');
  await page.click('#add-matching');
  await page.locator('.cap-bits').first().click();
  await page.locator('#net-filter').fill('');
  await settle(page);
  await page.screenshot({ path: SHOTS + 'viewer-paper.png' });
  expect(await rulerShare(page, RULER.paper)).toBeGreaterThan(0.95);

  await page.click('#theme-toggle');
  await expect(page.locator('html')).toHaveAttribute('data-theme', 'slate');
  await settle(page);
  await page.screenshot({ path: SHOTS + 'viewer-slate.png' });
  expect(await rulerShare(page, RULER.slate)).toBeGreaterThan(0.95);
});

test('the keys are listed in a help overlay, and the viewer works from the keyboard alone', async ({ page }) => {
  await openViewer(page, '?dump=samples/sensor_hub.vcd');
  await expect(caption(page, 'clk_ref')).toBeVisible();
  await page.locator('#lanes').focus();
  await page.keyboard.press('?');
  await expect(page.locator('#help')).toBeVisible();
  await expect(page.locator('#help-body')).toContainText('zoom to the span between active and reference cursor');
  await page.screenshot({ path: SHOTS + 'keys.png' });
  await page.keyboard.press('Escape');
  await expect(page.locator('#help')).toBeHidden();

  // Choose a lane with the arrows, jump to its next edge, zoom, add a cursor, hide the drawer.
  await page.keyboard.press('ArrowDown');
  await expect(page.locator('.cap.is-focus')).toHaveCount(1);
  const before = await page.locator('.cursor-row[data-cursor="B"] .cursor-time').inputValue();
  await page.keyboard.press(']');
  await expect(page.locator('.cursor-row[data-cursor="B"] .cursor-time')).not.toHaveValue(before);
  await page.keyboard.press('=');
  await page.keyboard.press('c');
  await expect(page.locator('.cursor-row')).toHaveCount(3);
  await page.keyboard.press('n');
  await expect(page.locator('#drawer')).toBeHidden();
  await page.keyboard.press('/');
  await expect(page.locator('#drawer')).toBeVisible();
  await expect(page.locator('#net-filter')).toBeFocused();
});
