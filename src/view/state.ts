// What the viewer shows: the dump, the lanes (nets, bits, groups), cursors, the time window
// and the selection. Every change goes through a method here and is announced to listeners
// with what changed, so the canvas redraws only the layers that need it.

import type { Dump, Net, Signal } from '../model/dump';
import { bitSignal } from '../model/netref';
import { type Radix, radixAllowed } from '../render/radix';
import { type Summary, summarizeSignal } from '../render/summary';
import type { LaneColor, ThemeName } from '../render/theme';

export interface NetLane {
  kind: 'net';
  id: number;
  path: string;
  /** A single bit of a vector shown as its own lane (declared numbering), or null. */
  bit: number | null;
  label: string | null;
  radix: Radix;
  color: LaneColor;
  expanded: boolean;
  lo: number | null;
  hi: number | null;
  /** Real nets: reference level as the measurement engine reads it ('50%', '1.2V'), null = 50 %. */
  level: string | null;
}

export interface GroupLane {
  kind: 'group';
  id: number;
  label: string;
  collapsed: boolean;
  children: NetLane[];
}

export type TopLane = NetLane | GroupLane;

export interface Cursor {
  id: number;
  name: string;
  tick: number;
}

/** One line on screen: a net lane, one bit of an expanded net, or a group heading. */
export interface Row {
  key: string;
  kind: 'net' | 'bit' | 'group';
  lane: NetLane | GroupLane;
  /** For bit rows: the declared bit index. */
  bit: number | null;
  depth: number;
  top: number;
  height: number;
  net: Net | null;
  signal: Signal | null;
  /** Parent group id, if inside one. */
  group: number | null;
}

export type Change = 'dump' | 'lanes' | 'window' | 'cursors' | 'selection' | 'theme';

export const CAPTION_H = 17;
const HEIGHT = { logic: 40, vector: 42, real: 84, bit: 34, group: 26 };
/** Most lanes added by one "add all matching". */
export const ADD_ALL_LIMIT = 2000;
const CURSOR_NAMES = 'ABCDEFGHIJKLMNOPQRSTUVWXYZ';

let nextId = 1;

/** A fresh id for a lane, group or cursor (ids tell them apart across edits; never saved). */
export function newId(): number {
  return nextId++;
}

export class ViewState {
  dump: Dump | null = null;
  netsByPath = new Map<string, Net>();
  lanes: TopLane[] = [];
  cursors: Cursor[] = [];
  active = 0;
  reference = 1;
  /** Tick at x = 0 and ticks per pixel. */
  t0 = 0;
  tpp = 1;
  /** Width of the trace canvas in pixels (set by the page). */
  width = 800;
  selected = new Set<string>();
  /** The row whose net edge and value searches act on. */
  focus: string | null = null;
  theme: ThemeName = 'paper';
  snap = true;
  private rowsCache: Row[] | null = null;
  private bitCache = new Map<string, Signal>();
  private summaries = new WeakMap<Signal, Summary>();
  private listeners: Array<(what: Set<Change>) => void> = [];
  private pending = new Set<Change>();
  private batchDepth = 0;

  on(fn: (what: Set<Change>) => void): void {
    this.listeners.push(fn);
  }

  /** Announces a change (grouped when inside batch()). */
  changed(...what: Change[]): void {
    for (const w of what) this.pending.add(w);
    if (what.includes('lanes') || what.includes('dump')) this.rowsCache = null;
    if (this.batchDepth === 0) this.flush();
  }

  batch(fn: () => void): void {
    this.batchDepth++;
    try {
      fn();
    } finally {
      this.batchDepth--;
      if (this.batchDepth === 0) this.flush();
    }
  }

  private flush(): void {
    if (this.pending.size === 0) return;
    const what = this.pending;
    this.pending = new Set();
    for (const fn of this.listeners) fn(what);
  }

  // ---- dump and signals -------------------------------------------------------------------

  get tickSeconds(): number {
    return this.dump ? this.dump.timescale.seconds : 1e-9;
  }

  /** Last tick of the dump (at least 1 so a window always has a width). */
  get endTick(): number {
    return Math.max(1, this.dump?.endTick ?? 1);
  }

