// Measures off the main thread, so the page never freezes: delay, skew and the glitch scan of
// every loaded net, the order of big tables, and the worst-case sheet's .xlsx and CSV.
// The page hands over the Dump it already holds: on a cross-origin isolated page its arrays sit on
// SharedArrayBuffers and arrive here as the same memory (one copy for both); otherwise they are
// copied by structured clone. Results go back as typed arrays, transferred.

import * as Comlink from 'comlink';
import type { Dump } from '../src/model/dump';
import { provenanceFor, toCsv, delaySheet, glitchSheet, skewSheet, type MeasurementSheet, writeXlsx } from '../src/report/index';
import type { DelayResult, GlitchResult, SkewResult } from '../src/measure/types';
import type { MeasurementSpec } from '../src/plan/types';
import { parseTime } from '../src/model/units';
import { defaultGlitchWidth } from '../src/view/measure/clockguess';
import { type RowFilter, type SortKey, orderItems } from '../src/view/measure/order';
import { delayRun, glitchRun, skewRun, verdictRun } from '../src/view/measure/runs';
import { GLITCH_SCAN_ID, type GlitchView, type Items, type LimitValues, type MeasureView, type RunResult, type WidthChoice } from '../src/view/measure/types';
import { type WorstRow, worstSheets } from '../src/view/measure/worstrows';

// exceljs's bundled regenerator assigns a global by name; in a module (strict) that needs the
// name to exist first, or it falls back to Function(), which the page's CSP forbids.
(self as unknown as Record<string, unknown>).regeneratorRuntime ??= undefined;

/** Most rows of one measurement written to an export (the full table is in the viewer). */
const EXPORT_ROWS = 100_000;

let dump: Dump | null = null;
interface Kept {
  items: Items;
  limits: LimitValues;
  sheet: () => MeasurementSheet;
}
const kept = new Map<string, Kept>();

function need(): Dump {
  if (!dump) throw new Error('no dump is loaded in the measuring worker');
  return dump;
}

function buffersOf(v: unknown, out: Set<ArrayBuffer> = new Set()): ArrayBuffer[] {
  if (ArrayBuffer.isView(v)) {
    if (v.buffer instanceof ArrayBuffer) out.add(v.buffer);
  } else if (v && typeof v === 'object') {
    for (const x of Object.values(v)) buffersOf(x, out);
  }
  return [...out];
}

/**
 * The reply carrying a view to the page, every array in it transferred, not copied. Comlink
 * transfers what is listed for the value returned itself, so the list goes on the reply. The
 * items are copied first (typed-array copies, not a structured clone): the worker keeps its own
 * for sorting and export; nothing else in a view is kept here.
 */
function reply<V extends MeasureView | GlitchView>(view: V): { ok: true; view: V } {
  const out = 'items' in view ? { ...view, items: copyItems(view.items) } : view;
  return Comlink.transfer({ ok: true as const, view: out }, buffersOf(out));
}

function copyItems(it: Items): Items {
  return { count: it.count, start: it.start.slice(), end: it.end.slice(), time: it.time.slice(), value: it.value.slice(), kind: it.kind.slice(), flags: it.flags.slice() };
}

function message(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

const cap = (s: MeasurementSheet): MeasurementSheet =>
  s.rows.length > EXPORT_ROWS ? { ...s, rows: s.rows.slice(0, EXPORT_ROWS), settings: [...s.settings, ['rows written', `${EXPORT_ROWS} worst of ${s.rows.length}`]] } : s;

const api = {
  /** Takes the page's dump; returns whether its memory is shared with the page. */
  setDump(d: Dump): { shared: boolean } {
    dump = d;
    kept.clear();
    return { shared: typeof SharedArrayBuffer === 'function' && d.times.buffer instanceof SharedArrayBuffer };
  },

  /** One measurement of the viewer (a plan measurement): its figures and every item. */
  run(spec: MeasurementSpec, levels?: Record<string, string>): RunResult {
    try {
      const d = need();
      let view: MeasureView;
      if (spec.kind === 'delay') {
        const r = delayRun(d, spec, levels);
        const result: DelayResult = r.result;
        kept.set(spec.id, { items: r.view.items, limits: r.view.limits, sheet: () => delaySheet(result) });
        view = r.view;
      } else if (spec.kind === 'skew') {
        const r = skewRun(d, spec, levels);
        const result: SkewResult = r.result;
        kept.set(spec.id, { items: r.view.items, limits: r.view.limits, sheet: () => skewSheet(result) });
        view = r.view;
      } else view = verdictRun(d, spec, levels);
      return reply(view);
    } catch (e) {
      return { ok: false, error: message(e) };
    }
  },

  /** The glitch scan of every net and bit; `width` null = the default (clockguess.ts). */
  scan(width: string | null, level?: string): { ok: true; view: GlitchView } | { ok: false; error: string } {
    try {
      const d = need();
      let choice: WidthChoice;
      if (width === null) choice = defaultGlitchWidth(d);
      else {
        const s = parseTime(width);
        if (!(s > 0)) throw new Error(`the glitch width must be a positive time, not '${width}'`);
        choice = { seconds: s, source: 'given', clock: null, periodS: null };
      }
      const r = glitchRun(d, choice, level);
      const result: GlitchResult = r.result;
      kept.set(GLITCH_SCAN_ID, { items: r.view.items, limits: { min: null, max: null, unit: 's' }, sheet: () => glitchSheet(result) });
      return reply(r.view);
    } catch (e) {
      return { ok: false, error: message(e) };
    }
  },

  /** Table order of a measurement's items (null when the measurement is gone). */
  order(id: string, key: SortKey, descending: boolean, filter: RowFilter): Uint32Array | null {
    const k = kept.get(id);
    if (!k) return null;
    const order = orderItems(k.items, key, descending, filter, k.limits);
    return Comlink.transfer(order, [order.buffer as ArrayBuffer]);
  },

  /**
   * The worst-case sheet, and the full table of each measurement it draws from (as `midrail`
   * writes them), as .xlsx bytes with a provenance sheet (`source` is the dump file, for its
   * SHA-256) or as CSV text.
   */
  async book(rows: WorstRow[], format: 'xlsx' | 'csv', source: Blob | string | null, toolVersion: string): Promise<Uint8Array | string> {
    const d = need();
    const sheets = worstSheets(rows);
    for (const id of [...new Set(rows.map((r) => (r.kind === 'glitch' ? GLITCH_SCAN_ID : r.measurement)))]) {
      const k = kept.get(id);
      if (k) sheets.push(cap(k.sheet()));
    }
    if (format === 'csv') return toCsv(sheets);
    let bytes = new Uint8Array(0);
    if (source instanceof Blob) bytes = new Uint8Array(await source.arrayBuffer());
    else if (typeof source === 'string') bytes = new Uint8Array(await (await fetch(source, { credentials: 'same-origin' })).arrayBuffer());
    const prov = await provenanceFor(d, bytes, toolVersion);
    const book = await writeXlsx(sheets, prov);
    return Comlink.transfer(book, [book.buffer as ArrayBuffer]);
  },
};

export type MeasureApi = typeof api;

Comlink.expose(api);
