// The viewer page: wires the state to the canvas, the drawer, the captions, the side sheet,
// the loader, the toolbar and the keys, and redraws only what a change touches.

import type { Dump } from '../model/dump';
import { TimeSyntaxError, formatTime, parseTime } from '../model/units';
import { formatChange } from '../render/radix';
import { nearestChange } from '../render/seek';
import type { LaneRow, Scene, Stage } from '../render/stage';
import type { AnalogSummary } from '../render/summary';
import { THEMES, type ThemeName, resolveColor } from '../render/theme';
import type { ParseFailure } from '../../workers/parse.worker';
import { Captions } from './captions';
import { CursorSheet, cursorTimeText, deltaText } from './cursorsheet';
import { byId, download } from './dom';
import { NetDrawer } from './drawer';
import { installFileInputs } from './files';
import { type Actions, installKeys, renderHelp } from './keys';
import { LaneSheet } from './lanesheet';
import { Loader } from './loader';
import { SNAP_PX, installPointer } from './pointer';
import { SideSheet } from './sheet';
import { ADD_ALL_LIMIT, CAPTION_H, type Change, type NetLane, type Row, ViewState } from './state';
import { type RealInfo, nearestInstant, realInfo } from './realnets';
import { type Found, findEdge, findValue } from './seeking';
import { type ViewFile, ViewFileError, readViewFile, writeViewFile } from './viewfile';
import { applyView, viewOf } from './viewio';
import type { MeasureDesk } from './measure/desk';
import { installMeasuring } from './measure/install';

const STORE_PREFIX = 'midrail.view:';
const THEME_KEY = 'midrail.look';

/** Plot range of a real lane (the user's numbers, else the data's own) and its reference level. */
export function analogScale(lane: NetLane, s: AnalogSummary, ref: number): { lo: number; hi: number; ref: number } {
  let lo = s.lo;
  let hi = s.hi;
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) {
    lo = 0;
    hi = 1;
  }
  if (hi === lo) {
    const pad = Math.abs(hi) * 0.5 || 0.5;
    lo -= pad;
    hi += pad;
  } else {
    const pad = (hi - lo) * 0.06;
    lo -= pad;
    hi += pad;
  }
  return { lo: lane.lo ?? lo, hi: lane.hi ?? hi, ref };
}

function readStoredView(source: string): ViewFile | null {
  try {
    const text = localStorage.getItem(STORE_PREFIX + source);
    return text ? readViewFile(text) : null;
  } catch {
    return null;
  }
}

export class ViewerApp implements Actions {
  readonly state = new ViewState();
  readonly sheet: SideSheet;
  private readonly stageEl = byId('stage');
  private readonly lanesEl = byId('lanes');
  private readonly drawer: NetDrawer;
  private readonly captions: Captions;
  private readonly cursorSheet: CursorSheet;
  private readonly laneSheet: LaneSheet;
  private readonly loader: Loader;
  /** Measurements, glitch marks and the worst-case sheet (src/view/measure). */
  readonly measure: MeasureDesk;
  private rangeDrag: [number, number] | null = null;
  private snapHint: number | null = null;
  private dirtyScene = true;
  private dirtyOverlay = true;
  private raf = 0;
  private frames = 0;
  private storeTimer = 0;
  private noticeTimer = 0;

