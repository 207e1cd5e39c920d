// The net drawer: a scope tree with counts, a filter (contains / glob / regex), and a
// virtualised list that keeps only the rows in sight in the DOM, so 100,000 nets scroll
// smoothly. Nets are added by double-click, Enter, the + button, dragging onto the traces,
// or "Add all matching".

import type { Dump, Net } from '../model/dump';
import { h } from './dom';
import { FilterError, type FilterMode, makeMatcher } from './filter';

export const NET_MIME = 'application/x-midrail-nets';
const ROW_H = 26;
const OVERSCAN = 6;

interface Entry {
  net: Net;
  scopePath: string;
}

interface ScopeNode {
  index: number;
  name: string;
  path: string;
  children: ScopeNode[];
  direct: number;
  total: number;
  open: boolean;
}

export interface DrawerHooks {
  add(paths: string[]): void;
  isShown(path: string): boolean;
  notice(text: string): void;
  /** A count shown beside a net (its glitches), or null. */
  badge?(path: string): { text: string; title: string } | null;
}

function describeWidth(net: Net, kind: string): string {
  if (kind === 'real') return 'real';
  if (kind === 'string') return 'text';
  if (kind === 'event') return 'event';
  if (net.ranged) return `[${net.msb}:${net.lsb}]`;
  return net.width > 1 ? `${net.width} bits` : '';
}

export class NetDrawer {
  private dump: Dump | null = null;
  private entries: Entry[] = [];
  private shown: Entry[] = [];
  private scopes: ScopeNode[] = [];
  private scopeFilter: string | null = null;
  private cursor = 0;
  private pool: HTMLElement[] = [];
  private filterTimer = 0;

  constructor(
    private readonly list: HTMLElement,
    private readonly spacer: HTMLElement,
    private readonly filter: HTMLInputElement,
    private readonly mode: HTMLSelectElement,
    private readonly errorBox: HTMLElement,
    private readonly countBox: HTMLElement,
    private readonly tree: HTMLElement,
    addAll: HTMLButtonElement,
    private readonly hooks: DrawerHooks,
  ) {
    this.list.addEventListener('scroll', () => this.paint());
    new ResizeObserver(() => this.paint()).observe(this.list);
    this.filter.addEventListener('input', () => {
      clearTimeout(this.filterTimer);
      this.filterTimer = window.setTimeout(() => this.applyFilter(), 90);
    });
    this.filter.addEventListener('keydown', (e) => {
      if (e.key === 'ArrowDown' || e.key === 'Enter') {
        e.preventDefault();
        this.applyFilter();
        this.list.focus();
        if (e.key === 'Enter' && this.shown.length === 1) this.addAt(0);
      }
    });
    this.mode.addEventListener('change', () => this.applyFilter());
    addAll.addEventListener('click', () => this.addAllMatching());
    this.list.addEventListener('dblclick', (e) => {
      const i = this.rowIndex(e.target);
      if (i !== null) this.addAt(i);
    });
    this.list.addEventListener('click', (e) => {
      const t = e.target as HTMLElement;
      const i = this.rowIndex(t);
      if (i === null) return;
      this.cursor = i;
      if (t.closest('.net-add')) this.addAt(i);
      this.paint();
    });
    this.list.addEventListener('keydown', (e) => this.onKey(e));
    this.list.addEventListener('dragstart', (e) => {
      const i = this.rowIndex(e.target);
      if (i === null || !e.dataTransfer) return;
      const path = this.shown[i].net.path;
      e.dataTransfer.setData(NET_MIME, JSON.stringify([path]));
      e.dataTransfer.setData('text/plain', path);
      e.dataTransfer.effectAllowed = 'copy';
    });
    this.tree.addEventListener('click', (e) => this.onTreeClick(e));
  }

  setDump(dump: Dump): void {
    this.dump = dump;
    const seen = new Set<string>();
    this.entries = [];
    for (const net of dump.nets) {
      if (seen.has(net.path)) continue;
      seen.add(net.path);
      this.entries.push({ net, scopePath: net.scope >= 0 ? dump.scopes[net.scope].path : '' });
    }
    this.buildScopes(dump);
    this.scopeFilter = null;
    this.cursor = 0;
    this.applyFilter();
    this.paintTree();
  }

