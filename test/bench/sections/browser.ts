// Section 4 (issues 4 and 5): the built viewer in headless Chromium with software WebGL
// (SwiftShader, stack recipe §2) at a 1920×1080 viewport, served by `vite preview`:
// frame times while panning and zooming with 64 shown nets at ~10 thousand and ~10 million
// changes in view, drop-to-first-traces against the parse alone on the big dump, and (once the
// measuring UI is in the page) delay markers and the glitch scan.

import { basename } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import type { ParseResult } from '../child/parseTask';
import { runChild } from '../child/spawnTask';
import { loadParser } from '../engines';
import { type SynthDump, synthDump } from '../gen/dumpCache';
import { type TimedScene, changesInView, median, panZoomFrames, percentile, showWholeDump, zoomBy } from '../browser/frames';
import { VIEWPORT, launchChromium, openViewer, webglRenderer } from '../browser/launch';
import { type DropResult, type ParseOnly, type ScanResult, installLoadProbes, timeDrop, timeParseOnly, waitScan } from '../browser/loading';
import { type EngineTiming, type MarkerTiming, NOT_AVAILABLE, measuringUiBuilt, timeDelayMarkers, timeEngineDelay } from '../browser/measuring';
import { type Preview, assetUrl, buildPage, startPreview } from '../browser/server';
import type { BenchOptions } from '../options';
import { fixed, heading, info, mb, table, target } from '../report';

const SECTION = 'browser';
/** Issue 4 targets. */
const MAX_FRAME_RATIO = 1.5;
const MAX_FRAME_MS = 60;
const MAX_DROP_RATIO = 1.3;
/** Issue 5 targets. */
const MAX_MARKER_RATIO = 1.5;
const MAX_GLITCH_SCAN_RATIO = 0.3;

const SHOWN_NETS = 64;
/**
 * Sizes of the 64-net synthetic dumps: the generator writes about 7.4 bytes per change at this
 * mix (1-bit nets, a few vectors and reals), so these hold about 10 thousand and 10 million changes.
 */
const FEW_MB = 0.074;
const MANY_MB = 74;

interface Scene extends TimedScene {
  label: string;
  /** null: the empty canvas, no dump open. */
  dump: SynthDump | null;
  canvas: { width: number; height: number };
}

/** A page of its own showing a dump's 64 nets over the whole run (or the empty canvas). */
async function openScene(browser: Browser, base: string, dump: SynthDump | null): Promise<Scene> {
  const page = await openViewer(browser, base);
  const shown = await showWholeDump(page, dump?.path ?? null);
  if ((await page.evaluate(() => document.visibilityState)) !== 'visible') throw new Error('a benchmark page is not visible, so its frames would be throttled');
  const label = dump === null ? 'empty canvas (no dump)' : `${SHOWN_NETS} nets, whole run`;
  return { page, frames: [], label, dump, canvas: shown.canvas };
}

function inView(s: Scene): number {
  const meta = s.dump?.meta;
  return meta ? median(s.frames.map((f) => changesInView(f, meta.changes, meta.endTick))) : 0;
}

function count(n: number): string {
  if (n >= 1e6) return `${fixed(n / 1e6)} M`;
  if (n >= 1e3) return `${fixed(n / 1e3)} k`;
  return fixed(n);
}