  constructor(readonly stage: Stage) {
    const st = this.state;
    st.theme = this.initialTheme();
    this.applyThemeToPage();
    this.sheet = new SideSheet(byId('sheet'), byId('sheet-tabs'), byId('sheet-body'));
    this.cursorSheet = new CursorSheet(st, { notice: (t) => this.notice(t), addCursor: () => this.addCursor(), swap: () => this.swapCursors() });
    this.laneSheet = new LaneSheet(st, { notice: (t) => this.notice(t), rename: (k) => this.captions.startRename(k), realNote: (row) => this.realOf(row)?.error ?? null });
    this.sheet.addTab({ id: 'cursors', title: 'Cursors', panel: this.cursorSheet.panel, onShow: () => this.cursorSheet.render() });
    this.sheet.addTab({ id: 'lane', title: 'Lane', panel: this.laneSheet.panel, onShow: () => this.laneSheet.render() });
    this.drawer = new NetDrawer(
      byId('net-list'),
      byId('net-list-spacer'),
      byId<HTMLInputElement>('net-filter'),
      byId<HTMLSelectElement>('net-filter-mode'),
      byId('net-filter-error'),
      byId('net-count'),
      byId('scope-tree'),
      byId<HTMLButtonElement>('add-matching'),
      {
        add: (paths) => this.addNets(paths),
        isShown: (p) => this.shownPaths.has(p),
        notice: (t) => this.notice(t),
        badge: (p) => this.measure?.glitchBadge(p) ?? null,
      },
    );
    this.captions = new Captions(st, this.lanesEl, byId('lanes-spacer'), byId('captions'), byId('drop-line'), {
      openLaneSheet: () => this.sheet.show('lane'),
      notice: (t) => this.notice(t),
    });
    this.loader = new Loader(
      { box: byId('progress'), fill: byId('progress-fill'), text: byId('progress-text'), cancel: byId<HTMLButtonElement>('progress-cancel') },
      { loaded: (d) => this.onLoaded(d), failed: (n, e) => this.onFailed(n, e) },
    );
    st.on((what) => this.onChange(what));
    installPointer(st, this.lanesEl, byId('ruler-hit'), {
      snapAt: (x, y) => this.snapAt(x, y),
      setRangeDrag: (r) => {
        this.rangeDrag = r;
        this.schedule(false, true);
      },
      setSnapHint: (t) => {
        if (t === this.snapHint) return;
        this.snapHint = t;
        this.schedule(false, true);
      },
      rowAt: (y) => this.rowAtY(y)?.key ?? null,
    });
    installKeys(this);
    this.measure = installMeasuring(
      {
        state: st,
        stage,
        sheet: this.sheet,
        notice: (t, ms) => this.notice(t, ms),
        redraw: () => this.schedule(true, false),
        refreshDrawer: () => this.drawer.refresh(),
        remember: () => this.rememberView(),
      },
      this.lanesEl,
      byId('sheet'),
    );
    renderHelp(byId('help-body'));
    this.wireToolbar();
    installFileInputs({ openDump: (f) => void this.openFile(f), restoreView: (f) => void this.restoreViewFile(f) });
    this.lanesEl.addEventListener('scroll', () => {
      this.captions.render();
      this.schedule(true, true);
    });
    new ResizeObserver(() => this.layout()).observe(this.stageEl);
    byId('renderer-name').textContent = stage.rendererName === 'webgl' ? 'WebGL' : `${stage.rendererName} drawing (no WebGL)`;
    this.layout();
    this.refreshAll();
  }

  // ---- drawing --------------------------------------------------------------------------------

  /** Paths shown as lanes, kept for the drawer's marks (refreshed when lanes change). */
  private shownPaths = new Set<string>();

  private layout(): void {
    // Inside the border: the canvas fills the stage's content box.
    const w = this.stageEl.clientWidth;
    const hgt = this.stageEl.clientHeight;
    this.stage.resize(w, hgt);
    this.state.width = Math.max(1, Math.floor(w));
    this.captions.render();
    this.schedule(true, true);
  }

  schedule(scene: boolean, overlay: boolean): void {
    this.dirtyScene ||= scene;
    this.dirtyOverlay ||= overlay;
    if (!this.raf) this.raf = requestAnimationFrame(() => this.frame());
  }

  private laneRows(): LaneRow[] {
    const st = this.state;
    const theme = THEMES[st.theme];
    return st.rows().map((row): LaneRow => {
      const sig = row.signal;
      const base = { key: row.key, top: row.top, height: row.height, caption: CAPTION_H, selected: st.selected.has(row.key) };
      if (row.kind === 'group' || !sig) return { ...base, kind: 'group', summary: null, color: theme.muted };
      const lane = row.lane as NetLane;
      const summary = st.summaryOf(sig);
      const color = resolveColor(theme, lane.color);
      if (summary.kind === 'analog') return { ...base, kind: 'analog', summary, color, scale: analogScale(lane, summary, this.realOf(row)!.reference) };
      const values = sig.kind === 'string' || (sig.kind === 'vector' && row.kind !== 'bit');
      const radix = lane.radix;
      return { ...base, kind: values ? 'values' : 'steps', summary, color, label: values ? (i) => formatChange(sig, i, radix) : undefined };
    });
  }