  focusFilter(): void {
    this.filter.focus();
    this.filter.select();
  }

  /** Re-marks which nets are shown (after lanes change). */
  refresh(): void {
    this.paint();
  }

  private buildScopes(dump: Dump): void {
    const nodes: ScopeNode[] = dump.scopes.map((s, index) => ({ index, name: s.name, path: s.path, children: [], direct: 0, total: 0, open: false }));
    const roots: ScopeNode[] = [];
    dump.scopes.forEach((s, i) => (s.parent >= 0 ? nodes[s.parent].children.push(nodes[i]) : roots.push(nodes[i])));
    for (const e of this.entries) if (e.net.scope >= 0) nodes[e.net.scope].direct++;
    const total = (n: ScopeNode): number => (n.total = n.direct + n.children.reduce((a, c) => a + total(c), 0));
    roots.forEach(total);
    roots.forEach((r) => (r.open = true));
    this.scopes = roots;
  }

  private paintTree(): void {
    const rows: HTMLElement[] = [];
    const all = h('button', { class: 'scope-row' + (this.scopeFilter === null ? ' is-current' : ''), type: 'button', 'data-scope': '' }, h('span', { class: 'scope-name', text: 'All scopes' }), h('span', { class: 'count', text: String(this.entries.length) }));
    rows.push(all);
    const walk = (n: ScopeNode, depth: number) => {
      const row = h(
        'div',
        { class: 'scope-line', role: 'treeitem', 'aria-expanded': n.children.length ? String(n.open) : undefined },
        n.children.length ? h('button', { class: 'scope-twist', type: 'button', 'data-twist': String(n.index), 'aria-label': (n.open ? 'Collapse ' : 'Expand ') + n.name, text: n.open ? '▾' : '▸' }) : h('span', { class: 'scope-twist-pad' }),
        h('button', { class: 'scope-row' + (this.scopeFilter === n.path ? ' is-current' : ''), type: 'button', 'data-scope': n.path, title: n.path }, h('span', { class: 'scope-name', text: n.name }), h('span', { class: 'count', text: n.direct === n.total ? String(n.total) : `${n.direct} · ${n.total}` })),
      );
      row.style.paddingLeft = `${depth * 12}px`;
      rows.push(row);
      if (n.open) for (const c of n.children) walk(c, depth + 1);
    };
    for (const r of this.scopes) walk(r, 0);
    this.tree.replaceChildren(...rows);
  }

  private onTreeClick(e: MouseEvent): void {
    const t = e.target as HTMLElement;
    const twist = t.closest<HTMLElement>('[data-twist]');
    if (twist) {
      const find = (list: ScopeNode[]): ScopeNode | null => {
        for (const n of list) {
          if (String(n.index) === twist.dataset.twist) return n;
          const f = find(n.children);
          if (f) return f;
        }
        return null;
      };
      const n = find(this.scopes);
      if (n) n.open = !n.open;
      this.paintTree();
      return;
    }
    const row = t.closest<HTMLElement>('[data-scope]');
    if (!row) return;
    const path = row.dataset.scope || null;
    this.scopeFilter = this.scopeFilter === path ? null : path;
    this.paintTree();
    this.applyFilter();
  }

  private applyFilter(): void {
    let match: (p: string) => boolean;
    try {
      match = makeMatcher(this.filter.value, this.mode.value as FilterMode);
      this.errorBox.textContent = '';
      this.filter.removeAttribute('aria-invalid');
    } catch (e) {
      if (!(e instanceof FilterError)) throw e;
      this.errorBox.textContent = e.message;
      this.filter.setAttribute('aria-invalid', 'true');
      match = () => false;
    }
    const scope = this.scopeFilter;
    this.shown = this.entries.filter((e) => (scope === null || e.scopePath === scope || e.scopePath.startsWith(scope + '.')) && match(e.net.path));
    this.cursor = Math.min(this.cursor, Math.max(0, this.shown.length - 1));
    this.countBox.textContent = `${this.shown.length.toLocaleString('en')} of ${this.entries.length.toLocaleString('en')} nets`;
    this.spacer.style.height = `${this.shown.length * ROW_H}px`;
    this.list.scrollTop = Math.min(this.list.scrollTop, Math.max(0, this.shown.length * ROW_H - this.list.clientHeight));
    this.paint();
  }