  /** Shows a new dump with its first nets, the whole run in view and two cursors. */
  setDump(dump: Dump): void {
    this.batch(() => {
      this.dump = dump;
      this.netsByPath = new Map();
      for (const n of dump.nets) if (!this.netsByPath.has(n.path)) this.netsByPath.set(n.path, n);
      this.bitCache.clear();
      this.summaries = new WeakMap();
      this.selected.clear();
      this.focus = null;
      this.lanes = [];
      const first = [...this.netsByPath.keys()].slice(0, 10);
      this.addNets(first);
      this.selected.clear();
      this.focus = null;
      this.fit();
      this.cursors = [
        { id: newId(), name: 'A', tick: this.endTick * 0.25 },
        { id: newId(), name: 'B', tick: this.endTick * 0.5 },
      ];
      // Δ reads from A to B.
      this.active = 1;
      this.reference = 0;
      this.changed('dump', 'lanes', 'window', 'cursors', 'selection');
    });
  }

  netOf(path: string): Net | null {
    return this.netsByPath.get(path) ?? null;
  }

  signalOf(lane: NetLane, bit: number | null = lane.bit): Signal | null {
    const dump = this.dump;
    const net = this.netOf(lane.path);
    if (!dump || !net) return null;
    if (bit === null) return dump.signals[net.signal];
    const key = `${net.path}[${bit}]`;
    let s = this.bitCache.get(key);
    if (!s) {
      s = bitSignal(dump, { net, bit, label: key });
      this.bitCache.set(key, s);
    }
    return s;
  }

  summaryOf(sig: Signal): Summary {
    let s = this.summaries.get(sig);
    if (!s) {
      s = summarizeSignal(sig, this.dump!.times);
      this.summaries.set(sig, s);
    }
    return s;
  }

  // ---- lanes ------------------------------------------------------------------------------

  newLane(path: string, bit: number | null = null): NetLane {
    const net = this.netOf(path);
    const wide = net !== null && net.width > 1 && bit === null;
    const used = this.allNetLanes().length;
    return {
      kind: 'net',
      id: newId(),
      path,
      bit,
      label: null,
      radix: !wide ? 'bin' : net.type === 'integer' ? 'signed' : 'hex',
      color: used % 7,
      expanded: false,
      lo: null,
      hi: null,
      level: null,
    };
  }

  allNetLanes(): NetLane[] {
    const out: NetLane[] = [];
    for (const l of this.lanes) {
      if (l.kind === 'net') out.push(l);
      else out.push(...l.children);
    }
    return out;
  }

  /** Paths shown as whole-net lanes. */
  shownPaths(): Set<string> {
    return new Set(this.allNetLanes().map((l) => l.path));
  }

  /** Rows in screen order with their tops; cached until lanes change. */
  rows(): Row[] {
    if (this.rowsCache) return this.rowsCache;
    const rows: Row[] = [];
    let y = 0;
    const pushNet = (lane: NetLane, depth: number, group: number | null) => {
      const net = this.netOf(lane.path);
      const sig = this.signalOf(lane);
      const h = sig?.kind === 'real' ? HEIGHT.real : lane.bit !== null ? HEIGHT.bit : sig && sig.width > 1 ? HEIGHT.vector : HEIGHT.logic;
      rows.push({ key: `n${lane.id}`, kind: 'net', lane, bit: lane.bit, depth, top: y, height: h, net, signal: sig, group });
      y += h;
      if (lane.expanded && net && net.width > 1 && lane.bit === null && sig?.kind === 'vector') {
        const step = net.msb >= net.lsb ? -1 : 1;
        for (let b = net.msb; ; b += step) {
          rows.push({ key: `n${lane.id}.${b}`, kind: 'bit', lane, bit: b, depth: depth + 1, top: y, height: HEIGHT.bit, net, signal: this.signalOf(lane, b), group });
          y += HEIGHT.bit;
          if (b === net.lsb) break;
        }
      }
    };
    for (const l of this.lanes) {
      if (l.kind === 'net') pushNet(l, 0, null);
      else {
        rows.push({ key: `g${l.id}`, kind: 'group', lane: l, bit: null, depth: 0, top: y, height: HEIGHT.group, net: null, signal: null, group: null });
        y += HEIGHT.group;
        if (!l.collapsed) for (const c of l.children) pushNet(c, 1, l.id);
      }
    }
    this.rowsCache = rows;
    return rows;
  }