  private frame(): void {
    this.raf = 0;
    const began = performance.now();
    const st = this.state;
    const theme = THEMES[st.theme];
    const scene: Scene = {
      dump: st.dump,
      t0: st.t0,
      tpp: st.tpp,
      rows: this.dirtyScene ? this.laneRows() : [],
      scrollTop: this.lanesEl.scrollTop,
      cursors: st.cursors.map((c, i) => ({ tick: c.tick, name: c.name, color: theme.cursors[i % theme.cursors.length], active: i === st.active })),
      rangeDrag: this.rangeDrag,
      snapHint: this.snapHint,
      theme,
    };
    this.stage.draw(scene, this.dirtyScene, this.dirtyOverlay);
    this.dirtyScene = false;
    this.dirtyOverlay = false;
    const d = this.stageEl.dataset;
    d.frames = String(++this.frames);
    d.t0 = String(st.t0);
    d.tpp = String(st.tpp);
    d.tickSeconds = String(st.tickSeconds);
    d.primitives = String(this.stage.stats.primitives);
    d.scrollTop = String(this.lanesEl.scrollTop);
    d.width = String(st.width);
    // Time spent building and submitting this frame (the GPU's share is not included).
    d.frameMs = (performance.now() - began).toFixed(2);
  }

  private onChange(what: Set<Change>): void {
    const st = this.state;
    const all = what.has('dump') || what.has('theme');
    if (all || what.has('lanes') || what.has('window') || what.has('selection')) this.schedule(true, true);
    if (what.has('cursors')) this.schedule(false, true);
    if (all || what.has('lanes') || what.has('cursors') || what.has('selection')) this.captions.render();
    if (all || what.has('cursors')) this.cursorSheet.render();
    if (all || what.has('lanes') || what.has('selection')) this.laneSheet.render();
    if (all || what.has('lanes')) {
      this.shownPaths = st.shownPaths();
      this.drawer.refresh();
    }
    if (all || what.has('cursors') || what.has('window')) this.readouts();
    if (what.has('theme')) this.applyThemeToPage();
    if (st.dump && (what.has('lanes') || what.has('window') || what.has('cursors') || what.has('theme'))) this.rememberView();
  }

  private refreshAll(): void {
    this.state.changed('theme', 'lanes', 'cursors');
  }

  private readouts(): void {
    const st = this.state;
    const s = st.tickSeconds;
    const a = st.activeCursor;
    const r = st.referenceCursor;
    byId('delta-readout').textContent = a && r && a !== r ? `${r.name}→${a.name}  Δ ${deltaText(a.tick - r.tick, s)}` : a ? `${a.name} at ${cursorTimeText(a.tick, s)}` : '';
    byId('window-readout').textContent = st.dump ? `${formatTime(st.t0 * s, 5)} … ${formatTime(st.t1 * s, 5)}` : '';
  }

  // ---- snapping and rows ----------------------------------------------------------------------

  private rowAtY(laneY: number): Row | null {
    for (const r of this.state.rows()) if (laneY >= r.top && laneY < r.top + r.height) return r;
    return null;
  }

  /** A real lane's reference level and edge instants, from the measurement engine. */
  realOf(row: Row): RealInfo | null {
    const sig = row.signal;
    const dump = this.state.dump;
    if (!dump || !sig || sig.kind !== 'real' || !row.net) return null;
    const s = this.state.summaryOf(sig);
    return s.kind === 'analog' ? realInfo(dump, row.net, sig, (row.lane as NetLane).level, s) : null;
  }

  snapAt(x: number, laneY: number | null): { tick: number; snapped: boolean } {
    const st = this.state;
    const tick = st.t0 + x * st.tpp;
    if (!st.snap || !st.dump || laneY === null) return { tick, snapped: false };
    const row = this.rowAtY(laneY);
    const sig = row?.signal;
    if (!row || !sig || sig.count === 0) return { tick, snapped: false };
    const tol = SNAP_PX * st.tpp;
    const real = this.realOf(row);
    const t = real ? nearestInstant(real.ticks, tick, tol) : nearestChange(st.dump, sig, tick, tol);
    return t === null ? { tick, snapped: false } : { tick: t, snapped: true };
  }

  // ---- loading ----------------------------------------------------------------------------------

  openUrl(url: string): Promise<void> {
    this.measure.nextOrigin = url;
    return this.loader.openUrl(url);
  }

  openFile(file: File): Promise<void> {
    this.hideError();
    this.measure.nextOrigin = file;
    return this.loader.openFile(file);
  }

