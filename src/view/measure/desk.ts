// The measuring desk: the viewer's measurements (a measurement plan, item for item), their results
// from the worker, their marks on the canvas, the background glitch scan, the worst-case sheet,
// plan files in and out, and the measuring part of the saved view. The panels (measurepanel.ts,
// glitchpanel.ts, sheetpanel.ts) and the lane menu only call into this and redraw on its events.

import type { Dump } from '../../model/dump';
import { formatTime } from '../../model/units';
import { PAIR_KINDS } from '../../measure/index';
import { PLAN_FORMAT, PLAN_VERSION, type MeasurementSpec, type Plan } from '../../plan/types';
import { PlanError, formatPlan, parsePlan, planIssues } from '../../plan/validate';
import { DelayLayer, GlitchLayer, SkewLayer } from '../../render/markers';
import { charWidth } from '../../render/sink';
import type { Stage } from '../../render/stage';
import type { SideSheet } from '../sheet';
import type { NetLane, Row, ViewState } from '../state';
import { MeasureClient } from './client';
import { GLITCH_SCAN_ID, VIOLATES, type GlitchView, type MeasureView, type NetPick } from './types';
import type { MeasurePart } from './viewpart';
import { type RowSource, type WorstRow, rowOf, rowsToTsv, worstItems } from './worstrows';

/** Rows "Add worst to sheet" takes from one measurement. */
export const WORST_ROWS = 10;

export interface Entry {
  spec: MeasurementSpec;
  view: MeasureView | null;
  error: string | null;
  running: boolean;
  version: number;
  layer: DelayLayer | SkewLayer | null;
  /** Indices of violating items, in time order. */
  violations: Int32Array;
}

export interface GlitchScan {
  /** The width the user typed; null = the documented default. */
  width: string | null;
  view: GlitchView | null;
  error: string | null;
  running: boolean;
  version: number;
  /** Count limits (a glitch measurement of the plan limits the number found). */
  min: number | null;
  max: number | null;
  /** Glitches per net path, for the drawer. */
  perPath: Map<string, number>;
  focus: number;
}

export type DeskEvent = 'list' | 'entry' | 'glitch' | 'sheet' | 'plan';

export interface DeskHooks {
  state: ViewState;
  stage: Stage;
  sheet: SideSheet;
  notice(text: string, ms?: number): void;
  /** Rebuild the canvas scene (marks changed). */
  redraw(): void;
  refreshDrawer(): void;
  /** Store the view in the browser (the measurements are part of it). */
  remember(): void;
}

export function shortName(label: string): string {
  return label.split('.').pop() ?? label;
}

function downloadBytes(name: string, data: Uint8Array | string, type: string): void {
  const url = URL.createObjectURL(new Blob([data as BlobPart], { type }));
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
}

export class MeasureDesk {
  readonly client = new MeasureClient();
  entries: Entry[] = [];
  chosen: string | null = null;
  sheetRows: WorstRow[] = [];
  planInfo: { name?: string; description?: string; levels?: Record<string, string> } = {};
  /** One-line verdict of the last plan opened. */
  planNote = '';
  readonly glitch: GlitchScan = { width: null, view: null, error: null, running: false, version: 0, min: null, max: null, perPath: new Map(), focus: -1 };
  readonly glitchLayer: GlitchLayer;
  /** The dump file (for the workbook's provenance: its SHA-256), and the one being loaded. */
  origin: Blob | string | null = null;
  nextOrigin: Blob | string | null = null;
  /** Net waiting for its partner, picked with "Delay from this net" in the lane menu. */
  pendingFrom: string | null = null;
  private listeners: Array<(e: DeskEvent) => void> = [];
  private dumpSource: string | null = null;
  private restored = false;
  private glitchTargets: { byKey: Map<string, number>; bySignal: Map<number, number[]> } | null = null;

  constructor(readonly hooks: DeskHooks) {
    const st = hooks.state;
    this.glitchLayer = new GlitchLayer(() => st.theme);
    this.glitchLayer.onDrawn = (s) => {
      const stage = document.getElementById('stage');
      if (stage) stage.dataset.glitchMarks = String(s.drawn);
    };
    hooks.stage.markers.push(this.glitchLayer);
    st.on((what) => {
      if (what.has('dump') && st.dump) this.dumpChanged(st.dump);
      else if (what.has('lanes')) this.relane();
    });
  }