  /** Paths of every net the filter and scope let through. */
  matchingPaths(): string[] {
    return this.shown.map((e) => e.net.path);
  }

  private addAllMatching(): void {
    // A filter typed a moment ago may not have been applied yet.
    clearTimeout(this.filterTimer);
    this.applyFilter();
    const paths = this.matchingPaths().filter((p) => !this.hooks.isShown(p));
    if (paths.length === 0) {
      this.hooks.notice('every matching net is already shown');
      return;
    }
    this.hooks.add(paths);
  }

  private addAt(i: number): void {
    const e = this.shown[i];
    if (e) this.hooks.add([e.net.path]);
  }

  private rowIndex(target: EventTarget | null): number | null {
    const row = (target as HTMLElement | null)?.closest?.<HTMLElement>('.net-row');
    if (!row || row.dataset.index === undefined) return null;
    const i = Number(row.dataset.index);
    return i >= 0 && i < this.shown.length ? i : null;
  }

  private onKey(e: KeyboardEvent): void {
    const page = Math.max(1, Math.floor(this.list.clientHeight / ROW_H) - 1);
    let next = this.cursor;
    if (e.key === 'ArrowDown') next++;
    else if (e.key === 'ArrowUp') next--;
    else if (e.key === 'PageDown') next += page;
    else if (e.key === 'PageUp') next -= page;
    else if (e.key === 'Home') next = 0;
    else if (e.key === 'End') next = this.shown.length - 1;
    else if (e.key === 'Enter') {
      e.preventDefault();
      this.addAt(this.cursor);
      return;
    } else return;
    e.preventDefault();
    e.stopPropagation();
    this.cursor = Math.max(0, Math.min(this.shown.length - 1, next));
    const top = this.cursor * ROW_H;
    if (top < this.list.scrollTop) this.list.scrollTop = top;
    else if (top + ROW_H > this.list.scrollTop + this.list.clientHeight) this.list.scrollTop = top + ROW_H - this.list.clientHeight;
    this.paint();
  }

  /** Draws the rows in sight, reusing row elements. */
  private paint(): void {
    if (!this.dump) return;
    const first = Math.max(0, Math.floor(this.list.scrollTop / ROW_H) - OVERSCAN);
    const last = Math.min(this.shown.length, Math.ceil((this.list.scrollTop + this.list.clientHeight) / ROW_H) + OVERSCAN);
    const need = Math.max(0, last - first);
    while (this.pool.length < need) {
      const row = h(
        'div',
        { class: 'net-row', draggable: 'true', role: 'option' },
        h('span', { class: 'net-name' }),
        h('span', { class: 'net-scope' }),
        h('span', { class: 'net-width' }),
        h('button', { class: 'net-add', type: 'button', tabindex: '-1', text: '+' }),
        h('span', { class: 'net-badge', hidden: true }),
      );
      this.pool.push(row);
      this.spacer.append(row);
    }
    for (let k = 0; k < this.pool.length; k++) {
      const row = this.pool[k];
      const i = first + k;
      if (k >= need) {
        row.hidden = true;
        continue;
      }
      const e = this.shown[i];
      const kind = this.dump.signals[e.net.signal].kind;
      row.hidden = false;
      row.dataset.index = String(i);
      row.style.transform = `translateY(${i * ROW_H}px)`;
      (row.children[0] as HTMLElement).textContent = e.net.name;
      (row.children[1] as HTMLElement).textContent = e.scopePath;
      (row.children[2] as HTMLElement).textContent = describeWidth(e.net, kind);
      const add = row.children[3] as HTMLElement;
      add.setAttribute('aria-label', `Add ${e.net.path}`);
      row.title = e.net.path;
      const badge = row.children[4] as HTMLElement;
      const mark = this.hooks.badge?.(e.net.path) ?? null;
      badge.hidden = mark === null;
      badge.textContent = mark?.text ?? '';
      badge.title = mark?.title ?? '';
      row.classList.toggle('is-cursor', i === this.cursor);
      row.classList.toggle('is-shown', this.hooks.isShown(e.net.path));
      row.setAttribute('aria-selected', String(i === this.cursor));
    }
  }
}