  rowByKey(key: string | null): Row | null {
    if (key === null) return null;
    return this.rows().find((r) => r.key === key) ?? null;
  }

  /** Display name of a row. */
  rowLabel(row: Row): string {
    if (row.kind === 'group') return (row.lane as GroupLane).label;
    const lane = row.lane as NetLane;
    if (row.kind === 'bit') return `${(lane.label ?? row.net?.name ?? lane.path)}[${row.bit}]`;
    if (lane.label) return lane.label;
    const name = row.net?.name ?? lane.path.split('.').pop() ?? lane.path;
    return lane.bit !== null ? `${name}[${lane.bit}]` : name;
  }

  /** Inserts lanes for these paths before top-level position `at` (end when omitted). */
  addNets(paths: string[], at?: number): number {
    const used = this.allNetLanes().length;
    const fresh = paths.filter((p) => this.netOf(p)).map((p, k) => ({ ...this.newLane(p), color: (used + k) % 7 }));
    if (fresh.length === 0) return 0;
    const pos = at === undefined ? this.lanes.length : Math.max(0, Math.min(at, this.lanes.length));
    this.lanes.splice(pos, 0, ...fresh);
    this.selected = new Set([`n${fresh[fresh.length - 1].id}`]);
    this.focus = `n${fresh[fresh.length - 1].id}`;
    this.changed('lanes', 'selection');
    return fresh.length;
  }

  /** Removes the lanes behind these row keys (a group key removes the heading, keeping its lanes). */
  removeRows(keys: Iterable<string>): void {
    const ids = new Set<number>();
    const groups = new Set<number>();
    for (const k of keys) {
      const row = this.rowByKey(k);
      if (!row) continue;
      if (row.kind === 'group') groups.add(row.lane.id);
      else if (row.kind === 'net') ids.add(row.lane.id);
      else (row.lane as NetLane).expanded = false;
    }
    const next: TopLane[] = [];
    for (const l of this.lanes) {
      if (l.kind === 'net') {
        if (!ids.has(l.id)) next.push(l);
      } else {
        l.children = l.children.filter((c) => !ids.has(c.id));
        if (groups.has(l.id)) next.push(...l.children);
        else next.push(l);
      }
    }
    this.lanes = next;
    this.selected.clear();
    this.focus = null;
    this.changed('lanes', 'selection');
  }

  private findLane(id: number): { list: TopLane[] | NetLane[]; index: number; group: GroupLane | null } | null {
    for (let i = 0; i < this.lanes.length; i++) {
      const l = this.lanes[i];
      if (l.id === id) return { list: this.lanes, index: i, group: null };
      if (l.kind === 'group') {
        const j = l.children.findIndex((c) => c.id === id);
        if (j >= 0) return { list: l.children, index: j, group: l };
      }
    }
    return null;
  }

  /**
   * Moves the lanes behind `keys` so they sit just before the row at `beforeKey` (or at the
   * end when null). Dropping before a row inside a group puts them in that group; groups
   * themselves move only at the top level.
   */
  moveRows(keys: string[], beforeKey: string | null): void {
    const moving: TopLane[] = [];
    const seen = new Set<number>();
    for (const k of keys) {
      const row = this.rowByKey(k);
      if (!row || row.kind === 'bit' || seen.has(row.lane.id)) continue;
      seen.add(row.lane.id);
      moving.push(row.lane);
    }
    if (moving.length === 0) return;
    const target = this.rowByKey(beforeKey);
    if (target && seen.has(target.lane.id)) return;
    // Take them out.
    for (const m of moving) {
      const f = this.findLane(m.id);
      if (f) f.list.splice(f.index, 1);
    }
    const groupsMoving = moving.some((m) => m.kind === 'group');
    let dest: TopLane[] | NetLane[] = this.lanes;
    let at = this.lanes.length;
    if (target) {
      const laneId = target.kind === 'bit' ? target.lane.id : target.lane.id;
      const f = this.findLane(laneId);
      if (f) {
        if (f.group && !groupsMoving) {
          dest = f.list;
          at = f.index;
        } else if (f.group) {
          at = this.lanes.indexOf(f.group);
        } else at = f.index;
      }
    }
    (dest as TopLane[]).splice(at, 0, ...(dest === this.lanes ? moving : (moving as NetLane[])));
    this.changed('lanes');
  }