  on(fn: (e: DeskEvent) => void): void {
    this.listeners.push(fn);
  }

  private emit(e: DeskEvent): void {
    for (const fn of this.listeners) fn(e);
  }

  get state(): ViewState {
    return this.hooks.state;
  }

  get tickSeconds(): number {
    return this.state.tickSeconds;
  }

  entry(id: string | null): Entry | null {
    return this.entries.find((e) => e.spec.id === id) ?? null;
  }

  // ---- dump -----------------------------------------------------------------------------------

  private dumpChanged(dump: Dump): void {
    const same = dump.source === this.dumpSource;
    if (!this.restored && !same) {
      this.clearAll();
      this.glitch.width = null;
      this.glitch.min = this.glitch.max = null;
    }
    this.restored = false;
    this.dumpSource = dump.source;
    // An address is kept absolute: the worker resolves relative ones against its own script.
    const next = this.nextOrigin;
    this.origin = typeof next === 'string' ? new URL(next, window.location.href).href : next;
    this.glitch.view = null;
    this.glitch.focus = -1;
    this.glitchTargets = null;
    this.glitchLayer.data = null;
    for (const e of this.entries) {
      e.view = null;
      if (e.layer) e.layer.data = null;
    }
    void this.client.setDump(dump).then((r) => {
      const el = document.getElementById('stage');
      if (el) el.dataset.measureShared = String(r.shared);
    });
    this.emit('list');
    this.runAll();
    void this.scan();
  }

  private clearAll(): void {
    for (const e of this.entries) this.dropLayer(e);
    this.entries = [];
    this.chosen = null;
    this.sheetRows = [];
    this.planInfo = {};
    this.planNote = '';
    this.pendingFrom = null;
  }

  // ---- levels and lanes -------------------------------------------------------------------------

  /** Reference levels: the plan's, then each real lane's own (as the lane panel sets it). */
  levels(): Record<string, string> | undefined {
    const out: Record<string, string> = { ...(this.planInfo.levels ?? {}) };
    for (const l of this.state.allNetLanes()) if (l.level) out[l.path] = l.level;
    return Object.keys(out).length ? out : undefined;
  }

  /** Row keys of the shown lanes that carry a net (a bit falls back to its vector's lane). */
  rowsOf(pick: NetPick): string[] {
    const exact: string[] = [];
    const whole: string[] = [];
    for (const r of this.state.rows()) {
      if ((r.kind !== 'net' && r.kind !== 'bit') || !r.net || r.net.signal !== pick.signal) continue;
      const bit = r.kind === 'bit' ? r.bit : (r.lane as NetLane).bit;
      if (bit === pick.bit) exact.push(r.key);
      else if (bit === null && pick.bit !== null) whole.push(r.key);
    }
    return exact.length ? exact : whole;
  }

  /** Makes sure each net has a lane (adds the missing ones at the end). */
  private showNets(labels: string[]): void {
    const st = this.state;
    const shown = st.shownPaths();
    const add: string[] = [];
    for (const l of labels) {
      const path = l.replace(/\[-?\d+\]$/, '');
      const net = st.netOf(path);
      if (!net) continue;
      const sameSignal = [...shown].some((p) => st.netOf(p)?.signal === net.signal);
      if (!sameSignal && !add.includes(path)) add.push(path);
    }
    if (add.length) {
      const keep = new Set(st.selected);
      const focus = st.focus;
      st.batch(() => {
        st.addNets(add);
        st.selected = keep;
        st.focus = focus;
        st.changed('selection');
      });
    }
  }

  private relane(): void {
    for (const e of this.entries) this.layerData(e);
    this.hooks.redraw();
  }

  // ---- measurements -----------------------------------------------------------------------------

  /** A fresh measurement id from a stem (letters, digits, _ . -). */
  freshId(stem: string): string {
    const base = (stem.replace(/[^A-Za-z0-9_.-]+/g, '_').replace(/^[^A-Za-z0-9]+/, '') || 'm').slice(0, 56);
    let id = base;
    for (let k = 2; this.entries.some((e) => e.spec.id === id) || id === GLITCH_SCAN_ID; k++) id = `${base}_${k}`;
    return id;
  }