async function frameTimes(browser: Browser, base: string, opts: BenchOptions, renderer: string): Promise<void> {
  const frames = opts.quick ? 16 : 40;
  const few = synthDump(SHOWN_NETS, FEW_MB);
  const many = synthDump(SHOWN_NETS, MANY_MB);
  for (const d of [few, many]) {
    if (d.fresh) info(`generated ${basename(d.path)}: ${mb(d.meta.bytes)}, ${d.meta.changes} changes in ${fixed(d.meta.generatedMs / 1e3)} s`);
  }
  const scenes: Scene[] = [];
  let error = '';
  try {
    scenes.push(await openScene(browser, base, null));
    scenes.push(await openScene(browser, base, few));
    const whole = await openScene(browser, base, many);
    scenes.push(whole);
    await panZoomFrames(scenes, frames);
    // The same page zoomed 1000× around the middle: ~10 k changes in view of the big dump
    // (timed on its own, after the others; for the table, not a target).
    await zoomBy(whole.page, 1000);
    const zoomed: Scene = { ...whole, frames: [], label: `${SHOWN_NETS} nets, zoomed 1000×` };
    await panZoomFrames([zoomed], frames);
    scenes.push(zoomed);
  } catch (e) {
    error = (e as Error).message.split('\n')[0];
    info(`frame times not measured: ${error}`);
  } finally {
    for (const s of new Set(scenes.map((x) => x.page))) await s.context().close();
  }
  if (error) scenes.length = 0;
  if (scenes.length) {
    const c = scenes[0].canvas;
    info(`WebGL renderer: ${renderer}`);
    info(`canvas ${c.width}×${c.height} px at a ${VIEWPORT.width}×${VIEWPORT.height} viewport (net drawer hidden); ${frames} timed frames each after 4 untimed, scenes in turn`);
    table(
      ['scene', 'dump', 'changes in view', 'median ms', 'p90 ms', 'script ms', 'input ms', 'primitives', 'glitch marks'],
      scenes.map((s) => [
        s.label,
        s.dump ? `${basename(s.dump.path)} (${count(s.dump.meta.changes)} changes)` : '—',
        count(inView(s)),
        fixed(median(s.frames.map((f) => f.ms))),
        fixed(percentile(s.frames.map((f) => f.ms), 0.9)),
        fixed(median(s.frames.map((f) => f.scriptMs))),
        fixed(median(s.frames.map((f) => f.inputMs))),
        fixed(median(s.frames.map((f) => f.primitives))),
        s.dump ? fixed(median(s.frames.map((f) => f.glitchMarks))) : '—',
      ]),
    );
    info('frame = the viewer\'s animation-frame callback + a 1×1 gl.readPixels, timed inside one animation frame');
    info('  (gl.finish() returns early in Chromium); steps: wheel zoom in 10.5 %, shift-wheel pan 60 px, pan back,');
    info('  zoom out; script ms = the viewer\'s own data-frame-ms (JS part); input ms = the wheel handler, before the frame;');
    info('  changes in view = the dump\'s changes × the share of its run in the window (changes are spread evenly).');
  }
  const fewScene = scenes.find((s) => s.dump === few);
  const manyScene = scenes.find((s) => s.dump === many && s.label.endsWith('whole run'));
  const fewMs = fewScene ? median(fewScene.frames.map((f) => f.ms)) : null;
  const manyMs = manyScene ? median(manyScene.frames.map((f) => f.ms)) : null;
  target({
    section: SECTION,
    name: 'median frame at ~10 M ÷ at ~10 k changes in view',
    value: fewMs !== null && manyMs !== null ? manyMs / fewMs : null,
    limit: MAX_FRAME_RATIO,
    bound: 'max',
    unit: '',
    note: fewMs !== null && manyMs !== null ? `${fixed(manyMs)} ms ÷ ${fixed(fewMs)} ms` : error || 'not measured',
  });
  const worst = fewMs !== null && manyMs !== null ? Math.max(fewMs, manyMs) : null;
  target({
    section: SECTION,
    name: 'median frame, software WebGL, 1920×1080 (worse of the two)',
    value: worst,
    limit: MAX_FRAME_MS,
    bound: 'max',
    unit: ' ms',
    note: worst !== null ? (worst === manyMs ? '~10 M changes in view' : '~10 k changes in view') : error || 'not measured',
  });
}

function best<T extends { ms: number; error: string }>(xs: T[]): T | null {
  const ok = xs.filter((x) => !x.error && Number.isFinite(x.ms));
  return ok.length ? ok.reduce((a, b) => (b.ms < a.ms ? b : a)) : null;
}

/** Nets of the 100-net synthetic dump chosen for the delay measurement: the clock and the first 1-bit lane. */
const DELAY_FROM = 'clk';
const DELAY_TO = 'lane1';

interface Issue5 {
  scans: ScanResult[];
  markers: MarkerTiming | null;
  engine: EngineTiming | null;
  error: string;
}

