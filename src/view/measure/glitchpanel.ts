// The "Glitches" tab: the background scan of every loaded net, with its width control and the
// documented default (clockguess.ts), the count limits, a list to step through, a histogram of the
// widths (a bar filters the list) and the table of every glitch.

import { formatTime } from '../../model/units';
import { button, h } from '../dom';
import { type Bins, binValues } from './bins';
import { type MeasureDesk, shortName } from './desk';
import { Histogram } from './histogram';
import { type RowFilter, type SortKey, orderItems } from './order';
import { ItemTable } from './table';
import { GLITCH_KINDS, GLITCH_SCAN_ID } from './types';
import { rowOf } from './worstrows';

const ADD_ALL_LIMIT = 10_000;

export class GlitchPanel {
  readonly panel = h('div', { class: 'panel panel-glitches' });
  private readonly width = h('input', { class: 'field field-time', id: 'glitch-width', title: 'Glitches narrower than this are marked (a time with its unit: 1ns, 500ps); empty = the default', autocomplete: 'off' });
  private readonly widthNote = h('p', { class: 'muted', id: 'glitch-width-note' });
  private readonly status = h('p', { class: 'm-status', id: 'glitch-status', role: 'status' });
  private readonly at = h('p', { class: 'm-status', id: 'glitch-at' });
  private readonly min = h('input', { class: 'field field-num', id: 'glitch-min', placeholder: 'none', title: 'Fewest glitches allowed' });
  private readonly max = h('input', { class: 'field field-num', id: 'glitch-max', placeholder: 'none', title: 'Most glitches allowed' });
  private readonly verdict = h('span', { id: 'glitch-verdict' });
  private readonly histogram: Histogram;
  private readonly table: ItemTable;
  private filter: RowFilter = {};
  private sortKey: SortKey = 'time';
  private descending = false;
  private order: Uint32Array | null = null;

  constructor(private readonly desk: MeasureDesk) {
    this.histogram = new Histogram('glitch-hist', { bin: (index, bins) => this.onBin(index, bins) });
    this.table = new ItemTable('glitch-table', 'Every glitch found', {
      pick: (i) => desk.focusGlitch(i),
      add: (i) => desk.addItem(GLITCH_SCAN_ID, i),
      sort: (key, desc) => {
        this.sortKey = key;
        this.descending = desc;
        this.reorder();
      },
    });
    const apply = () => {
      const text = this.width.value.trim() || null;
      // Enter applies it, and so does leaving the field: only a new width scans again.
      if (text !== desk.glitch.width) desk.setGlitchWidth(text);
    };
    this.width.addEventListener('change', apply);
    this.width.addEventListener('keydown', (e) => {
      if (e.key === 'Enter') {
        e.preventDefault();
        apply();
      }
    });
    const limits = () => {
      const read = (i: HTMLInputElement) => {
        const s = i.value.trim();
        if (s === '') return null;
        const n = Number(s);
        return Number.isInteger(n) && n >= 0 ? n : NaN;
      };
      const a = read(this.min);
      const b = read(this.max);
      if (Number.isNaN(a) || Number.isNaN(b)) desk.hooks.notice('glitch limits are whole numbers of glitches, such as 0');
      else if (a !== null && b !== null && a > b) desk.hooks.notice('the glitch limit min is above max');
      else desk.setGlitchLimits(a, b);
    };
    this.min.addEventListener('change', limits);
    this.max.addEventListener('change', limits);
    this.panel.append(
      h('p', { class: 'panel-lead', text: 'Every loaded net and bit is searched after loading for pulses narrower than the width below, zero-width glitches, and runts on real nets.' }),
      h('div', { class: 'panel-row' }, h('label', { class: 'field-label' }, 'Narrower than ', this.width), button('glitch-default', 'Default', 'Back to the default width', () => desk.setGlitchWidth(null))),
      this.widthNote,
      this.status,
      h('div', { class: 'panel-row' }, button('glitch-prev', '◂ Previous', 'Go to the previous glitch', () => desk.stepGlitch(-1)), button('glitch-next', 'Next ▸', 'Go to the next glitch', () => desk.stepGlitch(1))),
      this.at,
      h('div', { class: 'm-limits' }, h('label', { class: 'field-label' }, 'Count limit min ', this.min), h('label', { class: 'field-label' }, 'max ', this.max), this.verdict),
      h('p', { class: 'panel-sub', text: 'Widths' }),
      this.histogram.el,
      h(
        'div',
        { class: 'panel-row wrap' },
        button('glitch-add-all', 'Add listed to sheet', `Put the listed glitches (up to ${ADD_ALL_LIMIT}) on the worst-case sheet`, () => this.addAll()),
      ),
      this.table.el,
    );
    this.table.setColumns([
      { title: 'at', sort: 'time', text: (i) => formatTime(this.items()!.time[i], 7) },
      { title: 'net', text: (i) => this.netOf(i) },
      { title: 'width', sort: 'value', text: (i) => formatTime(this.items()!.value[i], 4), cls: () => 'num' },
      { title: 'kind', sort: 'kind', text: (i) => GLITCH_KINDS[this.items()!.kind[i]] },
    ]);
    desk.on((e) => {
      if (e === 'glitch') this.render();
    });
    this.render();
  }