  /** Moves one row up (-1) or down (+1) among its neighbours. */
  nudge(key: string, dir: -1 | 1): void {
    const row = this.rowByKey(key);
    if (!row || row.kind === 'bit') return;
    const f = this.findLane(row.lane.id);
    if (!f) return;
    const j = f.index + dir;
    if (j < 0 || j >= f.list.length) return;
    const [item] = f.list.splice(f.index, 1);
    (f.list as TopLane[]).splice(j, 0, item);
    this.changed('lanes');
  }

  /** Puts the selected net lanes under a new heading placed where the first of them was. */
  groupSelected(label: string): GroupLane | null {
    const picked = this.allNetLanes().filter((l) => this.selected.has(`n${l.id}`));
    if (picked.length === 0) return null;
    const firstRow = this.rows().find((r) => r.kind === 'net' && picked.includes(r.lane as NetLane));
    let at = 0;
    if (firstRow) {
      const f = this.findLane(firstRow.lane.id)!;
      at = f.group ? this.lanes.indexOf(f.group) + 1 : f.index;
    }
    let removedBefore = 0;
    for (const p of picked) {
      const f = this.findLane(p.id);
      if (!f) continue;
      if (!f.group && f.index < at) removedBefore++;
      f.list.splice(f.index, 1);
    }
    const g: GroupLane = { kind: 'group', id: newId(), label, collapsed: false, children: picked };
    this.lanes.splice(Math.max(0, at - removedBefore), 0, g);
    this.selected = new Set([`g${g.id}`]);
    this.changed('lanes', 'selection');
    return g;
  }

  ungroup(id: number): void {
    const i = this.lanes.findIndex((l) => l.id === id);
    const g = this.lanes[i];
    if (!g || g.kind !== 'group') return;
    this.lanes.splice(i, 1, ...g.children);
    this.changed('lanes');
  }

  toggleCollapsed(id: number): void {
    const g = this.lanes.find((l) => l.id === id);
    if (g && g.kind === 'group') {
      g.collapsed = !g.collapsed;
      this.changed('lanes');
    }
  }

  rename(key: string, label: string): void {
    const row = this.rowByKey(key);
    if (!row) return;
    const text = label.trim().slice(0, 256);
    if (row.kind === 'group') (row.lane as GroupLane).label = text || 'group';
    else (row.lane as NetLane).label = text === '' ? null : text;
    this.changed('lanes');
  }

  setRadix(lane: NetLane, radix: Radix): void {
    const net = this.netOf(lane.path);
    if (net && !radixAllowed(radix, lane.bit === null ? net.width : 1)) return;
    lane.radix = radix;
    this.changed('lanes');
  }

  setColor(lane: NetLane, color: LaneColor): void {
    lane.color = color;
    this.changed('lanes');
  }

  toggleExpanded(lane: NetLane): void {
    const net = this.netOf(lane.path);
    if (!net || net.width < 2 || lane.bit !== null) return;
    lane.expanded = !lane.expanded;
    this.changed('lanes');
  }

  setAnalog(lane: NetLane, lo: number | null, hi: number | null, level: string | null): void {
    lane.lo = lo;
    lane.hi = hi;
    lane.level = level;
    this.changed('lanes');
  }

  select(key: string, mode: 'only' | 'toggle' | 'extend'): void {
    if (mode === 'only') this.selected = new Set([key]);
    else if (mode === 'toggle') {
      if (this.selected.has(key)) this.selected.delete(key);
      else this.selected.add(key);
    } else {
      const rows = this.rows();
      const a = rows.findIndex((r) => r.key === this.focus);
      const b = rows.findIndex((r) => r.key === key);
      if (a >= 0 && b >= 0) for (let i = Math.min(a, b); i <= Math.max(a, b); i++) this.selected.add(rows[i].key);
      else this.selected.add(key);
    }
    this.focus = key;
    this.changed('selection');
  }