async function dropToTraces(browser: Browser, base: string, opts: BenchOptions): Promise<void> {
  const size = opts.quick ? 10 : 100;
  const dump = synthDump(100, size);
  if (dump.fresh) info(`generated ${basename(dump.path)}: ${mb(dump.meta.bytes)}, ${dump.meta.changes} changes`);
  // One timed run of each: at 100 MB the viewer's background glitch scan after each drop takes
  // minutes on this machine, and a parse alone must not run beside it. A warm-up round on a small
  // dump first compiles both workers' code, so neither timed run is the cold one.
  const reps = 1;
  const warm = synthDump(100, opts.quick ? 5 : 10);
  const drops: DropResult[] = [];
  const alone: ParseOnly[] = [];
  const chatty: ParseOnly[] = [];
  const i5: Issue5 = { scans: [], markers: null, engine: null, error: '' };
  let error = '';
  const workerUrl = assetUrl(base, 'parse.worker');
  const measureUrl = assetUrl(base, 'measure.worker');
  let page: Page | null = null;
  try {
    if (!workerUrl) throw new Error('no parse.worker chunk in the built page');
    page = await openViewer(browser, base);
    await installLoadProbes(page);
    const w = await timeDrop(page, warm.path);
    if (w.error) throw new Error(`the viewer could not open ${basename(warm.path)}: ${w.error}`);
    await waitScan(page);
    await timeParseOnly(page, workerUrl, true);
    // Drop, then (after the viewer's glitch scan) the parse alone and with progress, in turn.
    for (let r = 0; r < reps; r++) {
      const d = await timeDrop(page, dump.path);
      if (d.error) throw new Error(`the viewer could not open ${basename(dump.path)}: ${d.error}`);
      drops.push(d);
      const scan = await waitScan(page);
      if (scan) i5.scans.push(scan);
      for (const [list, progress] of [[alone, false], [chatty, true]] as const) {
        const p = await timeParseOnly(page, workerUrl, progress);
        if (p.error) throw new Error(`parse in the page's worker failed: ${p.error}`);
        if (p.changes !== dump.meta.changes) info(`CHECK FAILED: the page's parse gave ${p.changes} changes, the generator wrote ${dump.meta.changes}`);
        list.push(p);
      }
    }
  } catch (e) {
    error = (e as Error).message.split('\n')[0];
    info(`drop-to-first-traces not measured: ${error}`);
  }
  if (page && !error && measureUrl) {
    try {
      i5.markers = await timeDelayMarkers(page, DELAY_FROM, DELAY_TO);
      const full = (n: string) => `bench.tile0.${n}`;
      i5.engine = await timeEngineDelay(page, measureUrl, full(DELAY_FROM), full(DELAY_TO), opts.quick ? 2 : 3);
    } catch (e) {
      i5.error = (e as Error).message.split('\n')[0];
      info(`delay markers not measured: ${i5.error}`);
    }
  }
  await page?.context().close();
  const d = best(drops);
  const p = best(alone);
  const c = best(chatty);
  const runs = (xs: { ms: number }[]) => xs.map((x) => fixed(x.ms)).join(', ');
  const speed = (ms: number) => fixed(dump.meta.bytes / 1e6 / (ms / 1e3));
  if (d && p && c) {
    info(`${basename(dump.path)}: ${mb(dump.meta.bytes)}, ${dump.meta.changes} changes, ${dump.meta.nets} nets (the viewer shows the first 10)`);
    table(
      ['in the page', 'best ms', 'MB/s', 'runs ms', 'what it covers'],
      [
        ['drop → first traces', fixed(d.ms), speed(d.ms), runs(drops), `change event → first frame after the Dump arrives, + readPixels (${fixed(d.primitives)} primitives)`],
        ['drop → Dump handed over', fixed(d.loadedMs), speed(d.loadedMs), drops.map((x) => fixed(x.loadedMs)).join(', '), "the viewer's loader: worker parse with its progress bar"],
        ['parse alone', fixed(p.ms), speed(p.ms), runs(alone), "same File, page's built parse worker, comlink call, no progress"],
        ['parse + progress round trips', fixed(c.ms), speed(c.ms), runs(chatty), `as above with a progress callback answered at once (${c.progressCalls} calls)`],
      ],
    );
    info(`one timed run each, in turn in one page, after a warm-up round on ${basename(warm.path)}; parse = read the File in pieces + parse + transfer the Dump back`);
  }
  if ((await loadParser()) !== null) {
    try {
      const n = await runChild<ParseResult>('parse', { path: dump.path }, { timeoutMs: 300_000 });
      info(`for scale: Node ${process.version} parse of the same file (src/parse/vcd.ts, fresh process, 16 MiB pieces): ${fixed(n.ms)} ms, ${speed(n.ms)} MB/s`);
    } catch (e) {
      info(`Node parse for scale failed: ${(e as Error).message.split('\n')[0]}`);
    }
  }
  target({
    section: SECTION,
    name: `drop → first traces ÷ parse alone (${size} MB)`,
    value: d && p ? d.ms / p.ms : null,
    limit: MAX_DROP_RATIO,
    bound: 'max',
    unit: '',
    note: d && p ? `${fixed(d.ms)} ms ÷ ${fixed(p.ms)} ms, parse alone in the page's own worker${opts.quick ? '; quick run: 10 MB dump' : ''}` : error || 'not measured',
  });
  measuringTargets(base, size, i5, p, error);
}

