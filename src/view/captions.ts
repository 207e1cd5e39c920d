// Lane captions: each lane's name and its value at the active cursor, written inside the lane
// above its trace, with the lane's own controls (drag grip, bits, settings, remove).
// DOM text, never HTML, positioned over the canvas; only the lanes in sight exist.
// Lanes reorder by dragging the grip; nets dragged from the drawer drop between lanes.

import { changeInEffectAt, valueTextAt } from '../model/lookup';
import { formatBits, formatReal } from '../render/radix';
import { cssColor, resolveColor, THEMES } from '../render/theme';
import { h } from './dom';
import { NET_MIME } from './drawer';
import { type GroupLane, type NetLane, type Row, type ViewState } from './state';

export interface CaptionHooks {
  openLaneSheet(key: string): void;
  notice(text: string): void;
}

/** Value of a row at a tick, in the lane's radix. */
export function rowValueAt(state: ViewState, row: Row, tick: number): string {
  const dump = state.dump;
  const sig = row.signal;
  if (!dump || !sig) return '';
  if (sig.kind === 'real') {
    // The value the dump holds at that time (the plot joins samples with straight lines).
    const i = changeInEffectAt(dump, sig, tick);
    return i < 0 ? '—' : formatReal(sig.reals[i]);
  }
  if (sig.kind === 'string') return valueTextAt(dump, sig, tick);
  const bits = valueTextAt(dump, sig, tick);
  if (sig.kind === 'event') return '';
  const lane = row.lane as NetLane;
  return row.kind === 'bit' || sig.width === 1 ? formatBits(bits, 'bin') : formatBits(bits, lane.radix);
}

export class Captions {
  private drag: { keys: string[]; before: string | null; pointer: number } | null = null;

  constructor(
    private readonly state: ViewState,
    private readonly scroller: HTMLElement,
    private readonly spacer: HTMLElement,
    private readonly box: HTMLElement,
    private readonly dropLine: HTMLElement,
    private readonly hooks: CaptionHooks,
  ) {
    box.addEventListener('click', (e) => this.onClick(e));
    box.addEventListener('dblclick', (e) => {
      const t = e.target as HTMLElement;
      const cap = t.closest<HTMLElement>('.cap');
      if (cap && t.closest('.cap-name')) this.startRename(cap.dataset.key!);
    });
    box.addEventListener('pointerdown', (e) => this.onGripDown(e));
    scroller.addEventListener('dragover', (e) => this.onNetDragOver(e));
    scroller.addEventListener('dragleave', () => (this.dropLine.hidden = true));
    scroller.addEventListener('drop', (e) => this.onNetDrop(e));
  }

  /** Captions by row key. Kept across renders so a double-click lands on the same element twice. */
  private cache = new Map<string, { el: HTMLElement; shape: string }>();
  private ambiguous = new Set<string>();

  /** Brings the captions in sight up to date. */
  render(): void {
    const rows = this.state.rows();
    const total = rows.length ? rows[rows.length - 1].top + rows[rows.length - 1].height : 0;
    this.spacer.style.height = `${total + 80}px`;
    const top = this.scroller.scrollTop - 100;
    const bottom = this.scroller.scrollTop + this.scroller.clientHeight + 100;
    const theme = THEMES[this.state.theme];
    const active = this.state.activeCursor;
    // A lane's scope is shown only when another shown lane has the same name.
    const seen = new Map<string, number>();
    for (const r of rows) if (r.kind === 'net' && r.net) seen.set(r.net.name, (seen.get(r.net.name) ?? 0) + 1);
    this.ambiguous = new Set([...seen].filter(([, n]) => n > 1).map(([name]) => name));
    const keep = new Set<string>();
    const wanted: HTMLElement[] = [];
    for (const row of rows) {
      if (row.top + row.height < top || row.top > bottom) continue;
      keep.add(row.key);
      wanted.push(this.caption(row, theme, active ? active.tick : 0));
    }
    for (const [key, c] of this.cache) {
      if (!keep.has(key)) {
        c.el.remove();
        this.cache.delete(key);
      }
    }
    // Append only what is new or out of order; elements already in place stay untouched.
    let prev: Element | null = null;
    for (const el of wanted) {
      const expected: Element | null = prev ? prev.nextElementSibling : this.box.firstElementChild;
      if (expected !== el) this.box.insertBefore(el, expected);
      prev = el;
    }
  }

