// A sortable table of measured items that keeps only the rows in sight in the DOM, so a million
// pairs scroll as smoothly as ten. Rows are item indices in the order the worker (or the page, for
// small tables) worked out; clicking a row jumps the canvas there, its + button adds it to the
// worst-case sheet.

import { h } from '../dom';
import type { SortKey } from './order';

export interface Column {
  title: string;
  /** Sortable columns name their sort key. */
  sort?: SortKey;
  /** Cell text of item i. */
  text(i: number): string;
  /** Extra class of the cells (alignment, colour). */
  cls?: (i: number) => string;
}

export interface TableHooks {
  pick(i: number): void;
  add?(i: number): void;
  sort(key: SortKey, descending: boolean): void;
}

const ROW_H = 22;
const OVERSCAN = 8;

export class ItemTable {
  readonly el: HTMLElement;
  private readonly head: HTMLElement;
  private readonly scroller: HTMLElement;
  private readonly spacer: HTMLElement;
  private pool: HTMLElement[] = [];
  private columns: Column[] = [];
  private order: Uint32Array | null = null;
  private count = 0;
  private key: SortKey = 'time';
  private descending = false;
  private chosen = -1;

  constructor(
    id: string,
    label: string,
    private readonly hooks: TableHooks,
  ) {
    this.head = h('div', { class: 'mt-head', role: 'row' });
    this.spacer = h('div', { class: 'mt-spacer' });
    this.scroller = h('div', { class: 'mt-scroll', tabindex: '0' }, this.spacer);
    this.el = h('div', { class: 'mt', id, role: 'grid', 'aria-label': label }, this.head, this.scroller);
    this.scroller.addEventListener('scroll', () => this.paint());
    this.spacer.addEventListener('click', (e) => {
      const t = e.target as HTMLElement;
      const row = t.closest<HTMLElement>('.mt-row');
      if (!row || row.dataset.item === undefined) return;
      const i = Number(row.dataset.item);
      if (t.closest('.mt-add')) this.hooks.add?.(i);
      else {
        this.chosen = i;
        this.hooks.pick(i);
        this.paint();
      }
    });
    this.scroller.addEventListener('keydown', (e) => this.onKey(e));
  }

  setColumns(columns: Column[]): void {
    this.columns = columns;
    for (const r of this.pool) r.remove();
    this.pool = [];
    this.paintHead();
    this.paint();
  }

  /** Rows to show: item indices in order (null = items 0..count-1 in time order). */
  setRows(order: Uint32Array | null, count: number): void {
    this.order = order;
    this.count = order ? order.length : count;
    this.spacer.style.height = `${this.count * ROW_H}px`;
    this.scroller.scrollTop = Math.min(this.scroller.scrollTop, Math.max(0, this.count * ROW_H - this.scroller.clientHeight));
    this.paint();
  }

  setSort(key: SortKey, descending: boolean): void {
    this.key = key;
    this.descending = descending;
    this.paintHead();
  }

  get rows(): number {
    return this.count;
  }

  /** Item index shown at row r. */
  itemAt(r: number): number {
    return this.order ? this.order[r] : r;
  }

  /** Marks item i as chosen and scrolls its row into sight. */
  choose(i: number): void {
    this.chosen = i;
    let r = -1;
    if (this.order) r = this.order.indexOf(i);
    else if (i < this.count) r = i;
    if (r >= 0) {
      const top = r * ROW_H;
      if (top < this.scroller.scrollTop || top + ROW_H > this.scroller.scrollTop + this.scroller.clientHeight) this.scroller.scrollTop = Math.max(0, top - ROW_H * 2);
    }
    this.paint();
  }

  private paintHead(): void {
    const cells = this.columns.map((c) => {
      if (!c.sort) return h('span', { class: 'mt-th', role: 'columnheader', text: c.title });
      const on = this.key === c.sort;
      const b = h('button', {
        class: 'mt-th mt-sort' + (on ? ' is-on' : ''),
        type: 'button',
        role: 'columnheader',
        'aria-sort': on ? (this.descending ? 'descending' : 'ascending') : 'none',
        title: `Sort by ${c.title}`,
        'data-sort': c.sort,
        text: `${c.title}${on ? (this.descending ? ' ▾' : ' ▴') : ''}`,
      });
      b.addEventListener('click', () => this.hooks.sort(c.sort!, on ? !this.descending : c.sort !== 'time'));
      return b;
    });
    if (this.hooks.add) cells.push(h('span', { class: 'mt-th mt-th-add', text: '' }));
    this.head.replaceChildren(...cells);
    this.head.style.gridTemplateColumns = this.template();
  }

  private template(): string {
    return this.columns.map(() => 'minmax(0, 1fr)').join(' ') + (this.hooks.add ? ' 24px' : '');
  }

  private onKey(e: KeyboardEvent): void {
    if (e.key !== 'ArrowDown' && e.key !== 'ArrowUp') return;
    e.preventDefault();
    e.stopPropagation();
    let r = -1;
    for (let k = 0; k < this.count; k++) if (this.itemAt(k) === this.chosen) r = k;
    r = Math.max(0, Math.min(this.count - 1, r + (e.key === 'ArrowDown' ? 1 : -1)));
    if (this.count === 0) return;
    const i = this.itemAt(r);
    this.choose(i);
    this.hooks.pick(i);
  }

  private paint(): void {
    const first = Math.max(0, Math.floor(this.scroller.scrollTop / ROW_H) - OVERSCAN);
    const last = Math.min(this.count, Math.ceil((this.scroller.scrollTop + (this.scroller.clientHeight || 240)) / ROW_H) + OVERSCAN);
    const need = Math.max(0, last - first);
    const template = this.template();
    while (this.pool.length < need) {
      const row = h('div', { class: 'mt-row', role: 'row' });
      for (let c = 0; c < this.columns.length; c++) row.append(h('span', { class: 'mt-td', role: 'gridcell' }));
      if (this.hooks.add) row.append(h('button', { class: 'mt-add', type: 'button', title: 'Add this row to the worst-case sheet', text: '+' }));
      row.style.gridTemplateColumns = template;
      this.pool.push(row);
      this.spacer.append(row);
    }
    for (let k = 0; k < this.pool.length; k++) {
      const row = this.pool[k];
      if (k >= need) {
        row.hidden = true;
        continue;
      }
      const r = first + k;
      const i = this.itemAt(r);
      row.hidden = false;
      row.dataset.item = String(i);
      row.dataset.row = String(r);
      row.style.transform = `translateY(${r * ROW_H}px)`;
      row.classList.toggle('is-chosen', i === this.chosen);
      this.columns.forEach((c, n) => {
        const cell = row.children[n] as HTMLElement;
        const text = c.text(i);
        if (cell.textContent !== text) cell.textContent = text;
        const cls = 'mt-td' + (c.cls ? ` ${c.cls(i)}` : '');
        if (cell.className !== cls) cell.className = cls;
      });
      const add = row.children[this.columns.length] as HTMLElement | undefined;
      add?.setAttribute('aria-label', `Add row ${r + 1} to the worst-case sheet`);
    }
  }
}
