// Choosing nets in the drawer and arranging lanes. Net counts come from the hand-written
// fixtures: greenhouse.vcd (22 nets: plant.clk, plant.rst_n, and five nets in each of
// plant.zone1..zone4) and pump.vcd.

import { readFileSync } from 'node:fs';
import { type Page, expect, test } from '@playwright/test';
import { FIXTURES, caption, loadFile, loadPump, openViewer, settle } from './helpers';

async function loadGreenhouse(page: Page): Promise<void> {
  await openViewer(page);
  await loadFile(page, 'greenhouse.vcd', readFileSync(FIXTURES + 'greenhouse.vcd'));
}

const lane = (page: Page, path: string) => page.locator(`.cap[data-path="${path}"]`);

test('filtering the drawer by text, glob and regular expression, then adding three nets three ways', async ({ page }) => {
  await loadGreenhouse(page);
  const filter = page.locator('#net-filter');
  const mode = page.locator('#net-filter-mode');
  const count = page.locator('#net-count');
  const rows = page.locator('.net-row:not([hidden])');
  await expect(count).toHaveText('22 of 22 nets');

  await filter.fill('HUMID');
  await expect(count).toHaveText('4 of 22 nets'); // substring, any case
  await mode.selectOption('glob');
  await filter.fill('air_temp');
  await expect(count).toHaveText('4 of 22 nets'); // a glob also matches a path suffix
  await filter.fill('plant.zone?.h*');
  await expect(count).toHaveText('8 of 22 nets'); // heater_on and humidity of four zones
  await mode.selectOption('regex');
  await filter.fill('(');
  await expect(page.locator('#net-filter-error')).toContainText('not a regular expression');
  await filter.fill('^plant\\.zone[234]\\.humidity$');
  await expect(count).toHaveText('3 of 22 nets');
  await expect(page.locator('#net-filter-error')).toBeEmpty();

  // One by double-click, one by Enter on the highlighted row, one by its + button.
  await rows.nth(0).dblclick();
  await page.locator('#net-list').focus();
  await page.keyboard.press('ArrowDown');
  await page.keyboard.press('Enter');
  await rows.nth(2).hover();
  await rows.nth(2).locator('.net-add').click();
  for (const z of [2, 3, 4]) await expect(lane(page, `plant.zone${z}.humidity`)).toBeVisible();
  await expect(rows.nth(0)).toHaveClass(/is-shown/);
});

test('a net dragged from the drawer lands between the lanes where it is dropped', async ({ page }) => {
  await loadGreenhouse(page);
  await page.locator('#net-filter').fill('zone4.air');
  const row = page.locator('.net-row:not([hidden])');
  await expect(row).toHaveCount(1);
  await row.dragTo(lane(page, 'plant.rst_n'), { targetPosition: { x: 30, y: 4 } });
  await expect(lane(page, 'plant.zone4.air_temp')).toBeVisible();
  const paths = await page.locator('.cap[data-path]').evaluateAll((els) => els.map((e) => e.getAttribute('data-path')));
  expect(paths.indexOf('plant.zone4.air_temp')).toBe(paths.indexOf('plant.rst_n') - 1);
});

test('"Add all matching" adds every net the filter lets through that is not shown yet', async ({ page }) => {
  await loadGreenhouse(page);
  await page.locator('#net-filter-mode').selectOption('glob');
  await page.locator('#net-filter').fill('*.valve_cmd_n');
  await expect(page.locator('#net-count')).toHaveText('4 of 22 nets');
  await page.click('#add-matching');
  // zone1 and zone2 valves are among the ten lanes shown at first; zone3 and zone4 are new.
  await expect(page.locator('#notice')).toHaveText('added 2 nets');
  await expect(lane(page, 'plant.zone4.valve_cmd_n')).toBeVisible();
});

test('lanes reorder by their grip, group under a heading that folds, rename, change radix and show bits', async ({ page }) => {
  await loadPump(page);
  // Reorder: drag open_ack's grip above clk.
  const grip = caption(page, 'open_ack').locator('.cap-grip');
  const target = await caption(page, 'clk').boundingBox();
  await grip.hover();
  await page.mouse.down();
  await page.mouse.move(target!.x + 10, target!.y + 6, { steps: 8 });
  await page.mouse.up();
  await expect(page.locator('.cap .cap-name').first()).toHaveText('open_ack');

  // Group two chosen lanes (Ctrl-click the second), name the heading, fold it.
  await caption(page, 'clk').locator('.cap-name').click();
  await caption(page, 'enable').locator('.cap-name').click({ modifiers: ['Control'] });
  await page.keyboard.press('p');
  const rename = page.locator('.cap-rename');
  await expect(rename).toBeFocused();
  await rename.fill('timing');
  await rename.press('Enter');
  const heading = page.locator('.cap-group', { hasText: 'timing' });
  await expect(heading).toContainText('2 lanes');
  await heading.locator('.cap-twist').click();
  await expect(caption(page, 'clk')).toHaveCount(0);
  await heading.locator('.cap-twist').click();
  await expect(caption(page, 'clk')).toBeVisible();

  // Rename a lane by double-clicking its name; the value beside it stays.
  await caption(page, 'duty').locator('.cap-name').dblclick();
  await page.locator('.cap-rename').fill('pwm_duty');
  await page.keyboard.press('Enter');
  await expect(caption(page, 'pwm_duty')).toBeVisible();

  // Radix: put the active cursor at 70 ns, where duty holds 0x41 (fixture), then read it as ASCII.
  await page.locator('#goto-input').fill('70ns');
  await page.locator('#goto-input').press('Enter');
  await expect(caption(page, 'pwm_duty').locator('.cap-value')).toHaveText('41');
  await caption(page, 'pwm_duty').locator('.cap-more').click();
  await expect(page.locator('#panel-lane')).toBeVisible();
  await page.locator('#lane-radix').selectOption('ascii');
  await expect(caption(page, 'pwm_duty').locator('.cap-value')).toHaveText('A');
  await page.locator('#lane-radix').selectOption('unsigned');
  await expect(caption(page, 'pwm_duty').locator('.cap-value')).toHaveText('65');

  // Bits of the 4-bit state bus: state = 2 (0010) at 70 ns.
  await caption(page, 'state').locator('.cap-bits').click();
  for (const [b, v] of [['3', '0'], ['2', '0'], ['1', '1'], ['0', '0']]) {
    await expect(page.locator('.cap-bit', { hasText: `state[${b}]` }).locator('.cap-value')).toHaveText(v);
  }
  await settle(page);
});
