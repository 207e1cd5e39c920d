// Drop-to-first-traces against the parse alone, both in the same page (issue 4).
//
// Drop: from the file input's change event (what setInputFiles fires, as a picker or a drop
// would hand the viewer a File) to the end of the first viewer frame after the loader reports
// the dump ready, synced with a 1×1 readPixels. That covers reading the file in slices, parsing
// in the worker with progress round trips, transferring the Dump, setting up lanes and drawing.
// Parse alone: the same File handed to the page's own built parse worker (the same chunk the
// viewer starts), called with comlink's wire messages directly, without progress: reading,
// parsing and the transfer back, nothing else. The worker is started before the clock runs.

import type { Page } from 'playwright-core';

export interface DropResult {
  ms: number;
  /** From the change event to the loader handing the Dump over (parse worker round trip). */
  loadedMs: number;
  primitives: number;
  error: string;
}

export interface ParseOnly {
  ms: number;
  changes: number;
  /** Progress callbacks the worker made (and awaited). */
  progressCalls: number;
  error: string;
}

export interface BenchProbe {
  drop: number;
  loaded: number;
  traces: number;
  primitives: number;
  /** When the background glitch scan's result showed (issue 5), and its status line. */
  scanned: number;
  scanText: string;
  file: File | null;
  worker: Worker | null;
  /** The Dump of the last parse alone, kept for the measuring worker's own timing. */
  dump: unknown;
}

export interface ScanResult {
  /** From the loader handing the Dump over to the scan's result in the Glitches panel. */
  ms: number;
  /** The scan's own time, as the panel reports it ("searched in N ms"). */
  workerMs: number;
  text: string;
  /** The panel's note on the width used (the default, from the dump's clock-like nets). */
  widthNote: string;
}

/** Installs the probes once per page: the change event, the progress box closing, the first frame after. */
export async function installLoadProbes(page: Page): Promise<void> {
  await page.evaluate(() => {
    const w = window as unknown as { __bench: BenchProbe };
    w.__bench = { drop: 0, loaded: 0, traces: 0, primitives: 0, scanned: 0, scanText: '', file: null, worker: null, dump: null };
    const b = w.__bench;
    // Capture phase on the document runs before the viewer's own listener clears the input.
    document.addEventListener(
      'change',
      (e) => {
        const input = e.target as HTMLInputElement;
        if (input.id !== 'file-input' || !input.files?.[0]) return;
        b.drop = performance.now();
        b.file = input.files[0];
      },
      true,
    );
    const progress = document.getElementById('progress') as HTMLElement;
    new MutationObserver(() => {
      // The loader hides the box and hands the Dump over in the same task.
      if (b.drop > 0 && b.loaded === 0 && progress.hidden) b.loaded = performance.now();
    }).observe(progress, { attributes: true, attributeFilter: ['hidden'] });
    const stage = document.getElementById('stage') as HTMLElement;
    const canvas = document.querySelector('#canvas-host canvas') as HTMLCanvasElement;
    const gl = (canvas.getContext('webgl2') ?? canvas.getContext('webgl')) as WebGLRenderingContext;
    const px = new Uint8Array(4);
    new MutationObserver(() => {
      if (b.loaded === 0 || b.traces !== 0) return;
      gl.readPixels(0, 0, 1, 1, gl.RGBA, gl.UNSIGNED_BYTE, px);
      b.traces = performance.now();
      b.primitives = Number(stage.dataset.primitives);
    }).observe(stage, { attributes: true, attributeFilter: ['data-frames'] });
    // The Glitches panel sets data-count on its status line when a scan's result arrives.
    const status = document.getElementById('glitch-status');
    if (status) {
      new MutationObserver(() => {
        if (b.loaded === 0 || b.scanned !== 0 || !status.dataset.count) return;
        b.scanned = performance.now();
        b.scanText = status.textContent ?? '';
      }).observe(status, { attributes: true, attributeFilter: ['data-count'] });
    }
  });
}

/** Waits for the background glitch scan after a drop; null when the page has no Glitches panel. */
export async function waitScan(page: Page): Promise<ScanResult | null> {
  if ((await page.locator('#glitch-status').count()) === 0) return null;
  await page.waitForFunction(() => (window as unknown as { __bench: BenchProbe }).__bench.scanned > 0, undefined, { timeout: 300_000, polling: 100 });
  return page.evaluate(() => {
    const b = (window as unknown as { __bench: BenchProbe }).__bench;
    const m = /searched in (\d+) ms/.exec(b.scanText);
    return { ms: b.scanned - b.loaded, workerMs: m ? Number(m[1]) : NaN, text: b.scanText, widthNote: document.getElementById('glitch-width-note')?.textContent ?? '' };
  });
}