  /** Moves the focus to the row above (-1) or below (+1). */
  stepFocus(dir: -1 | 1): void {
    const rows = this.rows();
    if (rows.length === 0) return;
    const i = rows.findIndex((r) => r.key === this.focus);
    const j = i < 0 ? (dir > 0 ? 0 : rows.length - 1) : Math.max(0, Math.min(rows.length - 1, i + dir));
    this.select(rows[j].key, 'only');
  }

  // ---- time window --------------------------------------------------------------------------

  get t1(): number {
    return this.t0 + this.tpp * this.width;
  }

  private clampWindow(): void {
    const end = this.endTick;
    const maxTpp = (end * 4) / Math.max(1, this.width);
    const minTpp = 1e-4;
    this.tpp = Math.min(maxTpp, Math.max(minTpp, this.tpp));
    const span = this.tpp * this.width;
    const margin = span * 0.5;
    this.t0 = Math.min(end + margin - span, Math.max(-margin, this.t0));
  }

  setWindow(t0: number, t1: number): void {
    if (!(t1 > t0)) return;
    this.tpp = (t1 - t0) / Math.max(1, this.width);
    this.t0 = t0;
    this.clampWindow();
    this.changed('window');
  }

  fit(): void {
    const end = this.endTick;
    const pad = end * 0.02;
    this.setWindow(-pad, end + pad);
  }

  /** Zooms by `factor` (>1 = closer) keeping the time under pixel x in place. */
  zoomAt(x: number, factor: number): void {
    const t = this.t0 + x * this.tpp;
    this.tpp /= factor;
    this.t0 = t - x * this.tpp;
    this.clampWindow();
    this.changed('window');
  }

  panBy(pixels: number): void {
    this.t0 += pixels * this.tpp;
    this.clampWindow();
    this.changed('window');
  }

  /** Centres the window on a tick, keeping the zoom. */
  centreOn(tick: number): void {
    this.t0 = tick - (this.width / 2) * this.tpp;
    this.clampWindow();
    this.changed('window');
  }

  /** Keeps a tick on screen, panning only when it is outside. */
  reveal(tick: number): void {
    if (tick < this.t0 || tick > this.t1) this.centreOn(tick);
  }

  // ---- cursors ------------------------------------------------------------------------------

  get activeCursor(): Cursor | null {
    return this.cursors[this.active] ?? null;
  }

  get referenceCursor(): Cursor | null {
    return this.cursors[this.reference] ?? null;
  }

  addCursor(tick: number): Cursor {
    const used = new Set(this.cursors.map((c) => c.name));
    let name = [...CURSOR_NAMES].find((n) => !used.has(n)) ?? `C${this.cursors.length + 1}`;
    while (used.has(name)) name += "'";
    const c = { id: newId(), name, tick };
    // The new cursor becomes active; the one that was active becomes the reference.
    this.reference = Math.min(this.active, this.cursors.length - 1);
    this.cursors.push(c);
    this.active = this.cursors.length - 1;
    this.changed('cursors');
    return c;
  }

  removeCursor(id: number): void {
    const i = this.cursors.findIndex((c) => c.id === id);
    if (i < 0 || this.cursors.length <= 1) return;
    const activeId = this.cursors[this.active]?.id;
    const refId = this.cursors[this.reference]?.id;
    this.cursors.splice(i, 1);
    const ai = this.cursors.findIndex((c) => c.id === activeId);
    const ri = this.cursors.findIndex((c) => c.id === refId);
    this.active = ai >= 0 ? ai : 0;
    this.reference = ri >= 0 ? ri : this.cursors.length > 1 && this.active === 0 ? 1 : 0;
    this.changed('cursors');
  }

  moveCursor(index: number, tick: number): void {
    const c = this.cursors[index];
    if (!c || !Number.isFinite(tick)) return;
    c.tick = tick;
    this.changed('cursors');
  }

  renameCursor(index: number, name: string): void {
    const c = this.cursors[index];
    const text = name.trim().slice(0, 24);
    if (!c || text === '') return;
    c.name = text;
    this.changed('cursors');
  }

  setActive(index: number): void {
    if (index < 0 || index >= this.cursors.length) return;
    this.active = index;
    this.changed('cursors');
  }

  setReference(index: number): void {
    if (index < 0 || index >= this.cursors.length) return;
    this.reference = index;
    this.changed('cursors');
  }
}