function measuringTargets(base: string, size: number, i5: Issue5, parse: ParseOnly | null, dropError: string): void {
  const landed = measuringUiBuilt(base);
  const scan = i5.scans.length ? i5.scans.reduce((a, b) => (b.ms < a.ms ? b : a)) : null;
  const { markers, engine } = i5;
  if (!landed) {
    info(`delay markers: ${NOT_AVAILABLE}`);
    info(`background glitch scan: ${NOT_AVAILABLE}`);
  }
  if (markers && engine) {
    info(
      `delay ${DELAY_FROM} → ${DELAY_TO}: choose two lanes, "+ Delay" → markers drawn ${fixed(markers.ms)} ms (${markers.pairs} pairs in the panel; ` +
        `frame primitives ${fixed(markers.primitivesBefore)} → ${fixed(markers.primitivesAfter)}); measuring worker run() alone best ${fixed(engine.ms)} ms ` +
        `(runs ${engine.runs.map(fixed).join(', ')}; ${engine.items} items)`,
    );
    if (engine.items !== markers.pairs) info(`CHECK FAILED: the panel counts ${markers.pairs} pairs, the worker returned ${engine.items} items`);
  }
  if (scan) info(`glitch scan after a drop (Dump handed over → result in the Glitches panel): ${i5.scans.map((x) => fixed(x.ms)).join(', ')} ms; panel: "${scan.text}"; "${scan.widthNote}"`);
  const why = (fallback: string) => (!landed ? NOT_AVAILABLE : dropError || i5.error || fallback);
  target({
    section: SECTION,
    name: `choose two nets → delay markers drawn ÷ engine measuring time (${size} MB)`,
    value: markers && engine ? markers.ms / engine.ms : null,
    limit: MAX_MARKER_RATIO,
    bound: 'max',
    unit: '',
    note: markers && engine ? `${fixed(markers.ms)} ms ÷ ${fixed(engine.ms)} ms; engine = the page's measuring worker run(), best warm run` : why('not measured'),
  });
  target({
    section: SECTION,
    name: `background glitch scan ÷ one parse (${size} MB)`,
    value: scan && parse ? scan.ms / parse.ms : null,
    limit: MAX_GLITCH_SCAN_RATIO,
    bound: 'max',
    unit: '',
    note: scan && parse ? `${fixed(scan.ms)} ms (panel says ${fixed(scan.workerMs)} ms in the worker) ÷ parse alone ${fixed(parse.ms)} ms` : why('not measured'),
  });
}

/** Every target as not measured, when the browser or the server could not start. */
function allUnmeasured(note: string, opts: BenchOptions): void {
  const size = opts.quick ? 10 : 100;
  target({ section: SECTION, name: 'median frame at ~10 M ÷ at ~10 k changes in view', value: null, limit: MAX_FRAME_RATIO, bound: 'max', unit: '', note });
  target({ section: SECTION, name: 'median frame, software WebGL, 1920×1080 (worse of the two)', value: null, limit: MAX_FRAME_MS, bound: 'max', unit: ' ms', note });
  target({ section: SECTION, name: `drop → first traces ÷ parse alone (${size} MB)`, value: null, limit: MAX_DROP_RATIO, bound: 'max', unit: '', note });
  measuringTargets('', size, { scans: [], markers: null, engine: null, error: note }, null, note);
}

export async function browserSection(opts: BenchOptions): Promise<void> {
  heading('Browser (issues 4/5): the built viewer in headless Chromium, software WebGL, 1920×1080 viewport');
  const began = Date.now();
  let browser: Browser | null = null;
  let preview: Preview | null = null;
  try {
    const built = buildPage();
    info(`page built into dist/bench-web in ${fixed(built.ms / 1e3)} s`);
    preview = await startPreview();
    browser = await launchChromium();
    info(`Chromium ${browser.version()} at ${preview.base}`);
  } catch (e) {
    const why = (e as Error).message.split('\n')[0];
    info(`browser section could not start: ${why}`);
    allUnmeasured(why, opts);
  }
  try {
    if (browser && preview) {
      const probe = await openViewer(browser, preview.base);
      const renderer = await webglRenderer(probe);
      await probe.context().close();
      await frameTimes(browser, preview.base, opts, renderer);
      await dropToTraces(browser, preview.base, opts);
    }
  } finally {
    await browser?.close();
    preview?.stop();
  }
  info(`browser section took ${fixed((Date.now() - began) / 1e3)} s`);
}
