// Issue 5 in the browser: delay markers against the engine's own time. Measured only when the
// built page carries the measuring worker (workers/measure.worker.ts bundled as its own chunk,
// which happens once the viewer starts it); until then the section says so and sets no figure.
//
// Markers: in the Measure tab, choose two lanes (click one caption name, Ctrl-click the other),
// press "+ Delay"; the clock runs from that click to the end of the first viewer frame after the
// panel shows the result (the frame that draws the markers), synced with a 1×1 readPixels.
// Engine: the same delay measurement asked of a fresh copy of the page's own built measuring
// worker with comlink wire calls (setDump with the Dump of the last parse alone, then run()),
// which is the engine plus packing its items for the page; no panel, no canvas.

import type { Page } from 'playwright-core';
import type { BenchProbe } from './loading';
import { assetUrl } from './server';

export const NOT_AVAILABLE = 'not measured yet: measuring UI not available';

/** Whether the built page starts the measuring worker (its chunk is in dist/bench-web/assets). */
export function measuringUiBuilt(base: string): boolean {
  try {
    return assetUrl(base, 'measure.worker') !== null;
  } catch {
    return false; // no built page at all
  }
}

export interface MarkerTiming {
  ms: number;
  /** Pairs the panel counts (tPLH + tPHL). */
  pairs: number;
  primitivesBefore: number;
  primitivesAfter: number;
}

/** Chooses the lanes named `from` and `to` and adds a delay measurement with "+ Delay". */
export async function timeDelayMarkers(page: Page, from: string, to: string): Promise<MarkerTiming> {
  await page.click('#tab-measure');
  const name = (n: string) => page.locator('#captions .cap-name', { hasText: new RegExp(`^${n}$`) }).first();
  await name(from).click();
  await name(to).click({ modifiers: ['Control'] });
  await page.evaluate(() => new Promise<void>((r) => requestAnimationFrame(() => requestAnimationFrame(() => r()))));
  const t = await page.evaluate(
    () =>
      new Promise<{ ms: number; primitivesBefore: number; primitivesAfter: number; error: string }>((resolve) => {
        const stage = document.getElementById('stage') as HTMLElement;
        // The figures block is attached to the panel only once a result is in.
        const sheet = document.getElementById('sheet') as HTMLElement;
        if (document.querySelector('#measure-figures [data-fig]')) {
          resolve({ ms: NaN, primitivesBefore: NaN, primitivesAfter: NaN, error: 'a measurement is already shown' });
          return;
        }
        const canvas = document.querySelector('#canvas-host canvas') as HTMLCanvasElement;
        const gl = (canvas.getContext('webgl2') ?? canvas.getContext('webgl')) as WebGLRenderingContext;
        const px = new Uint8Array(4);
        const primitivesBefore = Number(stage.dataset.primitives);
        let shown = false;
        const onFigures = new MutationObserver(() => {
          if (document.querySelector('#measure-figures [data-fig$=".count"]')) shown = true;
        });
        onFigures.observe(sheet, { childList: true, subtree: true });
        const onFrame = new MutationObserver(() => {
          if (!shown) return;
          gl.readPixels(0, 0, 1, 1, gl.RGBA, gl.UNSIGNED_BYTE, px);
          const end = performance.now();
          onFigures.disconnect();
          onFrame.disconnect();
          resolve({ ms: end - start, primitivesBefore, primitivesAfter: Number(stage.dataset.primitives), error: '' });
        });
        onFrame.observe(stage, { attributes: true, attributeFilter: ['data-frames'] });
        const start = performance.now();
        (document.getElementById('measure-add-delay') as HTMLButtonElement).click();
        setTimeout(() => resolve({ ms: NaN, primitivesBefore, primitivesAfter: NaN, error: document.getElementById('measure-error')?.textContent || 'no result within 5 minutes' }), 300_000);
      }),
  );
  if (t.error) throw new Error(`delay measurement in the page: ${t.error}`);
  const pairs = await page.evaluate(() =>
    [...document.querySelectorAll<HTMLElement>('#measure-figures [data-fig$=".count"]')].reduce((n, el) => n + Number(el.dataset.value || 0), 0),
  );
  return { ms: t.ms, pairs, primitivesBefore: t.primitivesBefore, primitivesAfter: t.primitivesAfter };
}

export interface EngineTiming {
  /** Best of the timed runs. */
  ms: number;
  runs: number[];
  items: number;
}

/** The measuring worker's run() of one delay measurement on the kept Dump: one untimed, then `runs` timed. */
export async function timeEngineDelay(page: Page, workerUrl: string, from: string, to: string, runs: number): Promise<EngineTiming> {
  const r = await page.evaluate(
    async ([url, a, b, n]) => {
      const probe = (window as unknown as { __bench: BenchProbe }).__bench;
      if (!probe.dump) return { error: 'no Dump kept from a parse alone', runs: [] as number[], items: 0 };
      const worker = new Worker(url, { type: 'module', name: 'bench-measure' });
      // comlink 4 wire calls, as in loading.ts.
      const call = (fn: string, args: unknown[]) =>
        new Promise<{ type: string; value: unknown }>((resolve) => {
          const id = `bench-${Math.random()}`;
          const on = (ev: MessageEvent) => {
            if (ev.data?.id !== id) return;
            worker.removeEventListener('message', on);
            resolve(ev.data);
          };
          worker.addEventListener('message', on);
          worker.postMessage({ id, type: 'APPLY', path: [fn], argumentList: args.map((value) => ({ type: 'RAW', value })) });
        });
      try {
        const set = await call('setDump', [probe.dump]);
        if (set.type !== 'RAW') return { error: `setDump threw: ${JSON.stringify(set.value).slice(0, 200)}`, runs: [], items: 0 };
        const times: number[] = [];
        let items = 0;
        for (let k = 0; k <= n; k++) {
          const t = performance.now();
          const reply = await call('run', [{ id: `bench_delay_${k}`, kind: 'delay', from: a, to: b }]);
          const ms = performance.now() - t;
          const res = reply.value as { ok: boolean; error?: string; view?: { items?: { count: number } } };
          if (reply.type !== 'RAW' || !res.ok) return { error: `run() failed: ${res?.error ?? JSON.stringify(reply.value).slice(0, 200)}`, runs: [], items: 0 };
          items = res.view?.items?.count ?? 0;
          if (k > 0) times.push(ms); // the first warms the worker up
        }
        return { error: '', runs: times, items };
      } finally {
        worker.terminate();
      }
    },
    [workerUrl, from, to, runs] as const,
  );
  if (r.error) throw new Error(`the measuring worker: ${r.error}`);
  return { ms: Math.min(...r.runs), runs: r.runs, items: r.items };
}
