// Views in and out of the viewer state: the saved-view file (viewfile.ts) from what is shown,
// and what is shown from a saved view, on whatever dump is open.

import { radixAllowed } from '../render/radix';
import { type NetLane, type TopLane, type ViewState, newId } from './state';
import { VIEW_FORMAT, VIEW_VERSION, type ViewFile, type ViewLane } from './viewfile';

/** A panel that keeps its own part of the view (the measurements): saved with it, handed back on restore. */
export interface ViewPart {
  save(): ViewFile['measure'];
  restore(part: ViewFile['measure']): void;
}

let part: ViewPart | null = null;

export function keepInView(p: ViewPart): void {
  part = p;
}

/** The saved-view file for what is shown now. */
export function viewOf(st: ViewState): ViewFile {
  const s = st.tickSeconds;
  const measure = part?.save();
  const laneOut = (l: NetLane): ViewLane => {
    const v: ViewLane = { net: l.path };
    if (l.bit !== null) v.bit = l.bit;
    if (l.label) v.label = l.label;
    v.radix = l.radix;
    v.color = l.color;
    if (l.expanded) v.expanded = true;
    if (l.lo !== null) v.lo = l.lo;
    if (l.hi !== null) v.hi = l.hi;
    if (l.level !== null) v.level = l.level;
    return v;
  };
  return {
    format: VIEW_FORMAT,
    version: VIEW_VERSION,
    dump: st.dump?.source ?? '',
    window: { start: st.t0 * s, end: st.t1 * s },
    cursors: st.cursors.map((c) => ({ name: c.name, time: c.tick * s })),
    activeCursor: Math.min(st.active, Math.max(0, st.cursors.length - 1)),
    referenceCursor: Math.min(st.reference, Math.max(0, st.cursors.length - 1)),
    lanes: st.lanes.map((l) => (l.kind === 'net' ? laneOut(l) : { group: l.label, collapsed: l.collapsed, lanes: l.children.map(laneOut) })),
    theme: st.theme,
    ...(measure ? { measure } : {}),
  };
}

/** Applies a checked view to the current dump; returns the nets it names that are missing. */
export function applyView(st: ViewState, view: ViewFile): string[] {
  const missing: string[] = [];
  const s = st.tickSeconds;
  const toTick = (sec: number) => Math.round((sec / s) * 1e6) / 1e6;
  const laneIn = (v: ViewLane): NetLane | null => {
    const net = st.netOf(v.net);
    if (!net) {
      missing.push(v.net);
      return null;
    }
    let bit: number | null = v.bit ?? null;
    if (bit !== null) {
      const lo = Math.min(net.msb, net.lsb);
      const hi = Math.max(net.msb, net.lsb);
      if (!net.ranged || bit < lo || bit > hi) {
        missing.push(`${v.net}[${bit}]`);
        return null;
      }
    }
    const lane = st.newLane(v.net, bit);
    lane.label = v.label ?? null;
    if (v.radix && radixAllowed(v.radix, bit === null ? net.width : 1)) lane.radix = v.radix;
    if (v.color !== undefined) lane.color = v.color;
    lane.expanded = v.expanded === true && net.width > 1 && bit === null;
    lane.lo = v.lo ?? null;
    lane.hi = v.hi ?? null;
    lane.level = v.level ?? null;
    return lane;
  };
  st.batch(() => {
    const lanes: TopLane[] = [];
    for (const item of view.lanes) {
      if ('group' in item) {
        const children = item.lanes.map(laneIn).filter((l): l is NetLane => l !== null);
        lanes.push({ kind: 'group', id: newId(), label: item.group, collapsed: item.collapsed === true, children });
      } else {
        const l = laneIn(item);
        if (l) lanes.push(l);
      }
    }
    st.lanes = lanes;
    st.cursors = view.cursors.map((c) => ({ id: newId(), name: c.name, tick: toTick(c.time) }));
    if (st.cursors.length === 0) st.cursors.push({ id: newId(), name: 'A', tick: 0 });
    st.active = Math.min(view.activeCursor, st.cursors.length - 1);
    st.reference = Math.min(view.referenceCursor, st.cursors.length - 1);
    st.setWindow(toTick(view.window.start), toTick(view.window.end));
    if (view.theme) st.theme = view.theme;
    st.selected.clear();
    st.focus = null;
    st.changed('lanes', 'window', 'cursors', 'selection', 'theme');
    part?.restore(view.measure);
  });
  return missing;
}