  private items() {
    return this.desk.glitch.view?.items ?? null;
  }

  private netOf(i: number): string {
    const v = this.desk.glitch.view;
    if (!v) return '';
    const p = v.targets[v.target[i]];
    return p ? shortName(p.label) : '?';
  }

  private shownFor: unknown = null;

  render(): void {
    const g = this.desk.glitch;
    const v = g.view;
    if (document.activeElement !== this.width) this.width.value = g.width ?? '';
    this.min.value = g.min === null ? '' : String(g.min);
    this.max.value = g.max === null ? '' : String(g.max);
    const w = v?.width;
    this.width.placeholder = w && g.width === null ? formatTime(w.seconds, 4) : 'default';
    if (w) {
      const def = w.source === 'given' ? 'set by you' : w.source === 'clock' ? `default: 10% of the shortest clock-like period (${shortName(w.clock!)}, ${formatTime(w.periodS!, 4)})` : `default: no clock-like net, so 10% of the shortest typical interval between changes (${formatTime(w.periodS!, 4)})`;
      this.widthNote.textContent = `Width ${formatTime(w.seconds, 4)} — ${def}.`;
    } else this.widthNote.textContent = g.error ?? '';
    if (g.running) this.status.textContent = 'scanning every net…';
    else if (v) {
      const nets = this.desk.glitch.perPath.size;
      this.status.textContent = `${v.items.count} glitch${v.items.count === 1 ? '' : 'es'} on ${nets} net${nets === 1 ? '' : 's'} · ${v.targets.length} nets and bits searched in ${Math.max(1, Math.round(v.elapsedMs))} ms`;
    } else this.status.textContent = g.error ? `could not scan: ${g.error}` : 'open a dump to search it';
    this.status.dataset.count = v ? String(v.items.count) : '';
    const verdict = this.desk.glitchVerdict();
    this.verdict.className = verdict ? `chip chip-${verdict}` : '';
    this.verdict.textContent = verdict ?? '';
    if (v && g.focus >= 0) {
      const it = v.items;
      this.at.textContent = `${g.focus + 1} of ${it.count}: ${this.netOf(g.focus)} ${GLITCH_KINDS[it.kind[g.focus]]}, ${formatTime(it.value[g.focus], 4)} at ${formatTime(it.time[g.focus], 7)}`;
      this.table.choose(g.focus);
    } else this.at.textContent = v && v.items.count ? 'Step through them with Previous and Next, or click a row.' : '';
    if (this.shownFor !== v) {
      this.shownFor = v;
      this.filter = {};
      const bins = v ? binValues(v.items.value, v.items.count) : null;
      this.histogram.set(bins, 'glitch widths');
      this.reorder();
    }
  }

  private onBin(index: number | null, bins: Bins): void {
    const f: RowFilter = { ...this.filter };
    if (index === null) delete f.bin;
    else f.bin = { lo: bins.lo, width: bins.width, bins: bins.counts.length, index };
    this.filter = f;
    this.reorder();
  }

  private reorder(): void {
    const v = this.desk.glitch.view;
    this.table.setSort(this.sortKey, this.descending);
    if (!v) {
      this.order = null;
      this.table.setRows(null, 0);
      return;
    }
    const plain = this.sortKey === 'time' && !this.descending && !this.filter.bin;
    this.order = plain ? null : orderItems(v.items, this.sortKey, this.descending, this.filter, { min: null, max: null, unit: 's' });
    this.table.setRows(this.order, v.items.count);
  }

  private addAll(): void {
    const src = this.desk.rowSource(GLITCH_SCAN_ID);
    if (!src) return;
    const n = Math.min(ADD_ALL_LIMIT, this.table.rows);
    const rows = [];
    for (let r = 0; r < n; r++) rows.push(rowOf(src, this.table.itemAt(r)));
    if (rows.length === 0) {
      this.desk.hooks.notice('no glitches listed');
      return;
    }
    this.desk.addRows(rows);
  }
}
