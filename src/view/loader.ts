// Loading dumps through the parse worker, with a progress bar (bytes, rate, cancel).
// The dump on screen is left alone until a new one has parsed completely.

import * as Comlink from 'comlink';
import type { Dump } from '../model/dump';
import type { ParseApi, ParseFailure, ParseResult } from '../../workers/parse.worker';
import { formatBytes } from './dom';

export interface LoaderHooks {
  loaded(dump: Dump): void;
  failed(name: string, error: ParseFailure): void;
}

export interface ProgressParts {
  box: HTMLElement;
  fill: HTMLElement;
  text: HTMLElement;
  cancel: HTMLButtonElement;
}

export class Loader {
  private worker: Worker | null = null;
  private api: Comlink.Remote<ParseApi> | null = null;
  private job = 0;
  busy = false;

  constructor(
    private readonly ui: ProgressParts,
    private readonly hooks: LoaderHooks,
  ) {
    ui.cancel.addEventListener('click', () => this.cancel());
  }

  private start(): Comlink.Remote<ParseApi> {
    // A load still running is abandoned: its worker goes, with whatever it held.
    if (this.busy) this.dropWorker();
    if (!this.api) {
      this.worker = new Worker(new URL('../../workers/parse.worker.ts', import.meta.url), { type: 'module', name: 'midrail-parse' });
      this.api = Comlink.wrap<ParseApi>(this.worker);
    }
    return this.api;
  }

  private dropWorker(): void {
    this.api?.[Comlink.releaseProxy]();
    this.worker?.terminate();
    this.worker = null;
    this.api = null;
  }

  openFile(file: File): Promise<void> {
    const api = this.start();
    // ?readThreads=N sets how many threads read a big file (1: in one piece), to compare.
    const threads = Number(new URLSearchParams(window.location.search).get('readThreads')) || undefined;
    return this.track(file.name, file.size, (cb) => api.parseFile(file, file.name, cb, threads));
  }

  /** Opens a same-origin URL; anything else is refused before a request is made. */
  openUrl(raw: string): Promise<void> {
    let url: URL;
    try {
      url = new URL(raw, window.location.href);
    } catch {
      this.hooks.failed(raw, { message: `'${raw}' is not a URL`, line: null, offset: null, cancelled: false });
      return Promise.resolve();
    }
    const name = decodeURIComponent(url.pathname.split('/').pop() || raw);
    if (url.origin !== window.location.origin) {
      this.hooks.failed(name, { message: `${raw}: only dumps from this site can be opened by address (midrail sends nothing elsewhere); open the file with “Open dump…” instead`, line: null, offset: null, cancelled: false });
      return Promise.resolve();
    }
    const api = this.start();
    return this.track(name, 0, (cb) => api.parseUrl(url.href, name, cb));
  }

  cancel(): void {
    if (!this.busy) return;
    void this.api?.cancel();
  }

  private async track(name: string, size: number, go: (cb: (d: number, t: number) => void) => Promise<ParseResult>): Promise<void> {
    const job = ++this.job;
    this.busy = true;
    const began = performance.now();
    const { box, fill, text } = this.ui;
    box.hidden = false;
    box.dataset.state = 'running';
    fill.style.width = '0%';
    text.textContent = `${name}: starting…`;
    const progress = (done: number, total: number) => {
      if (job !== this.job) return;
      const secs = Math.max(1e-3, (performance.now() - began) / 1000);
      const t = total || size;
      fill.style.width = t > 0 ? `${Math.min(100, (100 * done) / t).toFixed(1)}%` : '100%';
      box.classList.toggle('is-unsized', !(t > 0));
      text.textContent = `${name}: ${formatBytes(done)}${t > 0 ? ` of ${formatBytes(t)}` : ''} · ${formatBytes(done / secs)}/s`;
    };
    let result: ParseResult;
    try {
      result = await go(Comlink.proxy(progress));
    } catch (e) {
      result = { ok: false, error: { message: `${name}: the loader stopped: ${(e as Error).message}`, line: null, offset: null, cancelled: false } };
    }
    if (job !== this.job) return;
    this.busy = false;
    box.hidden = true;
    box.dataset.state = 'idle';
    // How the last dump was read, for anyone checking (tests, a curious user in devtools).
    box.dataset.readThreads = result.ok ? String(result.threads) : '';
    if (result.ok) this.hooks.loaded(result.dump);
    else this.hooks.failed(name, result.error);
  }
}
