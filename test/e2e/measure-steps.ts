// Steps of the measuring tests, done as a person would: open the iverilog sample, show nets from
// the drawer, pick nets from a trace's context menu, read the panel's figures, and run the CLI on
// the same dump to compare.

import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { type Page, expect } from '@playwright/test';
import { caption, openViewer, settle, windowOf } from './helpers';

export const ROOT = fileURLToPath(new URL('../../', import.meta.url));
export const SHOTS = fileURLToPath(new URL('./shots/', import.meta.url));
/** The built CLI (`npm run prepare`, run by `npm ci`). */
const CLI = process.env.MIDRAIL_CLI ?? ROOT + 'dist/cli/main.js';

/** `midrail <args> --json` on the same files the page opened, parsed. */
export function midrailJson<T = any>(...args: string[]): T {
  const r = spawnSync(process.execPath, [CLI, ...args, '--json'], { cwd: ROOT, encoding: 'utf8', maxBuffer: 64 << 20 });
  if (r.status !== 0 && r.status !== 1) throw new Error(`midrail ${args.join(' ')} exited ${r.status}: ${r.stderr}`);
  return JSON.parse(r.stdout) as T;
}

/** Opens a sample dump by address and waits for the background glitch scan to finish. */
export async function openSample(page: Page, name = 'sensor_hub.vcd'): Promise<void> {
  await openViewer(page, `?dump=samples/${name}`);
  await expect(page.locator('#file-name')).toHaveText(name);
  await expect(page.locator('#glitch-status')).toHaveAttribute('data-count', /^\d+$/);
}

/** Adds the first net the drawer lists for a filter text, and clears the filter. */
export async function showNet(page: Page, filter: string, name: string): Promise<void> {
  await page.locator('#net-filter').fill(filter);
  await expect(page.locator('.net-row:not([hidden])').first().locator('.net-name')).toHaveText(name);
  await page.locator('.net-row:not([hidden])').first().dblclick();
  await expect(caption(page, name)).toBeVisible();
  await page.locator('#net-filter').fill('');
}

/** Right-clicks a lane's trace and chooses a menu entry. */
export async function laneMenu(page: Page, lane: string, entry: string): Promise<void> {
  const box = (await caption(page, lane).boundingBox())!;
  await page.mouse.click(box.x + box.width + 120, box.y + 26, { button: 'right' });
  await page.locator(`#${entry}`).click();
}

/** The exact number behind a figure of the panel (seconds, hertz or a count). */
export async function figure(page: Page, name: string): Promise<number | null> {
  const v = await page.locator(`#measure-figures [data-fig="${name}"]`).getAttribute('data-value');
  return v === null || v === '' ? null : Number(v);
}

/** The tick at the middle of the canvas. */
export async function centreTick(page: Page): Promise<{ tick: number; tpp: number; tickSeconds: number }> {
  await settle(page);
  const w = await windowOf(page);
  return { tick: w.t0 + (w.tpp * w.width) / 2, tpp: w.tpp, tickSeconds: w.tickSeconds };
}