  private onLoaded(dump: Dump): void {
    const st = this.state;
    let view: ViewFile | null = null;
    let note = '';
    if (st.dump && st.dump.source === dump.source) {
      view = viewOf(st);
      note = `reloaded ${dump.source}; lanes, cursors and zoom kept`;
    } else {
      view = readStoredView(dump.source);
      if (view) note = `restored your last view of ${dump.source}`;
    }
    this.hideError();
    let missing: string[] = [];
    st.batch(() => {
      st.setDump(dump);
      if (view) missing = applyView(st, view);
    });
    this.drawer.setDump(dump);
    byId('empty-note').hidden = true;
    document.title = `${dump.source} · midrail`;
    byId('file-name').textContent = dump.source;
    byId('file-name').title = `${dump.source} (${dump.bytes.toLocaleString('en')} bytes)`;
    const s = dump.timescale;
    byId('dump-info').textContent = `${s.magnitude} ${s.unit} timescale · ${this.shownCount(dump)} nets · ${dump.changes.toLocaleString('en')} changes · ends at ${formatTime(dump.endTick * s.seconds)}`;
    const notes = [note];
    if (missing.length) notes.push(`${missing.length} net${missing.length === 1 ? '' : 's'} of the view not in this dump: ${missing.slice(0, 4).join(', ')}${missing.length > 4 ? ', …' : ''}`);
    if (dump.truncated) notes.push(dump.warnings[dump.warnings.length - 1]?.message ?? 'the dump is cut off');
    else if (dump.warnings.length) notes.push(`${dump.warnings.length} warning${dump.warnings.length === 1 ? '' : 's'}: ${dump.warnings[0].message}`);
    this.notice(notes.filter(Boolean).join(' · '), 0);
    this.lanesEl.scrollTop = 0;
  }

  private shownCount(dump: Dump): string {
    return new Set(dump.nets.map((n) => n.path)).size.toLocaleString('en');
  }

  private onFailed(name: string, e: ParseFailure): void {
    if (e.cancelled) {
      this.notice(`loading ${name} cancelled; ${this.state.dump ? 'the dump shown before stays open' : 'nothing is open'}`);
      return;
    }
    this.showError(`Could not open ${name}`, e.line !== null ? `line ${e.line}${e.offset !== null ? `, byte ${e.offset}` : ''}` : '', e.message);
  }

  private showError(title: string, where: string, text: string): void {
    byId('error-title').textContent = title;
    byId('error-where').textContent = where;
    byId('error-where').hidden = where === '';
    byId('error-text').textContent = text;
    byId('error-panel').hidden = false;
  }

  private hideError(): void {
    byId('error-panel').hidden = true;
  }

  notice(text: string, ms = 6000): void {
    const n = byId('notice');
    n.textContent = text;
    clearTimeout(this.noticeTimer);
    if (ms > 0) this.noticeTimer = window.setTimeout(() => (n.textContent = ''), ms);
  }

  private rememberView(): void {
    clearTimeout(this.storeTimer);
    this.storeTimer = window.setTimeout(() => {
      const st = this.state;
      if (!st.dump) return;
      try {
        localStorage.setItem(STORE_PREFIX + st.dump.source, writeViewFile(viewOf(st)));
      } catch {
        // Storage full or switched off: the view just is not remembered.
      }
    }, 300);
  }

  // ---- theme ------------------------------------------------------------------------------------

  private initialTheme(): ThemeName {
    try {
      const t = localStorage.getItem(THEME_KEY);
      if (t === 'paper' || t === 'slate') return t;
    } catch {
      /* storage off */
    }
    return window.matchMedia?.('(prefers-color-scheme: dark)').matches ? 'slate' : 'paper';
  }

  private applyThemeToPage(): void {
    const t = this.state.theme;
    document.documentElement.dataset.theme = t;
    this.stage.setBackground(THEMES[t].background);
    const btn = document.getElementById('theme-toggle');
    if (btn) btn.textContent = t === 'paper' ? 'Slate look' : 'Paper look';
    try {
      localStorage.setItem(THEME_KEY, t);
    } catch {
      /* storage off */
    }
  }

  // ---- actions (buttons and keys) --------------------------------------------------------------

