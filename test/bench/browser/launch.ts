// Headless Chromium for the browser section: Debian's chromium (or CHROMIUM_PATH) with the
// software-WebGL flags of the stack recipe, the same list the Playwright tests use, and a
// 1920×1080 page at device scale 1 (canvas pixels = CSS pixels).

import { type Browser, type Page, chromium } from 'playwright-core';
import { chromiumArgs, chromiumPath } from '../../../playwright.config';

export const VIEWPORT = { width: 1920, height: 1080 };

export async function launchChromium(): Promise<Browser> {
  return chromium.launch({ executablePath: chromiumPath ?? '/usr/bin/chromium', args: chromiumArgs, headless: true });
}

/** A fresh context (empty storage, so no remembered view) with one page, opened at the viewer. */
export async function openViewer(browser: Browser, base: string): Promise<Page> {
  const context = await browser.newContext({ viewport: VIEWPORT, deviceScaleFactor: 1 });
  const page = await context.newPage();
  const problems: string[] = [];
  page.on('pageerror', (e) => problems.push(e.message));
  await page.goto(base + '/');
  await page.waitForFunction(() => Number(document.getElementById('stage')?.dataset.frames) > 0, undefined, { timeout: 30_000 });
  const renderer = await page.locator('#renderer-name').textContent();
  if (renderer !== 'WebGL') throw new Error(`the page is not drawing with WebGL (it says '${renderer}'); check the Chromium flags`);
  if (problems.length) throw new Error(`page error on start: ${problems[0]}`);
  return page;
}

/** Lets queued animation frames run, so the page is idle before the next step. */
export async function settle(page: Page): Promise<void> {
  await page.evaluate(() => new Promise<void>((r) => requestAnimationFrame(() => requestAnimationFrame(() => r()))));
}

/** What WebGL runs on in this page (SwiftShader is the software renderer the targets are for). */
export async function webglRenderer(page: Page): Promise<string> {
  return page.evaluate(() => {
    const gl = document.createElement('canvas').getContext('webgl2');
    if (!gl) return 'no WebGL 2';
    const ext = gl.getExtension('WEBGL_debug_renderer_info');
    return String(ext ? gl.getParameter(ext.UNMASKED_RENDERER_WEBGL) : gl.getParameter(gl.RENDERER));
  });
}
