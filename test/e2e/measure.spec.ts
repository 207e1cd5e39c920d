// Measuring in the viewer, on samples/sensor_hub.vcd: a dump iverilog wrote from an HDL whose gate
// delays are written in it (samples/README.md lists them, from samples/hdl/sensor_hub.v). The
// panel's figures must be those delays, and the same numbers `midrail delay --json` prints.

import { expect, test } from '@playwright/test';
import { caption, countColor, laneBody, settle, xOfSeconds } from './helpers';
import { SHOTS, centreTick, figure, laneMenu, midrailJson, openSample, showNet } from './measure-steps';

/** tPLH marker colour in the paper look (src/render/markers.ts). */
const RISE_MARK = 0x00785a;

test('two nets picked from the lane menu give tPLH and tPHL of the HDL buffer; the figures match the CLI; Worst centres the canvas on the worst pair', async ({ page }) => {
  await page.setViewportSize({ width: 1440, height: 860 });
  await openSample(page);
  await showNet(page, 'dut.clk_spi', 'clk_spi');
  await laneMenu(page, 'clk_ref', 'menu-delay-from');
  await laneMenu(page, 'clk_spi', 'menu-delay-to');
  await expect(page.locator('#tab-measure')).toHaveAttribute('aria-selected', 'true');
  // samples/README.md: u_clk.b_spi is a buf of 0.75 ns rise and fall (typical corner).
  await expect.poll(() => figure(page, 'tPLH.min_s')).toBe(0.75e-9);
  expect(await figure(page, 'tPLH.max_s')).toBe(0.75e-9);
  expect(await figure(page, 'tPHL.min_s')).toBe(0.75e-9);
  expect(await figure(page, 'tPHL.max_s')).toBe(0.75e-9);
  await expect(page.locator('#measure-caution')).toContainText('do not replace static timing analysis');

  // Settings are editable and measure again at once: the interrupt path with a 5 ns window.
  await page.locator('#m-from').fill('u_afe.level_hi');
  await page.locator('#m-from').press('Enter');
  await page.locator('#m-to').fill('dut.irq_n');
  await page.locator('#m-to').press('Enter');
  await page.locator('#m-window').fill('5ns');
  await page.locator('#m-window').press('Enter');
  // README: irq_n falls 1.05 ns after level_hi rises (or gate 0.50 ns + not gate 0.55 ns).
  await expect.poll(() => figure(page, 'tPHL.max_s')).toBe(1.05e-9);
  const cli = midrailJson('delay', 'samples/sensor_hub.vcd', '--from', 'u_afe.level_hi', '--to', 'dut.irq_n', '--window', '5ns');
  for (const kind of ['tPLH', 'tPHL'] as const) {
    for (const f of ['count', 'min_s', 'max_s', 'mean_s', 'std_s'] as const) expect(await figure(page, `${kind}.${f}`), `${kind}.${f}`).toBe(cli[kind][f]);
  }
  expect(await figure(page, 'tpd_s')).toBe(cli.tpd_s);
  expect(await figure(page, 'tskp_s')).toBe(cli.tskp_s);
  expect(await figure(page, 'fmax_hz')).toBe(cli.fmax_hz);

  // A histogram bar lists only its pairs: ⌈√13⌉ = 4 equal bins from the smallest to the largest delay.
  const delays = cli.pairs.map((p: any) => p.delay_s) as number[];
  const lo = Math.min(...delays);
  const inFirst = delays.filter((d) => d < lo + (Math.max(...delays) - lo) / 4).length;
  await page.locator('#measure-hist [data-bin="0"]').click();
  await expect(page.locator('#measure-table-note')).toContainText(`${inFirst} of ${delays.length} pairs`);
  await page.locator('#measure-hist [data-bin="0"]').click();
  await expect(page.locator('#measure-table-note')).toContainText(`${delays.length} pairs`);

  // Worst sorts the table largest first; clicking its first row centres the canvas on that pair.
  await page.click('#measure-worst');
  const worst = [...cli.pairs].sort((a: any, b: any) => b.delay_s - a.delay_s)[0];
  await expect(page.locator('#measure-table .mt-row[data-row="0"] .mt-td').nth(2)).toHaveText('1.62 ns');
  await page.locator('#measure-table .mt-row[data-row="0"]').click();
  const c = await centreTick(page);
  const middle = (worst.from_time_s + worst.to_time_s) / 2 / c.tickSeconds;
  expect(Math.abs(c.tick - middle)).toBeLessThanOrEqual(c.tpp);
  await expect(page.locator('#delta-readout')).toContainText('1.62 ns');
  // The delay marker is drawn across the irq_n lane between the two edges.
  const x = await xOfSeconds(page, (worst.from_time_s + worst.to_time_s) / 2);
  const body = await laneBody(page, 'irq_n');
  expect(await countColor(page, x, body.top, body.bottom, RISE_MARK)).toBeGreaterThan(0);
  await page.screenshot({ path: SHOTS + 'delay.png' });
});