  private addNets(paths: string[]): void {
    let list = paths;
    if (list.length > ADD_ALL_LIMIT) {
      this.notice(`added the first ${ADD_ALL_LIMIT} of ${list.length} matching nets; narrow the filter to see the rest`);
      list = list.slice(0, ADD_ALL_LIMIT);
    }
    const n = this.state.addNets(list);
    if (n > 1) this.notice(`added ${n} nets`);
  }

  private centreX(): number {
    const a = this.state.activeCursor;
    const x = a ? (a.tick - this.state.t0) / this.state.tpp : -1;
    return x >= 0 && x <= this.state.width ? x : this.state.width / 2;
  }

  zoomIn(): void {
    this.state.zoomAt(this.centreX(), 2);
  }

  zoomOut(): void {
    this.state.zoomAt(this.centreX(), 0.5);
  }

  fit(): void {
    this.state.fit();
  }

  zoomCursors(): void {
    const a = this.state.activeCursor;
    const r = this.state.referenceCursor;
    if (!a || !r || a === r || a.tick === r.tick) {
      this.notice('place two cursors apart first');
      return;
    }
    const lo = Math.min(a.tick, r.tick);
    const hi = Math.max(a.tick, r.tick);
    const pad = (hi - lo) * 0.08;
    this.state.setWindow(lo - pad, hi + pad);
  }

  pan(fraction: number): void {
    this.state.panBy(fraction * this.state.width);
  }

  toStart(): void {
    this.state.centreOn(0);
  }

  toEnd(): void {
    this.state.centreOn(this.state.endTick);
  }

  focusGoTo(): void {
    const i = byId<HTMLInputElement>('goto-input');
    i.focus();
    i.select();
  }

  focusSeek(): void {
    const i = byId<HTMLInputElement>('seek-input');
    i.focus();
    i.select();
  }

  goTo(text: string): void {
    const st = this.state;
    try {
      const tick = parseTime(text) / st.tickSeconds;
      st.batch(() => {
        st.moveCursor(st.active, tick);
        st.centreOn(tick);
      });
    } catch (e) {
      if (e instanceof TimeSyntaxError) this.notice(e.message);
      else throw e;
    }
  }

  /** Moves the active cursor to what a search found (panning only if it is off screen). */
  private land(found: Found): void {
    const st = this.state;
    if ('problem' in found) {
      this.notice(found.problem);
      return;
    }
    st.batch(() => {
      st.moveCursor(st.active, found.tick);
      st.reveal(found.tick);
    });
  }

  private chosen(): { row: Row; from: number } | null {
    const row = this.state.rowByKey(this.state.focus);
    const a = this.state.activeCursor;
    if (!row || !row.signal || !a) {
      this.notice('choose a lane first: click its name or its trace');
      return null;
    }
    return { row, from: a.tick };
  }

  edge(dir: 1 | -1): void {
    const c = this.chosen();
    if (c) this.land(findEdge(this.state, c.row, this.realOf(c.row), c.from, dir));
  }

  seek(dir: 1 | -1): void {
    const c = this.chosen();
    if (!c) return;
    const text = byId<HTMLInputElement>('seek-input').value;
    if (text.trim() === '') this.focusSeek();
    this.land(findValue(this.state, c.row, text, c.from, dir));
  }

  addCursor(): void {
    const st = this.state;
    st.addCursor(st.t0 + (st.width / 2) * st.tpp);
    this.sheet.show('cursors');
  }

  activateCursor(n: number): void {
    this.state.setActive(n);
  }

  swapCursors(): void {
    const st = this.state;
    const a = st.active;
    st.batch(() => {
      st.setActive(st.reference);
      st.setReference(a);
    });
  }

  stepLane(dir: 1 | -1): void {
    this.state.stepFocus(dir);
    const row = this.state.rowByKey(this.state.focus);
    if (!row) return;
    const el = this.lanesEl;
    if (row.top < el.scrollTop) el.scrollTop = row.top;
    else if (row.top + row.height > el.scrollTop + el.clientHeight) el.scrollTop = row.top + row.height - el.clientHeight;
  }

  renameLane(): void {
    const key = this.state.focus;
    if (key) this.captions.startRename(key);
    else this.notice('choose a lane to rename first');
  }

  toggleBits(): void {
    const row = this.state.rowByKey(this.state.focus);
    if (row && row.kind === 'net') this.state.toggleExpanded(row.lane as NetLane);
  }

