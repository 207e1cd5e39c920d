// A big dump opened in the viewer is read by several Web Workers at once (src/parse/parts.ts,
// workers/parsePart.worker.ts) where the machine has the cores; ?readThreads=N sets the count so
// this 2-core machine takes that path too. What the page shows must not depend on it. The dump is
// invented (test/bigDump.ts); the check is one read against the other.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { expect, test } from '@playwright/test';
import { writeBigDump } from '../bigDump';
import { caption, loadFile, openViewer, pumpVcd } from './helpers';

let dir = '';
let big = '';

test.beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'midrail-e2e-threads-'));
  big = join(dir, 'rig.vcd');
  writeBigDump(big, 40, '#900000000000\n');
});

test.afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

async function openBig(page: import('@playwright/test').Page, threads: number): Promise<string> {
  await openViewer(page, `?readThreads=${threads}`);
  await page.setInputFiles('#file-input', big);
  await expect(page.locator('#file-name')).toHaveText('rig.vcd', { timeout: 60_000 });
  await expect(page.locator('#progress')).toHaveAttribute('data-read-threads', String(threads));
  return (await page.locator('#dump-info').textContent()) ?? '';
}

test('a big dump read by two workers shows what one worker shows', async ({ page }) => {
  test.setTimeout(120_000);
  const one = await openBig(page, 1);
  expect(one).toMatch(/28 nets · [\d,]+ changes · ends at/);
  const two = await openBig(page, 2);
  expect(two).toBe(one);
});

test('Cancel stops a read in parts, and the dump shown before stays', async ({ page }) => {
  test.setTimeout(120_000);
  await openViewer(page, '?readThreads=2');
  await loadFile(page, 'pump.vcd', pumpVcd());
  await page.setInputFiles('#file-input', big);
  await expect(page.locator('#progress')).toBeVisible();
  await page.click('#progress-cancel');
  await expect(page.locator('#notice')).toHaveText('loading rig.vcd cancelled; the dump shown before stays open');
  await expect(page.locator('#file-name')).toHaveText('pump.vcd');
  await expect(caption(page, 'enable')).toBeVisible();
});