test('skew of the four clock leaves: 0.37 ns on falling edges, 0.33 ns on rising ones, as the clock-tree delays give', async ({ page }) => {
  await page.setViewportSize({ width: 1440, height: 860 });
  await openSample(page);
  for (const n of ['clk_adc', 'clk_irq', 'clk_log']) await showNet(page, `dut.${n}`, n);
  await caption(page, 'clk_ref').locator('.cap-remove').click();
  await showNet(page, 'dut.clk_spi', 'clk_spi');
  await caption(page, 'clk_adc').locator('.cap-name').click();
  for (const n of ['clk_irq', 'clk_log', 'clk_spi']) await caption(page, n).locator('.cap-name').click({ modifiers: ['Control'] });
  await laneMenu(page, 'clk_spi', 'menu-skew');
  // samples/README.md: after a clk_ref rise clk_adc +0.42 … clk_spi +0.75 ns; after a fall +0.39 … +0.76 ns.
  await expect.poll(() => figure(page, 'max_skew_s')).toBeCloseTo(0.37e-9, 18);
  await page.locator('#m-edge').selectOption('rise');
  await expect.poll(() => figure(page, 'max_skew_s')).toBeCloseTo(0.33e-9, 18);
  const cli = midrailJson('skew', 'samples/sensor_hub.vcd', '--nets', 'dut.clk_adc,dut.clk_irq,dut.clk_log,dut.clk_spi', '--edge', 'rise');
  expect(await figure(page, 'max_skew_s')).toBe(cli.max_skew_s);
  expect(await figure(page, 'mean_skew_s')).toBe(cli.mean_skew_s);
  await page.click('#measure-worst');
  const c = await centreTick(page);
  const first = cli.events[0];
  expect(Math.abs(c.tick - (first.time_s + first.skew_s / 2) / c.tickSeconds)).toBeLessThanOrEqual(2 * c.tpp);
  await page.screenshot({ path: SHOTS + 'skew.png' });
});

test('glitch marks: below 1 ns the three flash-select hazards and the EEPROM decode glitch, below 0.5 ns only the latter; Next and Previous step through them', async ({ page }) => {
  await page.setViewportSize({ width: 1440, height: 860 });
  await openSample(page);
  await page.click('#tab-glitches');
  // The documented default: 10 % of clk_ref's 20 ns period.
  await expect(page.locator('#glitch-width-note')).toContainText('Width 2 ns — default: 10% of the shortest clock-like period (clk_ref, 20 ns)');
  await showNet(page, 'u_dec.flash_sel', 'flash_sel');
  await showNet(page, 'dut.cs_eeprom_n', 'cs_eeprom_n');
  const stage = page.locator('#stage');
  /** The glitch count the drawer shows beside a net (0 when it shows none). */
  const badge = async (filter: string, name: string) => {
    await page.locator('#net-filter').fill(filter);
    const row = page.locator('.net-row:not([hidden])').first();
    await expect(row.locator('.net-name')).toHaveText(name);
    const b = row.locator('.net-badge');
    return (await b.isVisible()) ? Number(await b.textContent()) : 0;
  };

  await page.locator('#glitch-width').fill('1ns');
  await page.locator('#glitch-width').press('Enter');
  await expect(page.locator('#glitch-width-note')).toContainText('Width 1 ns — set by you');
  // samples/README.md: flash_sel drops for 0.60 ns at 230.9, 1070.9 and 1930.9 ns (+0.55 ns);
  // cs_eeprom_n goes low for 0.40 ns at 1610.9 ns (+0.42 ns). Whole dump in view: four marks.
  await expect(stage).toHaveAttribute('data-glitch-marks', '4');
  expect(await badge('u_dec.flash_sel', 'flash_sel')).toBe(3);
  expect(await badge('dut.cs_eeprom_n', 'cs_eeprom_n')).toBe(1);

  await page.locator('#glitch-width').fill('0.5ns');
  await page.locator('#glitch-width').press('Enter');
  await expect(page.locator('#glitch-width-note')).toContainText('Width 500 ps');
  await expect(stage).toHaveAttribute('data-glitch-marks', '1');
  expect(await badge('u_dec.flash_sel', 'flash_sel')).toBe(0);
  expect(await badge('dut.cs_eeprom_n', 'cs_eeprom_n')).toBe(1);
  await page.locator('#net-filter').fill('');

  await page.locator('#glitch-width').fill('1ns');
  await page.locator('#glitch-width').press('Enter');
  await expect(stage).toHaveAttribute('data-glitch-marks', '4');
  // The active cursor starts at half the dump (1.5175 us): the next glitch is the EEPROM one.
  await page.click('#glitch-next');
  await expect(page.locator('#glitch-at')).toContainText('cs_eeprom_n low, 400 ps at 1.61132 us');
  // Next: a runt of the ADC's real input (runts are marked whatever their width), then the third
  // flash-select hazard; the EEPROM glitch's second name (port and wire) is stepped over.
  await page.click('#glitch-next');
  await expect(page.locator('#glitch-at')).toContainText('analog runt');
  await page.click('#glitch-next');
  await expect(page.locator('#glitch-at')).toContainText('flash_sel low, 600 ps at 1.93145 us');
  const c = await centreTick(page);
  expect(Math.abs(c.tick - (1931.45e-9 + 0.3e-9) / c.tickSeconds)).toBeLessThanOrEqual(c.tpp);
  await page.click('#glitch-prev');
  await expect(page.locator('#glitch-at')).toContainText('analog runt');
  await page.click('#glitch-next');
  // For the picture: the flash chip select too, and the whole run.
  await showNet(page, 'dut.cs_flash_n', 'cs_flash_n');
  await page.click('#zoom-fit');
  await settle(page);
  await page.screenshot({ path: SHOTS + 'glitches.png' });
});
