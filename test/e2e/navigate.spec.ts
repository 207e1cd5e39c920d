// Moving through time and placing cursors, on the hand-written fixture pump.vcd (1 ns
// timescale). Known times from the fixture: enable rises at 10 ns and falls at 150 ns; duty
// becomes 0x41 at 60 ns; coolant_temp rests at 20, ramps to 80 over 40–60 ns, rests, and
// ramps back over 120–140 ns in 5 ns steps. Its IEEE 181 state levels are 20 and 80 (where it
// rests), so the 50 % reference level is 50: crossed rising at 50 ns and falling at 130 ns.

import { type Page, expect, test } from '@playwright/test';
import { RULER_H, caption, laneBody, loadPump, settle, windowOf, xOfSeconds } from './helpers';

async function lanesBox(page: Page) {
  const b = await page.locator('#lanes').boundingBox();
  if (!b) throw new Error('no trace area');
  return b;
}

/** Visible window in seconds. */
async function span(page: Page): Promise<[number, number]> {
  await settle(page);
  const w = await windowOf(page);
  return [w.t0 * w.tickSeconds, (w.t0 + w.tpp * w.width) * w.tickSeconds];
}

test('dragging across the ruler zooms to that range; dragging traces, keys and the wheel pan and zoom', async ({ page }) => {
  await loadPump(page);
  const box = await lanesBox(page);
  const y = box.y - RULER_H / 2;
  // (Cursor A starts at 50 ns and B at 100 ns; start the drag away from their flags.)
  const x60 = box.x + (await xOfSeconds(page, 60e-9));
  const x110 = box.x + (await xOfSeconds(page, 110e-9));
  const oldTpp = (await windowOf(page)).tpp;
  await page.mouse.move(x60, y);
  await page.mouse.down();
  await page.mouse.move(x110, y, { steps: 6 });
  await page.mouse.up();
  let [a, b] = await span(page);
  // The pointer lands on whole pixels: within one pixel of the old scale.
  expect(Math.abs(a / 1e-9 - 60)).toBeLessThanOrEqual(oldTpp);
  expect(Math.abs(b / 1e-9 - 110)).toBeLessThanOrEqual(oldTpp);
  await expect(page.locator('#window-readout')).toHaveText(/^(59|60)(\.\d+)? ns … (109|110)(\.\d+)? ns$/);

  // Drag the traces 200 px to the left: the window moves 200 px later.
  const before = await windowOf(page);
  const mid = box.y + 60;
  await page.mouse.move(box.x + 600, mid);
  await page.mouse.down();
  await page.mouse.move(box.x + 400, mid, { steps: 8 });
  await page.mouse.up();
  await settle(page);
  const after = await windowOf(page);
  expect(after.t0 - before.t0).toBeCloseTo(200 * before.tpp, 6);
  expect(after.tpp).toBe(before.tpp);

  // → pans a tenth of the window.
  await page.locator('#lanes').focus();
  await page.keyboard.press('ArrowRight');
  await settle(page);
  const keyed = await windowOf(page);
  expect(keyed.t0 - after.t0).toBeCloseTo(0.1 * after.width * after.tpp, 6);

  // The wheel zooms around the pointer: the time under it stays put.
  const px = 300;
  const tUnder = keyed.t0 + px * keyed.tpp;
  await page.mouse.move(box.x + px, mid);
  await page.mouse.wheel(0, -400);
  await settle(page);
  const zoomed = await windowOf(page);
  expect(zoomed.tpp).toBeLessThan(keyed.tpp);
  expect(zoomed.t0 + px * zoomed.tpp).toBeCloseTo(tUnder, 6);

  // Fit shows the whole dump (0–200 ns) with a small margin.
  await page.click('#zoom-fit');
  [a, b] = await span(page);
  expect(a).toBeLessThanOrEqual(0);
  expect(b).toBeGreaterThanOrEqual(200e-9);
});