  removeChosen(): void {
    if (this.state.selected.size) this.state.removeRows([...this.state.selected]);
  }

  groupChosen(): void {
    const g = this.state.groupSelected('group');
    if (g) requestAnimationFrame(() => this.captions.startRename(`g${g.id}`));
    else this.notice('choose lanes to group first (Ctrl-click names to choose several)');
  }

  laneSettings(): void {
    this.sheet.show('lane');
  }

  toggleDrawer(): void {
    const d = byId('drawer');
    d.hidden = !d.hidden;
    byId('drawer-toggle').setAttribute('aria-pressed', String(!d.hidden));
  }

  focusFilter(): void {
    const d = byId('drawer');
    if (d.hidden) this.toggleDrawer();
    this.drawer.focusFilter();
  }

  openDump(): void {
    byId<HTMLInputElement>('file-input').click();
  }

  saveView(): void {
    const st = this.state;
    if (!st.dump) {
      this.notice('open a dump first');
      return;
    }
    const base = st.dump.source.replace(/\.gz$/i, '').replace(/\.vcd$/i, '');
    download(`${base}.midrail-view.json`, writeViewFile(viewOf(st)));
    this.notice(`view saved as ${base}.midrail-view.json`);
  }

  loadView(): void {
    byId<HTMLInputElement>('view-input').click();
  }

  async restoreViewFile(file: File): Promise<void> {
    const st = this.state;
    let view: ViewFile;
    try {
      if (file.size > 32 * 1024 * 1024) throw new ViewFileError(`view file: ${file.name} is larger than 32 MiB`);
      view = readViewFile(await file.text());
    } catch (e) {
      if (e instanceof ViewFileError) this.showError(`Could not restore ${file.name}`, '', e.message);
      else throw e;
      return;
    }
    if (!st.dump) {
      this.showError(`Could not restore ${file.name}`, '', 'open the dump first, then restore the view onto it');
      return;
    }
    this.hideError();
    const missing = applyView(st, view);
    this.notice(missing.length ? `view restored; not in this dump: ${missing.slice(0, 4).join(', ')}${missing.length > 4 ? ', …' : ''}` : `view restored from ${file.name}`);
  }

  toggleTheme(): void {
    this.state.theme = this.state.theme === 'paper' ? 'slate' : 'paper';
    this.state.changed('theme');
  }

  help(show?: boolean): void {
    const el = byId('help');
    el.hidden = show === undefined ? !el.hidden : !show;
    if (!el.hidden) byId('help-close').focus();
  }

  scrollLanes(pages: number): void {
    this.lanesEl.scrollTop += pages * (this.lanesEl.clientHeight - 40);
  }

  closeOverlays(): boolean {
    if (!byId('help').hidden) {
      this.help(false);
      return true;
    }
    if (!byId('error-panel').hidden) {
      this.hideError();
      return true;
    }
    return false;
  }

  // ---- wiring -------------------------------------------------------------------------------------

  private wireToolbar(): void {
    const click = (id: string, fn: () => void) => byId(id).addEventListener('click', fn);
    click('zoom-in', () => this.zoomIn());
    click('zoom-out', () => this.zoomOut());
    click('zoom-fit', () => this.fit());
    click('zoom-cursors', () => this.zoomCursors());
    click('pan-left', () => this.pan(-0.25));
    click('pan-right', () => this.pan(0.25));
    click('go-start', () => this.toStart());
    click('go-end', () => this.toEnd());
    click('edge-prev', () => this.edge(-1));
    click('edge-next', () => this.edge(1));
    click('seek-prev', () => this.seek(-1));
    click('cursor-add', () => this.addCursor());
    click('drawer-toggle', () => this.toggleDrawer());
    click('open-dump', () => this.openDump());
    click('save-view', () => this.saveView());
    click('load-view', () => this.loadView());
    click('theme-toggle', () => this.toggleTheme());
    click('help-open', () => this.help(true));
    click('help-close', () => this.help(false));
    click('error-close', () => this.hideError());
    byId('help').addEventListener('click', (e) => {
      if (e.target === byId('help')) this.help(false);
    });
    byId('goto-form').addEventListener('submit', (e) => {
      e.preventDefault();
      this.goTo(byId<HTMLInputElement>('goto-input').value);
    });
    byId('seek-form').addEventListener('submit', (e) => {
      e.preventDefault();
      this.seek(1);
    });
  }
}