export async function timeDrop(page: Page, path: string): Promise<DropResult> {
  await page.evaluate(() => {
    const b = (window as unknown as { __bench: BenchProbe }).__bench;
    b.drop = b.loaded = b.traces = b.primitives = b.scanned = 0;
    b.scanText = '';
  });
  await page.setInputFiles('#file-input', path);
  await page.waitForFunction(
    () => {
      const b = (window as unknown as { __bench: BenchProbe }).__bench;
      return b.traces > 0 || !(document.getElementById('error-panel') as HTMLElement).hidden;
    },
    undefined,
    { timeout: 300_000, polling: 100 },
  );
  return page.evaluate(() => {
    const b = (window as unknown as { __bench: BenchProbe }).__bench;
    const panel = document.getElementById('error-panel') as HTMLElement;
    const error = panel.hidden ? '' : (document.getElementById('error-text')?.textContent ?? 'error');
    return { ms: b.traces - b.drop, loadedMs: b.loaded - b.drop, primitives: b.primitives, error };
  });
}

/**
 * Parses the File last dropped, in the page's parse worker (kept between calls, as the viewer
 * keeps its own). With `progress`, a comlink proxy callback is passed as the viewer's loader
 * does, and answered at once with no page work, so its cost is the worker's awaited round trips.
 */
export async function timeParseOnly(page: Page, workerUrl: string, progress: boolean): Promise<ParseOnly> {
  return page.evaluate(
    async ([url, withProgress]) => {
      const b = (window as unknown as { __bench: BenchProbe }).__bench;
      if (!b.file) return { ms: NaN, changes: 0, progressCalls: 0, error: 'no file was dropped first' };
      b.worker ??= new Worker(url, { type: 'module', name: 'bench-parse' });
      const worker = b.worker;
      // comlink 4 wire format: { id, type: 'APPLY', path, argumentList: [{ type: 'RAW', value } or
      // { type: 'HANDLER', name: 'proxy', value: MessagePort }] }; the reply carries the same id
      // and { type: 'RAW', value } (or a 'throw' HANDLER). A proxy's calls arrive on its port the same way.
      const call = (fn: string, args: unknown[], transfer: Transferable[] = []) =>
        new Promise<{ type: string; value: unknown }>((resolve) => {
          const id = `bench-${Math.random()}`;
          const on = (ev: MessageEvent) => {
            if (ev.data?.id !== id) return;
            worker.removeEventListener('message', on);
            resolve(ev.data);
          };
          worker.addEventListener('message', on);
          worker.postMessage({ id, type: 'APPLY', path: [fn], argumentList: args }, transfer);
        });
      await call('cancel', []); // started and listening; run() clears the flag when the parse begins
      const args: unknown[] = [
        { type: 'RAW', value: b.file },
        { type: 'RAW', value: b.file.name },
      ];
      const transfer: Transferable[] = [];
      let progressCalls = 0;
      let channel: MessageChannel | null = null;
      if (withProgress) {
        const ch = new MessageChannel();
        channel = ch;
        ch.port1.onmessage = (ev) => {
          progressCalls++;
          ch.port1.postMessage({ id: ev.data?.id, type: 'RAW', value: undefined });
        };
        args.push({ type: 'HANDLER', name: 'proxy', value: ch.port2 });
        transfer.push(ch.port2);
      }
      const t = performance.now();
      const reply = await call('parseFile', args, transfer);
      const ms = performance.now() - t;
      channel?.port1.close();
      if (reply.type !== 'RAW') return { ms, changes: 0, progressCalls, error: `the worker threw: ${JSON.stringify(reply.value).slice(0, 200)}` };
      const res = reply.value as { ok: boolean; dump?: { changes: number }; error?: { message: string } };
      b.dump = res.ok ? res.dump : null;
      return res.ok ? { ms, changes: res.dump!.changes, progressCalls, error: '' } : { ms, changes: 0, progressCalls, error: res.error!.message };
    },
    [workerUrl, progress] as const,
  );
}