  /** Problems of a measurement as a plan would have them: [field, message] or null. */
  problem(spec: MeasurementSpec): [string, string] | null {
    const issues = planIssues({ format: PLAN_FORMAT, version: PLAN_VERSION, measurements: [spec] });
    if (issues.length === 0) return null;
    const path = issues[0].path.replace(/^\$\.measurements\[0\]\.?/, '');
    return [path.split(/[.[]/)[0] || 'measurement', issues[0].message];
  }

  add(spec: MeasurementSpec, choose = true): Entry | null {
    const p = this.problem(spec);
    if (p) {
      this.hooks.notice(`${p[0]}: ${p[1]}`);
      return null;
    }
    const e: Entry = { spec, view: null, error: null, running: false, version: 0, layer: null, violations: new Int32Array(0) };
    this.entries.push(e);
    if (choose) this.chosen = spec.id;
    this.emit('list');
    void this.runEntry(e);
    this.hooks.remember();
    return e;
  }

  addDelay(from: string, to: string): Entry | null {
    return this.add({ id: this.freshId(`delay_${shortName(from)}_${shortName(to)}`), kind: 'delay', from, to });
  }

  addSkew(nets: string): Entry | null {
    const first = nets.split(',')[0]?.trim() ?? 'group';
    return this.add({ id: this.freshId(`skew_${shortName(first).replace(/[*?]/g, '')}`), kind: 'skew', nets });
  }

  /** Replaces a measurement's settings; a setting a plan would refuse is refused with its message. */
  update(id: string, spec: MeasurementSpec): string | null {
    const e = this.entry(id);
    if (!e) return 'that measurement is gone';
    const p = this.problem(spec);
    if (p) return `${p[0]}: ${p[1]}`;
    if (spec.id !== id && this.entries.some((x) => x !== e && x.spec.id === spec.id)) return `id: '${spec.id}' is taken by another measurement`;
    e.spec = spec;
    if (this.chosen === id) this.chosen = spec.id;
    this.emit('list');
    void this.runEntry(e);
    this.hooks.remember();
    return null;
  }

  remove(id: string): void {
    const e = this.entry(id);
    if (!e) return;
    this.dropLayer(e);
    this.entries = this.entries.filter((x) => x !== e);
    if (this.chosen === id) this.chosen = this.entries[0]?.spec.id ?? null;
    this.emit('list');
    this.hooks.redraw();
    this.hooks.remember();
  }

  choose(id: string): void {
    this.chosen = id;
    this.emit('list');
  }

  private dropLayer(e: Entry): void {
    if (!e.layer) return;
    const i = this.hooks.stage.markers.indexOf(e.layer);
    if (i >= 0) this.hooks.stage.markers.splice(i, 1);
    e.layer = null;
  }

  private runAll(): void {
    for (const e of this.entries) void this.runEntry(e);
  }

  private async runEntry(e: Entry): Promise<void> {
    if (!this.state.dump) return;
    const version = ++e.version;
    const gen = this.client.generation;
    e.running = true;
    this.emit('entry');
    const r = await this.client.run(e.spec, this.levels());
    if (gen !== this.client.generation || version !== e.version || !this.entries.includes(e)) return;
    e.running = false;
    if (r.ok) {
      e.view = r.view;
      e.error = r.view.kind === 'verdict' && r.view.outcome.status === 'error' ? r.view.outcome.message : null;
      if (r.view.kind !== 'verdict') {
        const f = r.view.items.flags;
        const v: number[] = [];
        for (let i = 0; i < r.view.items.count; i++) if (f[i] & VIOLATES) v.push(i);
        e.violations = Int32Array.from(v);
        this.showNets(r.view.kind === 'delay' ? [r.view.from.label, r.view.to.label] : r.view.nets.map((n) => n.label));
      }
    } else {
      e.view = null;
      e.error = r.error;
    }
    this.layerData(e);
    this.emit('entry');
    this.hooks.redraw();
  }

  /** Points the entry's canvas layer at its items and the lanes now showing its nets. */
  private layerData(e: Entry): void {
    const v = e.view;
    if (!v || v.kind === 'verdict') {
      if (e.layer) e.layer.data = null;
      return;
    }
    const theme = () => this.state.theme;
    const cw = () => charWidth;
    const focus = e.layer && 'data' in e.layer && e.layer.data ? e.layer.data.focus : -1;
    if (v.kind === 'delay') {
      if (!(e.layer instanceof DelayLayer)) {
        this.dropLayer(e);
        e.layer = new DelayLayer(`delay:${e.spec.id}`, theme, cw);
        this.hooks.stage.markers.push(e.layer);
      }
      const items = v.items;
      e.layer.data = {
        items,
        fromRows: this.rowsOf(v.from),
        toRows: this.rowsOf(v.to),
        violations: e.violations,
        focus: focus < items.count ? focus : -1,
        label: (i) => `${(items.flags[i] & VIOLATES) !== 0 ? '! ' : ''}${PAIR_KINDS[items.kind[i]]} ${formatTime(items.value[i], 4)}`,
      };
    } else {
      if (!(e.layer instanceof SkewLayer)) {
        this.dropLayer(e);
        e.layer = new SkewLayer(`skew:${e.spec.id}`, theme, cw);
        this.hooks.stage.markers.push(e.layer);
      }
      const items = v.items;
      let maxSpan = 0;
      for (let i = 0; i < items.count; i++) maxSpan = Math.max(maxSpan, items.end[i] - items.start[i]);
      e.layer.data = {
        items,
        rows: [...new Set(v.nets.flatMap((n) => this.rowsOf(n)))],
        maxSpan,
        focus: focus < items.count ? focus : -1,
        label: (i) => `${(items.flags[i] & VIOLATES) !== 0 ? '! ' : ''}skew ${formatTime(items.value[i], 4)}`,
      };
    }
  }

  // ---- jumping to an item -------------------------------------------------------------------------

  /**
   * Centres the canvas on [startTick, endTick], zoomed so the span fills the middle fifth, and puts
   * the reference cursor on the start and the active cursor on the end (Δ then reads the value).
   */
  jump(startTick: number, endTick: number): void {
    const st = this.state;
    const a = Math.min(startTick, endTick);
    const b = Math.max(startTick, endTick);
    const span = b - a;
    st.batch(() => {
      if (span > 0) st.setWindow(a - 2 * span, b + 2 * span);
      else st.centreOn(a);
      if (st.cursors.length > 1 && st.reference !== st.active) st.moveCursor(st.reference, a);
      st.moveCursor(st.active, b);
    });
  }

  /** Jumps to item i of a measurement and marks it on the canvas. */
  jumpToItem(id: string, i: number): void {
    const e = this.entry(id);
    const v = e?.view;
    if (!e || !v || v.kind === 'verdict' || i < 0 || i >= v.items.count) return;
    if (e.layer?.data) e.layer.data.focus = i;
    this.jump(v.items.start[i], v.items.end[i]);
    this.hooks.redraw();
  }

  // ---- worst-case sheet ---------------------------------------------------------------------------

  rowSource(id: string): RowSource | null {
    const ts = this.tickSeconds;
    if (id === GLITCH_SCAN_ID) {
      const g = this.glitch.view;
      if (!g) return null;
      return { id, kind: 'glitch', items: g.items, limits: { min: null, max: null, unit: 's' }, nets: (i) => g.targets[g.target[i]]?.label ?? '?', tickSeconds: ts };
    }
    const e = this.entry(id);
    const v = e?.view;
    if (!e || !v || v.kind === 'verdict') return null;
    if (v.kind === 'delay') {
      const nets = `${v.from.label} -> ${v.to.label}`;
      return { id, kind: 'delay', items: v.items, limits: v.limits, nets: () => nets, fromDir: v.fromDir, tickSeconds: ts };
    }
    const group = v.nets.map((n) => n.label).join(', ');
    return { id, kind: 'skew', items: v.items, limits: v.limits, nets: () => group, tickSeconds: ts };
  }

  addRows(rows: WorstRow[]): number {
    const key = (r: WorstRow) => `${r.measurement}|${r.nets}|${r.edge}|${r.time_s}|${r.value_s}`;
    const have = new Set(this.sheetRows.map(key));
    let n = 0;
    for (const r of rows) {
      if (have.has(key(r))) continue;
      have.add(key(r));
      this.sheetRows.push(r);
      n++;
    }
    this.emit('sheet');
    this.hooks.remember();
    this.hooks.notice(n === 0 ? 'those rows are already on the worst-case sheet' : `${n} row${n === 1 ? '' : 's'} added to the worst-case sheet`);
    return n;
  }

  addItem(id: string, i: number): void {
    const src = this.rowSource(id);
    if (src) this.addRows([rowOf(src, i)]);
  }

  /** The measurement's worst rows (by margin when limited), or only those of one kind. */
  addWorst(id: string, kind?: number): void {
    const src = this.rowSource(id);
    if (!src) return;
    const only = kind === undefined ? src : { ...src, items: { ...src.items, flags: src.items.flags.map((f, i) => (src.items.kind[i] === kind ? f : 0)) } };
    this.addRows(worstItems(only, WORST_ROWS).map((i) => rowOf(src, i)));
  }

  removeRow(k: number): void {
    this.sheetRows.splice(k, 1);
    this.emit('sheet');
    this.hooks.remember();
  }

  clearSheet(): void {
    this.sheetRows = [];
    this.emit('sheet');
    this.hooks.remember();
  }

  async copySheet(): Promise<void> {
    if (this.sheetRows.length === 0) {
      this.hooks.notice('the worst-case sheet is empty: add rows from a measurement first');
      return;
    }
    try {
      await navigator.clipboard.writeText(rowsToTsv(this.sheetRows));
      this.hooks.notice(`${this.sheetRows.length} rows copied as tab-separated text`);
    } catch (e) {
      this.hooks.notice(`could not copy to the clipboard: ${(e as Error).message}`);
    }
  }

  private baseName(): string {
    return (this.state.dump?.source ?? 'midrail').replace(/\.gz$/i, '').replace(/\.vcd$/i, '');
  }

  async exportSheet(format: 'xlsx' | 'csv'): Promise<void> {
    if (this.sheetRows.length === 0) {
      this.hooks.notice('the worst-case sheet is empty: add rows from a measurement first');
      return;
    }
    try {
      const data = await this.client.book(this.sheetRows, format, this.origin, __MIDRAIL_VERSION__);
      const name = `${this.baseName()}.worst.${format}`;
      downloadBytes(name, data, format === 'xlsx' ? 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet' : 'text/csv');
      this.hooks.notice(`worst-case sheet exported as ${name}`);
    } catch (e) {
      this.hooks.notice(`could not export the sheet: ${(e as Error).message}`);
    }
  }

  // ---- glitch scan ------------------------------------------------------------------------------

  async scan(): Promise<void> {
    const g = this.glitch;
    if (!this.state.dump) return;
    const version = ++g.version;
    const gen = this.client.generation;
    g.running = true;
    this.emit('glitch');
    const r = await this.client.scan(g.width);
    if (gen !== this.client.generation || version !== g.version) return;
    g.running = false;
    g.focus = -1;
    if (r.ok) {
      g.view = r.view;
      g.error = null;
      g.perPath = new Map();
      const v = r.view;
      for (let t = 0; t < v.targets.length; t++) {
        const n = v.targetStart[t + 1] - v.targetStart[t];
        if (n > 0) g.perPath.set(v.paths[t], (g.perPath.get(v.paths[t]) ?? 0) + n);
      }
      const byKey = new Map<string, number>();
      const bySignal = new Map<number, number[]>();
      v.targets.forEach((p, t) => {
        const key = `${p.signal}:${p.bit ?? 'n'}`;
        if (byKey.has(key)) return; // an alias path of a net already listed: same data
        byKey.set(key, t);
        if (p.bit !== null) bySignal.set(p.signal, [...(bySignal.get(p.signal) ?? []), t]);
      });
      this.glitchTargets = { byKey, bySignal };
      this.glitchLayer.data = {
        items: v.items,
        targetStart: v.targetStart,
        start: v.startByTarget,
        end: v.endByTarget,
        rows: () => this.glitchRows(),
        focus: -1,
      };
    } else {
      g.view = null;
      g.error = r.error;
      this.glitchLayer.data = null;
    }
    this.emit('glitch');
    this.hooks.refreshDrawer();
    this.hooks.redraw();
  }

  private glitchRowsCache: { rows: Row[]; out: Array<{ key: string; targets: number[] }> } | null = null;

  /** The lanes that show searched nets, with the targets each one shows. */
  private glitchRows(): Array<{ key: string; targets: number[] }> {
    const rows = this.state.rows();
    if (this.glitchRowsCache?.rows === rows && this.glitchTargets) return this.glitchRowsCache.out;
    const out: Array<{ key: string; targets: number[] }> = [];
    const t = this.glitchTargets;
    if (t) {
      for (const r of rows) {
        if ((r.kind !== 'net' && r.kind !== 'bit') || !r.net) continue;
        const bit = r.kind === 'bit' ? r.bit : (r.lane as NetLane).bit;
        const one = t.byKey.get(`${r.net.signal}:${bit ?? 'n'}`);
        if (one !== undefined) out.push({ key: r.key, targets: [one] });
        else if (bit === null && t.bySignal.has(r.net.signal)) out.push({ key: r.key, targets: t.bySignal.get(r.net.signal)! });
      }
    }
    this.glitchRowsCache = { rows, out };
    return out;
  }

  /** The drawer's mark beside a net: how many glitches it has. */
  glitchBadge(path: string): { text: string; title: string } | null {
    const n = this.glitch.perPath.get(path);
    const v = this.glitch.view;
    if (!n || !v) return null;
    return { text: String(n), title: `${n} glitch${n === 1 ? '' : 'es'} narrower than ${formatTime(v.width.seconds, 4)} (see the Glitches tab)` };
  }

  setGlitchWidth(text: string | null): void {
    this.glitch.width = text;
    void this.scan();
    this.hooks.remember();
  }

  setGlitchLimits(min: number | null, max: number | null): void {
    this.glitch.min = min;
    this.glitch.max = max;
    this.emit('glitch');
    this.hooks.remember();
  }

  /** Glitch count against its limits: null without limits. */
  glitchVerdict(): 'pass' | 'fail' | null {
    const g = this.glitch;
    if (!g.view || (g.min === null && g.max === null)) return null;
    const n = g.view.items.count;
    return (g.max !== null && n > g.max) || (g.min !== null && n < g.min) ? 'fail' : 'pass';
  }

  /** Steps to the next (+1) or previous (−1) glitch in time, showing its net. */
  stepGlitch(dir: 1 | -1): void {
    const g = this.glitch;
    const v = g.view;
    if (!v || v.items.count === 0) {
      this.hooks.notice('no glitches to step to');
      return;
    }
    let i = g.focus;
    if (i < 0) {
      // From the active cursor.
      const t = this.state.activeCursor?.tick ?? 0;
      i = dir > 0 ? -1 : v.items.count;
      for (let k = 0; k < v.items.count; k++) {
        if (v.items.start[k] > t) {
          i = dir > 0 ? k - 1 : k;
          break;
        }
      }
    }
    // A port and its wire are one net under two names: step over the second name of a glitch.
    const same = (a: number, b: number) => {
      const p = v.targets[v.target[a]];
      const q = v.targets[v.target[b]];
      return v.items.start[a] === v.items.start[b] && !!p && !!q && p.signal === q.signal && p.bit === q.bit;
    };
    let next = i + dir;
    while (next >= 0 && next < v.items.count && i >= 0 && i < v.items.count && same(i, next)) next += dir;
    this.focusGlitch(Math.max(0, Math.min(v.items.count - 1, next)));
  }

  focusGlitch(i: number): void {
    const g = this.glitch;
    const v = g.view;
    if (!v || i < 0 || i >= v.items.count) return;
    g.focus = i;
    if (this.glitchLayer.data) this.glitchLayer.data.focus = i;
    const t = v.target[i];
    if (t >= 0) this.showNets([v.targets[t].label]);
    const a = v.items.start[i];
    const b = v.items.end[i];
    const st = this.state;
    const span = b - a;
    if (span > 0) st.setWindow(a - 6 * span, b + 6 * span);
    else st.centreOn(a);
    st.moveCursor(st.active, a);
    this.emit('glitch');
    this.hooks.redraw();
  }

  // ---- plans ------------------------------------------------------------------------------------

  /** The measurements (and a glitch-count limit, when set) as a plan; null when there are none. */
  plan(): Plan | null {
    const measurements: MeasurementSpec[] = this.entries.map((e) => e.spec);
    const g = this.glitch;
    if (g.min !== null || g.max !== null) {
      const width = g.width ?? (g.view ? `${Number((g.view.width.seconds * 1e12).toPrecision(6))}ps` : '1ns');
      const spec: MeasurementSpec = { id: GLITCH_SCAN_ID, kind: 'glitch', max_width: width };
      if (g.min !== null) spec.min = g.min;
      if (g.max !== null) spec.max = g.max;
      measurements.push(spec);
    }
    if (measurements.length === 0) return null;
    const plan: Plan = { format: PLAN_FORMAT, version: PLAN_VERSION, measurements };
    if (this.planInfo.name) plan.name = this.planInfo.name;
    if (this.planInfo.description) plan.description = this.planInfo.description;
    const levels = this.levels();
    if (levels) plan.levels = levels;
    return plan;
  }

  savePlan(): void {
    const plan = this.plan();
    if (!plan) {
      this.hooks.notice('nothing to save: add a measurement first');
      return;
    }
    const name = `${this.baseName()}.midrail-plan.json`;
    downloadBytes(name, formatPlan(plan, name), 'application/json');
    this.hooks.notice(`plan saved as ${name}`);
  }

  /** Reads a plan file and runs it on the dump shown; returns the problem text when it cannot. */
  async openPlan(file: File): Promise<string | null> {
    if (!this.state.dump) return 'open a dump first, then open the plan to run on it';
    let plan: Plan;
    try {
      if (file.size > 16 * 1024 * 1024) return `${file.name}: a plan larger than 16 MiB is not read`;
      plan = parsePlan(await file.text(), file.name);
    } catch (e) {
      if (e instanceof PlanError) return e.message;
      throw e;
    }
    this.loadPlan(plan);
    this.planNote = `plan ${plan.name ?? file.name}: running ${plan.measurements.length} measurements…`;
    this.emit('plan');
    await this.settled();
    this.planNote = this.planSummary(plan.name ?? file.name);
    this.emit('plan');
    return null;
  }

  private loadPlan(plan: Plan): void {
    this.clearEntries();
    this.planInfo = { name: plan.name, description: plan.description, levels: plan.levels };
    for (const m of plan.measurements) {
      if (m.kind === 'glitch' && m.id === GLITCH_SCAN_ID && m.nets === undefined) {
        this.glitch.width = m.max_width;
        this.glitch.min = m.min ?? null;
        this.glitch.max = m.max ?? null;
        continue;
      }
      this.entries.push({ spec: m, view: null, error: null, running: false, version: 0, layer: null, violations: new Int32Array(0) });
    }
    this.chosen = this.entries[0]?.spec.id ?? null;
    this.emit('list');
    this.runAll();
    void this.scan();
    this.hooks.remember();
  }

  private clearEntries(): void {
    for (const e of this.entries) this.dropLayer(e);
    this.entries = [];
    this.chosen = null;
  }

  /** Resolves once no measurement or scan is running. */
  settled(): Promise<void> {
    return new Promise((resolve) => {
      const check = () => {
        if (!this.entries.some((e) => e.running) && !this.glitch.running) resolve();
        else setTimeout(check, 30);
      };
      check();
    });
  }

  /** Pass/fail of a measurement: from its verdict, or null when it has no limits. */
  status(e: Entry): 'pass' | 'fail' | 'error' | null {
    if (e.error) return 'error';
    const v = e.view;
    if (!v) return null;
    if (v.kind === 'verdict') return v.outcome.status;
    return v.outcome ? v.outcome.status : null;
  }

  private planSummary(name: string): string {
    let pass = 0;
    let fail = 0;
    let error = 0;
    for (const e of this.entries) {
      const s = this.status(e);
      if (s === 'pass' || s === null) pass++;
      else if (s === 'fail') fail++;
      else error++;
    }
    const g = this.glitchVerdict();
    if (g === 'pass') pass++;
    else if (g === 'fail') fail++;
    return `plan ${name}: ${pass} pass, ${fail} fail${error ? `, ${error} could not run` : ''}`;
  }

  // ---- saved view -------------------------------------------------------------------------------

  savePart(): MeasurePart | undefined {
    const plan = this.plan();
    if (!plan && this.sheetRows.length === 0 && this.glitch.width === null) return undefined;
    const part: MeasurePart = { sheet: this.sheetRows };
    if (plan) part.plan = plan;
    if (this.chosen) part.chosen = this.chosen;
    if (this.glitch.width !== null) part.glitchWidth = this.glitch.width;
    return part;
  }

  restorePart(part: MeasurePart | undefined): void {
    if (!part) return;
    // A view restored while a dump loads (same batch of changes) keeps its measurements for that
    // dump; the flag is gone by the next task, so a later, different dump starts afresh.
    this.restored = true;
    queueMicrotask(() => (this.restored = false));
    this.clearEntries();
    this.glitch.min = this.glitch.max = null;
    this.glitch.width = part.glitchWidth ?? null;
    this.planInfo = {};
    if (part.plan) this.loadPlan(part.plan);
    if (part.glitchWidth !== undefined) this.glitch.width = part.glitchWidth;
    if (part.chosen && this.entry(part.chosen)) this.chosen = part.chosen;
    this.sheetRows = [...part.sheet];
    this.emit('list');
    this.emit('sheet');
  }
}