  /** The caption element of a row, made once per row and shape, then updated in place. */
  private caption(row: Row, theme: (typeof THEMES)['paper'], tick: number): HTMLElement {
    const st = this.state;
    const label = st.rowLabel(row);
    const lane = row.lane;
    const wide = row.kind === 'net' && row.net !== null && row.net.width > 1 && (lane as NetLane).bit === null && row.signal?.kind === 'vector';
    const shape = `${row.kind}|${wide}`;
    let c = this.cache.get(row.key);
    if (!c || c.shape !== shape) {
      c?.el.remove();
      c = { el: this.build(row, wide), shape };
      this.cache.set(row.key, c);
    }
    const el = c.el;
    const set = (sel: string, text: string) => {
      const n = el.querySelector<HTMLElement>(sel);
      if (n && n.textContent !== text) n.textContent = text;
    };
    const attr = (sel: string, name: string, value: string) => {
      const n = sel ? el.querySelector<HTMLElement>(sel) : el;
      if (n && n.getAttribute(name) !== value) n.setAttribute(name, value);
    };
    el.classList.toggle('is-selected', st.selected.has(row.key));
    el.classList.toggle('is-focus', st.focus === row.key);
    el.style.transform = `translateY(${row.top}px)`;
    el.style.paddingLeft = `${6 + row.depth * 14}px`;
    if (el.querySelector('.cap-rename')) return el; // being renamed: leave the field alone
    set('.cap-name', label);
    if (row.kind === 'group') {
      const g = lane as GroupLane;
      set('.cap-twist', g.collapsed ? '▸' : '▾');
      attr('.cap-twist', 'aria-expanded', String(!g.collapsed));
      attr('.cap-twist', 'aria-label', g.collapsed ? `Open group ${label}` : `Fold group ${label}`);
      set('.cap-count', `${g.children.length} ${g.children.length === 1 ? 'lane' : 'lanes'}`);
      attr('.cap-more', 'aria-label', `Settings for ${label}`);
      attr('.cap-remove', 'aria-label', `Remove heading ${label}`);
      return el;
    }
    const net = lane as NetLane;
    const path = `${net.path}${row.bit !== null ? `[${row.bit}]` : ''}`;
    attr('', 'data-path', path);
    const scope = row.kind === 'net' && net.label === null && row.net && this.ambiguous.has(row.net.name) && row.net.scope >= 0 && st.dump ? st.dump.scopes[row.net.scope].name : '';
    set('.cap-scope', scope ? `${scope} ·` : '');
    attr('.cap-name', 'title', `${path} — double-click to rename`);
    (el.querySelector('.cap-swatch') as HTMLElement).style.backgroundColor = cssColor(resolveColor(theme, net.color));
    set('.cap-value', rowValueAt(st, row, tick));
    if (wide) {
      set('.cap-bits', net.expanded ? 'bits ▾' : 'bits ▸');
      attr('.cap-bits', 'aria-pressed', String(net.expanded));
      attr('.cap-bits', 'title', net.expanded ? 'Hide bits (B)' : 'Show each bit (B)');
    }
    attr('.cap-grip', 'aria-label', `Move ${label}`);
    attr('.cap-more', 'aria-label', `Settings for ${label}`);
    attr('.cap-remove', 'aria-label', `Remove ${label}`);
    return el;
  }

  private build(row: Row, wide: boolean): HTMLElement {
    const cap = h('div', { class: `cap cap-${row.kind}`, 'data-key': row.key });
    if (row.kind === 'group') {
      cap.classList.add('cap-tall');
      cap.append(
        h('span', { class: 'cap-grip', title: 'Drag to move this group', text: '⠿' }),
        h('button', { class: 'cap-twist', type: 'button' }),
        h('span', { class: 'cap-name', title: 'Double-click to rename' }),
        h('span', { class: 'cap-count' }),
        h('button', { class: 'cap-more', type: 'button', title: 'Group settings', text: '⋯' }),
        h('button', { class: 'cap-remove', type: 'button', title: 'Remove the heading (keeps its lanes)', text: '×' }),
      );
      return cap;
    }
    if (row.kind === 'net') cap.append(h('span', { class: 'cap-grip', title: 'Drag to move this lane', text: '⠿' }));
    cap.append(h('span', { class: 'cap-swatch' }), h('span', { class: 'cap-scope' }), h('span', { class: 'cap-name' }), h('span', { class: 'cap-value', title: 'Value at the active cursor' }));
    if (wide) cap.append(h('button', { class: 'cap-bits', type: 'button' }));
    if (row.kind === 'net') {
      cap.append(
        h('button', { class: 'cap-more', type: 'button', title: 'Lane settings: name, radix, colour', text: '⋯' }),
        h('button', { class: 'cap-remove', type: 'button', title: 'Remove from view (Delete)', text: '×' }),
      );
    }
    return cap;
  }

  private onClick(e: MouseEvent): void {
    const t = e.target as HTMLElement;
    const cap = t.closest<HTMLElement>('.cap');
    if (!cap) return;
    const key = cap.dataset.key!;
    const row = this.state.rowByKey(key);
    if (!row) return;
    if (t.closest('.cap-remove')) this.state.removeRows([key]);
    else if (t.closest('.cap-twist')) this.state.toggleCollapsed(row.lane.id);
    else if (t.closest('.cap-bits')) this.state.toggleExpanded(row.lane as NetLane);
    else if (t.closest('.cap-more')) {
      this.state.select(key, 'only');
      this.hooks.openLaneSheet(key);
    } else if (!t.closest('.cap-grip')) this.state.select(key, e.shiftKey ? 'extend' : e.ctrlKey || e.metaKey ? 'toggle' : 'only');
  }

