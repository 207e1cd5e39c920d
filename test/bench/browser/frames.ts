// Frame times of the trace canvas while panning and zooming (issue 4).
//
// One frame = the viewer's own animation-frame callback (decimate, build geometry, app.render())
// plus a 1×1 gl.readPixels on the pixi canvas (preserveDrawingBuffer is on, src/render/stage.ts),
// which waits for the software GPU to finish; gl.finish() returns early in Chromium, so it is not
// used (stack recipe §6, §9). No hook in the page is needed: the wheel event is dispatched
// synchronously, so the viewer's frame callback is queued between two of ours in the same
// animation frame; the first takes the start time, the last reads the pixel and the end time.
// Only the time inside that one animation frame counts, so the long rAF gaps seen in headless
// Chromium (recipe §9.2) do not enter the figure.

import { basename } from 'node:path';
import type { Page } from 'playwright-core';
import { settle } from './launch';

/** A wheel step over the traces: deltaY zooms around the pointer; with shift it pans by deltaY px. */
interface Step {
  dy: number;
  pan: boolean;
}

/** Zoom in 10.5 %, pan 60 px later, pan back, zoom out: the window stays near where it started. */
const CYCLE: Step[] = [
  { dy: -40, pan: false },
  { dy: 60, pan: true },
  { dy: -60, pan: true },
  { dy: 40, pan: false },
];

export interface FrameSample {
  /** Viewer frame + readPixels, ms. */
  ms: number;
  /** The viewer's own script time for the frame (data-frame-ms): building and submitting. */
  scriptMs: number;
  /** Handling the wheel event (window change, captions), before the frame. */
  inputMs: number;
  /** Frames the viewer drew in that animation frame (must be 1). */
  drawn: number;
  primitives: number;
  /** Glitch marks drawn in the frame (issue 5's background scan), NaN without the measuring UI. */
  glitchMarks: number;
  t0: number;
  tpp: number;
  width: number;
}

export interface SceneInfo {
  canvas: { width: number; height: number };
  notice: string;
}

/**
 * Loads a dump through the file input, shows every net (Add all matching), hides the net drawer
 * and fits. Without a dump, only hides the drawer: the empty canvas gives the fixed cost of a frame.
 */
export async function showWholeDump(page: Page, path: string | null): Promise<SceneInfo> {
  let notice = '';
  if (path) {
    const name = basename(path);
    await page.setInputFiles('#file-input', path);
    await page.waitForFunction((n) => document.getElementById('file-name')?.textContent === n, name, { timeout: 180_000, polling: 200 });
    await settle(page);
    // The background glitch scan (issue 5) runs in a worker after a load; frames are timed after it.
    if ((await page.locator('#glitch-status').count()) > 0) {
      await page.waitForFunction(() => { const g = document.getElementById('glitch-status'); return !!g?.dataset.count || /could not/.test(g?.textContent ?? ''); }, undefined, { timeout: 300_000, polling: 200 });
    }
    await page.click('#add-matching');
    notice = (await page.locator('#notice').textContent()) ?? '';
  }
  await page.click('#drawer-toggle');
  if (path) await page.click('#zoom-fit');
  await settle(page);
  const canvas = await page.locator('#canvas-host canvas').evaluate((c) => ({ width: (c as HTMLCanvasElement).width, height: (c as HTMLCanvasElement).height }));
  return { canvas, notice };
}

async function oneFrame(page: Page, step: Step): Promise<FrameSample> {
  await settle(page);
  return page.evaluate(
    (s) =>
      new Promise<FrameSample>((resolve, reject) => {
        const stage = document.getElementById('stage') as HTMLElement;
        const lanes = document.getElementById('lanes') as HTMLElement;
        const canvas = document.querySelector('#canvas-host canvas') as HTMLCanvasElement;
        const gl = (canvas.getContext('webgl2') ?? canvas.getContext('webgl')) as WebGLRenderingContext | null;
        if (!gl) {
          reject(new Error('no WebGL context on the pixi canvas'));
          return;
        }
        const px = new Uint8Array(4);
        const before = Number(stage.dataset.frames);
        let start = 0;
        requestAnimationFrame(() => (start = performance.now()));
        const box = lanes.getBoundingClientRect();
        const a = performance.now();
        lanes.dispatchEvent(
          new WheelEvent('wheel', { deltaY: s.dy, shiftKey: s.pan, clientX: box.left + box.width / 2, clientY: box.top + 60, bubbles: true, cancelable: true }),
        );
        const inputMs = performance.now() - a;
        requestAnimationFrame(() => {
          gl.readPixels(0, 0, 1, 1, gl.RGBA, gl.UNSIGNED_BYTE, px);
          const end = performance.now();
          const d = stage.dataset;
          resolve({
            ms: end - start,
            scriptMs: Number(d.frameMs),
            inputMs,
            drawn: Number(d.frames) - before,
            primitives: Number(d.primitives),
            glitchMarks: d.glitchMarks === undefined ? NaN : Number(d.glitchMarks),
            t0: Number(d.t0),
            tpp: Number(d.tpp),
            width: Number(d.width),
          });
        });
      }),
    step,
  );
}

/** Zooms in around the middle of the canvas by `factor` in one wheel step (untimed). */
export async function zoomBy(page: Page, factor: number): Promise<void> {
  // pointer.ts: factor = exp(-deltaY · 0.0025) for a plain wheel step.
  await oneFrame(page, { dy: -Math.log(factor) / 0.0025, pan: false });
}

export interface TimedScene {
  page: Page;
  frames: FrameSample[];
}

/**
 * Untimed warm-up frames, then `count` timed frames in each scene, cycling zoom in, pan, pan
 * back, zoom out. The scenes take turns frame by frame, so a burst of load from elsewhere on the
 * machine falls on all of them alike and their ratio holds.
 */
export async function panZoomFrames(scenes: TimedScene[], count: number, warmup = 4): Promise<void> {
  for (let i = 0; i < warmup; i++) for (const s of scenes) await oneFrame(s.page, CYCLE[i % CYCLE.length]);
  for (let i = 0; i < count; i++) {
    for (const s of scenes) {
      const f = await oneFrame(s.page, CYCLE[i % CYCLE.length]);
      if (f.drawn !== 1) throw new Error(`a timed animation frame drew ${f.drawn} viewer frames instead of 1`);
      s.frames.push(f);
    }
  }
}

export function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length === 0 ? NaN : s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

export function percentile(xs: number[], p: number): number {
  const s = [...xs].sort((a, b) => a - b);
  return s.length === 0 ? NaN : s[Math.min(s.length - 1, Math.floor(p * s.length))];
}

/**
 * Changes inside a frame's window. The synthetic dumps spread their changes evenly in time by
 * construction (gen/synthVcd.ts: random steps between timestamps, a random count at each), so
 * the share of the run in view times the dump's change count is a fair estimate.
 */
export function changesInView(f: FrameSample, changes: number, endTick: number): number {
  const t1 = f.t0 + f.tpp * f.width;
  const seen = Math.max(0, Math.min(t1, endTick) - Math.max(f.t0, 0));
  return (changes * seen) / endTick;
}
