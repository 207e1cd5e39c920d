// Shared steps for the viewer's browser tests: open the page, load a dump as a person would,
// wait for the canvas to draw, and read pixels back from the WebGL canvas.

import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { type Locator, type Page, expect } from '@playwright/test';

export const FIXTURES = fileURLToPath(new URL('./fixtures/', import.meta.url));
export const pumpVcd = () => readFileSync(FIXTURES + 'pump.vcd');

/** Trace colours of the paper look, palette order (src/render/theme.ts). */
export const PAPER_TRACES = [0x0b5fa5, 0xb86e00, 0x2b8cc4, 0x9a3f86, 0x007a62, 0x8a7400, 0x2a2925];
export const PAPER_BACKGROUND = 0xf7f4ec;
export const RULER_H = 30;

export async function openViewer(page: Page, query = ''): Promise<void> {
  await page.goto('/' + query);
  await expect(page.locator('#stage')).toHaveAttribute('data-frames', /\d+/);
}

/** Lets queued animation frames run, so the canvas shows the latest state. */
export async function settle(page: Page): Promise<void> {
  await page.evaluate(() => new Promise<void>((r) => requestAnimationFrame(() => requestAnimationFrame(() => r()))));
}

export async function loadFile(page: Page, name: string, buffer: Buffer): Promise<void> {
  await page.setInputFiles('#file-input', { name, mimeType: 'application/octet-stream', buffer });
  await expect(page.locator('#file-name')).toHaveText(name);
  await settle(page);
}

export async function loadPump(page: Page): Promise<void> {
  await openViewer(page);
  await loadFile(page, 'pump.vcd', pumpVcd());
}

/** A lane's caption, found by its displayed name. */
export function caption(page: Page, name: string): Locator {
  return page.locator('.cap').filter({ has: page.locator('.cap-name', { hasText: new RegExp(`^${name.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}$`) }) });
}

export interface Window {
  t0: number;
  tpp: number;
  tickSeconds: number;
  scrollTop: number;
  /** Canvas width in CSS pixels. */
  width: number;
}

export async function windowOf(page: Page): Promise<Window> {
  const d = await page.locator('#stage').evaluate((el) => ({ ...(el as HTMLElement).dataset }));
  return { t0: Number(d.t0), tpp: Number(d.tpp), tickSeconds: Number(d.tickSeconds), scrollTop: Number(d.scrollTop), width: Number(d.width) };
}

/** Canvas x of a time in seconds. */
export async function xOfSeconds(page: Page, seconds: number): Promise<number> {
  const w = await windowOf(page);
  return (seconds / w.tickSeconds - w.t0) / w.tpp;
}

/** Canvas y range of a lane's trace body (below its caption strip). */
export async function laneBody(page: Page, name: string): Promise<{ top: number; bottom: number }> {
  const cap = await caption(page, name).boundingBox();
  const canvas = await page.locator('#canvas-host canvas').boundingBox();
  if (!cap || !canvas) throw new Error(`lane ${name} is not on screen`);
  const top = cap.y - canvas.y;
  return { top: top + 17, bottom: top + 37 };
}

/** RGB of canvas pixels in one column from y0 to y1 (CSS px = device px in these tests). */
export async function columnPixels(page: Page, x: number, y0: number, y1: number): Promise<number[]> {
  return page.locator('#canvas-host canvas').evaluate(
    (el, [cx, a, b]) => {
      const canvas = el as HTMLCanvasElement;
      const gl = (canvas.getContext('webgl2') ?? canvas.getContext('webgl')) as WebGLRenderingContext;
      const h = b - a + 1;
      const px = new Uint8Array(4 * h);
      gl.readPixels(cx, canvas.height - 1 - b, 1, h, gl.RGBA, gl.UNSIGNED_BYTE, px);
      const out: number[] = [];
      // readPixels rows run bottom-up; return them top-down.
      for (let i = h - 1; i >= 0; i--) out.push((px[4 * i] << 16) | (px[4 * i + 1] << 8) | px[4 * i + 2]);
      return out;
    },
    [Math.floor(x), Math.floor(y0), Math.floor(y1)] as const,
  );
}

export function near(a: number, b: number, tol = 24): boolean {
  return Math.abs((a >> 16) - (b >> 16)) <= tol && Math.abs(((a >> 8) & 255) - ((b >> 8) & 255)) <= tol && Math.abs((a & 255) - (b & 255)) <= tol;
}

/** How many pixels of a column, between y0 and y1, are the given colour. */
export async function countColor(page: Page, x: number, y0: number, y1: number, color: number): Promise<number> {
  return (await columnPixels(page, x, y0, y1)).filter((p) => near(p, color)).length;
}

/** RGB of canvas pixels in one row from x0 to x1. */
export async function rowPixels(page: Page, y: number, x0: number, x1: number): Promise<number[]> {
  return page.locator('#canvas-host canvas').evaluate(
    (el, [cy, a, b]) => {
      const canvas = el as HTMLCanvasElement;
      const gl = (canvas.getContext('webgl2') ?? canvas.getContext('webgl')) as WebGLRenderingContext;
      const w = b - a + 1;
      const px = new Uint8Array(4 * w);
      gl.readPixels(a, canvas.height - 1 - cy, w, 1, gl.RGBA, gl.UNSIGNED_BYTE, px);
      const out: number[] = [];
      for (let i = 0; i < w; i++) out.push((px[4 * i] << 16) | (px[4 * i + 1] << 8) | px[4 * i + 2]);
      return out;
    },
    [Math.floor(y), Math.floor(x0), Math.floor(x1)] as const,
  );
}

/** enable is the second lane of pump.vcd, so it takes the second trace colour. */
const ENABLE = PAPER_TRACES[1];

/** Checks on screen that the enable trace has its rising edge at 10 ns and nowhere near it. */
export async function expectEnableEdgeAt10ns(page: Page): Promise<void> {
  await settle(page);
  const x = await xOfSeconds(page, 10e-9);
  const body = await laneBody(page, 'enable');
  // The rising edge is a vertical run of trace colour across the lane body at x…
  expect(await countColor(page, x, body.top + 3, body.bottom - 3, ENABLE)).toBeGreaterThan(10);
  // …and a few pixels to either side the body is empty between the two levels.
  expect(await countColor(page, x - 5, body.top + 3, body.bottom - 3, ENABLE)).toBe(0);
  expect(await countColor(page, x + 5, body.top + 3, body.bottom - 3, ENABLE)).toBe(0);
  // Low before the edge, high after it.
  expect(await countColor(page, x - 8, body.bottom - 4, body.bottom, ENABLE)).toBeGreaterThan(0);
  expect(await countColor(page, x + 8, body.top - 1, body.top + 2, ENABLE)).toBeGreaterThan(0);
}