  startRename(key: string): void {
    const row = this.state.rowByKey(key);
    const cap = this.box.querySelector<HTMLElement>(`.cap[data-key="${CSS.escape(key)}"]`);
    const name = cap?.querySelector<HTMLElement>('.cap-name');
    if (!row || !cap || !name || row.kind === 'bit') return;
    const input = h('input', { class: 'cap-rename', 'aria-label': 'Lane name' });
    input.value = this.state.rowLabel(row);
    let done = false;
    const finish = (commit: boolean) => {
      if (done) return;
      done = true;
      input.replaceWith(name);
      if (commit) this.state.rename(key, input.value);
      else this.render();
    };
    input.addEventListener('keydown', (e) => {
      e.stopPropagation();
      if (e.key === 'Enter') finish(true);
      else if (e.key === 'Escape') finish(false);
    });
    input.addEventListener('blur', () => finish(true));
    name.replaceWith(input);
    input.focus();
    input.select();
  }

  // ---- reordering by the grip -----------------------------------------------------------------

  private onGripDown(e: PointerEvent): void {
    const grip = (e.target as HTMLElement).closest('.cap-grip');
    const cap = grip?.closest<HTMLElement>('.cap');
    if (!grip || !cap || e.button !== 0) return;
    e.preventDefault();
    const key = cap.dataset.key!;
    const keys = this.state.selected.has(key) ? this.state.rows().filter((r) => this.state.selected.has(r.key) && r.kind !== 'bit').map((r) => r.key) : [key];
    this.drag = { keys, before: key, pointer: e.pointerId };
    (grip as HTMLElement).setPointerCapture(e.pointerId);
    const move = (ev: PointerEvent) => this.onGripMove(ev);
    const up = (ev: PointerEvent) => {
      grip.removeEventListener('pointermove', move as EventListener);
      grip.removeEventListener('pointerup', up as EventListener);
      grip.removeEventListener('pointercancel', up as EventListener);
      const d = this.drag;
      this.drag = null;
      this.dropLine.hidden = true;
      if (d && ev.type === 'pointerup') this.state.moveRows(d.keys, d.before);
    };
    grip.addEventListener('pointermove', move as EventListener);
    grip.addEventListener('pointerup', up as EventListener);
    grip.addEventListener('pointercancel', up as EventListener);
  }

  /** Row key a drop at client y lands before (null = after the last lane), and the line's y. */
  private dropTarget(clientY: number): { before: string | null; y: number } {
    const rect = this.scroller.getBoundingClientRect();
    const y = clientY - rect.top + this.scroller.scrollTop;
    const rows = this.state.rows().filter((r) => r.kind !== 'bit');
    for (const r of rows) if (y < r.top + r.height / 2) return { before: r.key, y: r.top };
    const all = this.state.rows();
    const last = all[all.length - 1];
    return { before: null, y: last ? last.top + last.height : 0 };
  }

  private showDropLine(y: number): void {
    this.dropLine.hidden = false;
    this.dropLine.style.transform = `translateY(${y - 1}px)`;
  }

  private onGripMove(e: PointerEvent): void {
    if (!this.drag) return;
    const rect = this.scroller.getBoundingClientRect();
    // Scroll when dragging near the top or bottom edge.
    if (e.clientY < rect.top + 20) this.scroller.scrollTop -= 12;
    else if (e.clientY > rect.bottom - 20) this.scroller.scrollTop += 12;
    const t = this.dropTarget(e.clientY);
    this.drag.before = t.before;
    this.showDropLine(t.y);
  }

  // ---- nets dropped from the drawer ---------------------------------------------------------

  private onNetDragOver(e: DragEvent): void {
    if (!e.dataTransfer || !e.dataTransfer.types.includes(NET_MIME)) return;
    e.preventDefault();
    e.dataTransfer.dropEffect = 'copy';
    this.showDropLine(this.dropTarget(e.clientY).y);
  }

  private onNetDrop(e: DragEvent): void {
    if (!e.dataTransfer || !e.dataTransfer.types.includes(NET_MIME)) return;
    e.preventDefault();
    e.stopPropagation();
    this.dropLine.hidden = true;
    let paths: unknown;
    try {
      paths = JSON.parse(e.dataTransfer.getData(NET_MIME));
    } catch {
      return;
    }
    if (!Array.isArray(paths)) return;
    const before = this.dropTarget(e.clientY).before;
    const row = this.state.rowByKey(before);
    let at: number | undefined;
    if (row) {
      const topId = row.group !== null ? row.group : row.lane.id;
      at = this.state.lanes.findIndex((l) => l.id === topId);
    }
    this.state.addNets(paths.filter((p): p is string => typeof p === 'string'), at);
  }
}