test('a click near an edge snaps the cursor onto it, and the delta reads as time and frequency', async ({ page }) => {
  await loadPump(page);
  const box = await lanesBox(page);
  const body = await laneBody(page, 'enable');
  const yEnable = box.y + body.top - RULER_H + 8;
  // B is the active cursor; click 5 px right of the falling edge at 150 ns.
  await page.mouse.click(box.x + (await xOfSeconds(page, 150e-9)) + 5, yEnable);
  const timeB = page.locator('.cursor-row[data-cursor="B"] .cursor-time');
  await expect(timeB).toHaveValue('150 ns');
  // Put A at 50 ns by typing.
  const timeA = page.locator('.cursor-row[data-cursor="A"] .cursor-time');
  await timeA.fill('50 ns');
  await timeA.press('Enter');
  // Δ = 150 ns − 50 ns = 100 ns, 1/Δ = 10 MHz.
  await expect(page.locator('#delta-readout')).toHaveText('A→B  Δ 100 ns · 10 MHz');
  await expect(page.locator('.cursor-row[data-cursor="B"] .cursor-delta')).toHaveText('100 ns · 10 MHz');
  // The lane captions read the values at the active cursor (B at 150 ns): enable just fell.
  await expect(caption(page, 'enable').locator('.cap-value')).toHaveText('0');

  // A real net snaps to its interpolated reference-level crossing: the fall at 130 ns.
  const temp = await caption(page, 'coolant_temp').boundingBox();
  await page.mouse.click(box.x + (await xOfSeconds(page, 130e-9)) - 4, temp!.y + 40);
  await expect(timeB).toHaveValue('130 ns');

  // Dragging A's flag along the ruler moves A (no snapping on the ruler).
  const xA = box.x + (await xOfSeconds(page, 50e-9));
  await page.mouse.move(xA + 1, box.y - 8);
  await page.mouse.down();
  await page.mouse.move(box.x + (await xOfSeconds(page, 30e-9)), box.y - 8, { steps: 5 });
  await page.mouse.up();
  const aTime = Number.parseFloat((await timeA.inputValue()).replace(' ns', ''));
  expect(Math.abs(aTime - 30)).toBeLessThan(1);

  // A third cursor, named.
  await page.click('#cursor-add');
  await expect(page.locator('.cursor-row')).toHaveCount(3);
  const nameC = page.locator('.cursor-row').nth(2).locator('.cursor-name');
  await nameC.fill('lock');
  await nameC.press('Enter');
  await expect(page.locator('.cursor-row[data-cursor="lock"]')).toBeVisible();
});

test('edges, values and typed times move the active cursor on the chosen lane', async ({ page }) => {
  await loadPump(page);
  // Choose the enable lane by its name; B (active) starts at 100 ns (half the dump).
  await caption(page, 'enable').locator('.cap-name').click();
  const timeB = page.locator('.cursor-row[data-cursor="B"] .cursor-time');
  await page.click('#edge-next');
  await expect(timeB).toHaveValue('150 ns');
  await page.keyboard.press(']');
  await expect(page.locator('#notice')).toHaveText('no later edge on enable');
  await page.keyboard.press('[');
  await expect(timeB).toHaveValue('10 ns');

  // duty takes 0x41 at 60 ns; typed in the Value box, found with the ▸ button.
  await caption(page, 'duty').locator('.cap-name').click();
  await page.locator('#seek-input').fill('0x41');
  await page.click('#seek-next');
  await expect(timeB).toHaveValue('60 ns');
  await expect(caption(page, 'duty').locator('.cap-value')).toHaveText('41');
  await page.locator('#seek-input').fill('0x12');
  await page.click('#seek-prev');
  await expect(timeB).toHaveValue('20 ns');
  await page.locator('#seek-input').fill('0x1ff');
  await page.click('#seek-next');
  await expect(page.locator('#notice')).toContainText("'0x1ff' is not a value of the 8-bit duty");

  // Go to a typed time: the active cursor goes there and the window centres on it.
  await page.keyboard.press('g');
  await expect(page.locator('#goto-input')).toBeFocused();
  await page.keyboard.type('123.5ns');
  await page.keyboard.press('Enter');
  await expect(timeB).toHaveValue('123.5 ns');
  const [a, b] = await span(page);
  expect((a + b) / 2).toBeCloseTo(123.5e-9, 10);
  await page.locator('#goto-input').fill('12');
  await page.locator('#goto-input').press('Enter');
  await expect(page.locator('#notice')).toContainText('has no unit');
});
