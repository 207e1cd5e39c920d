// The "Measure" tab: the list of measurements (delay, skew, and whatever a plan brings), the
// chosen one's settings (nets, reference level, window, output edge, limits — each change measures
// again at once), its figures with the timing caution, a histogram of its values, and the table of
// every pair or event. Plans open and save here.

import { formatFrequency, formatTime } from '../../model/units';
import { PAIR_KINDS } from '../../measure/index';
import type { DelayStats } from '../../measure/types';
import type { MeasurementSpec } from '../../plan/types';
import { button, h } from '../dom';
import type { NetLane } from '../state';
import { type Bins, binValues } from './bins';
import { type Entry, type MeasureDesk, shortName } from './desk';
import { Histogram } from './histogram';
import { marginOf } from './limitcheck';
import { type RowFilter, type SortKey, orderItems } from './order';
import { type Column, ItemTable } from './table';
import { type DelayView, EDGE_WORDS, JUDGED, type SkewView, SKEW_KINDS, VIOLATES } from './types';

/** Tables up to this many rows are ordered on the page; bigger ones in the worker. */
const SORT_ON_PAGE = 20_000;

const t = (s: number | null | undefined, digits = 6) => (s === null || s === undefined ? '—' : formatTime(s, digits));

function field(id: string, label: string, value: string, placeholder: string, title: string): { wrap: HTMLElement; input: HTMLInputElement } {
  const input = h('input', { class: 'field', id, placeholder, title, autocomplete: 'off', spellcheck: 'false' });
  input.value = value;
  return { wrap: h('label', { class: 'field-label', title }, `${label} `, input), input };
}

function select(id: string, label: string, options: Array<[string, string]>, value: string, title: string): { wrap: HTMLElement; input: HTMLSelectElement } {
  const input = h('select', { class: 'field', id, title });
  for (const [v, text] of options) input.append(h('option', { value: v, text }));
  input.value = value;
  return { wrap: h('label', { class: 'field-label', title }, `${label} `, input), input };
}

export class MeasurePanel {
  readonly panel = h('div', { class: 'panel panel-measure' });
  private readonly list = h('div', { class: 'm-list', id: 'measure-list', role: 'listbox', 'aria-label': 'Measurements' });
  private readonly editor = h('div', { class: 'm-edit', id: 'measure-edit' });
  private readonly problem = h('p', { class: 'panel-warn', id: 'measure-problem', role: 'status' });
  private readonly verdict = h('div', { class: 'm-verdict', id: 'measure-verdict', role: 'status' });
  private readonly figures = h('div', { class: 'm-figures', id: 'measure-figures' });
  private readonly histKind = h('select', { class: 'field', id: 'measure-hist-kind', 'aria-label': 'Values in the histogram' });
  private readonly histogram: Histogram;
  private readonly table: ItemTable;
  private readonly tableNote = h('span', { class: 'muted', id: 'measure-table-note' });
  private readonly onlyViolations = h('input', { type: 'checkbox', id: 'measure-only-violations' });
  private readonly planNote = h('p', { class: 'm-plan-note', id: 'plan-note', role: 'status' });
  private readonly planError = h('pre', { class: 'm-plan-error', id: 'plan-error', role: 'alert' });
  private readonly planInput = h('input', { type: 'file', id: 'plan-input', accept: '.json,application/json', hidden: true });
  private readonly details = h('div', { class: 'm-details' });
  private editorKey = '';
  private sortKey: SortKey = 'time';
  private descending = false;
  private filter: RowFilter = {};
  private bins: Bins | null = null;
  private tableFor = '';
  private orderJob = 0;

  constructor(private readonly desk: MeasureDesk) {
    this.histogram = new Histogram('measure-hist', { bin: (index, bins) => this.onBin(index, bins) });
    this.table = new ItemTable('measure-table', 'Every measured pair or event', {
      pick: (i) => this.chosenEntry() && desk.jumpToItem(this.chosenEntry()!.spec.id, i),
      add: (i) => this.chosenEntry() && desk.addItem(this.chosenEntry()!.spec.id, i),
      sort: (key, desc) => {
        this.sortKey = key;
        this.descending = desc;
        this.reorder();
      },
    });
    this.planInput.addEventListener('change', () => {
      const f = this.planInput.files?.[0];
      this.planInput.value = '';
      if (f) void this.openPlan(f);
    });
    this.histKind.addEventListener('change', () => this.renderDetails());
    this.onlyViolations.addEventListener('change', () => {
      this.filter = { ...this.filter, violations: this.onlyViolations.checked || undefined };
      this.reorder();
    });
    this.panel.append(
      h(
        'div',
        { class: 'panel-row wrap' },
        button('measure-add-delay', '+ Delay', 'Measure delay between two nets: the two chosen lanes, or type them below', () => this.addDelay()),
        button('measure-add-skew', '+ Skew', 'Measure skew across a group: the chosen lanes, or a glob typed below', () => this.addSkew()),
        button('plan-open', 'Open plan…', 'Run a measurement plan (midrail-plan JSON) on this dump', () => this.planInput.click()),
        button('plan-save', 'Save plan', 'Save these measurements and their limits as a measurement plan', () => desk.savePlan()),
        this.planInput,
      ),
      this.planNote,
      this.planError,
      this.list,
      this.editor,
      this.problem,
      this.details,
    );
    this.planError.hidden = true;
    desk.on((e) => {
      if (e === 'list') this.render();
      else if (e === 'entry') {
        this.renderList();
        this.renderDetails();
      } else if (e === 'plan') this.renderPlan();
    });
    this.render();
  }

  private chosenEntry(): Entry | null {
    return this.desk.entry(this.desk.chosen);
  }

  private async openPlan(f: File): Promise<void> {
    this.planError.hidden = true;
    const problem = await this.desk.openPlan(f);
    if (problem) {
      this.planError.textContent = problem;
      this.planError.hidden = false;
    }
  }

  private renderPlan(): void {
    this.planNote.textContent = this.desk.planNote;
  }

  /** Delay from the first to the second chosen lane (or the chosen lane and the one below it). */
  private addDelay(): void {
    const st = this.desk.state;
    const rows = st.rows().filter((r) => st.selected.has(r.key) && r.net);
    const paths = rows.map((r) => (r.kind === 'bit' ? `${(r.lane as NetLane).path}[${r.bit}]` : (r.lane as NetLane).path));
    if (paths.length < 2) {
      const all = st.rows().filter((r) => r.kind === 'net' && r.net);
      const i = all.findIndex((r) => st.selected.has(r.key));
      const pick = (k: number) => (all[k]?.lane as NetLane | undefined)?.path;
      const a = paths[0] ?? pick(0);
      const b = pick(i >= 0 ? i + 1 : 1);
      if (!a || !b || a === b) {
        this.desk.hooks.notice('choose two lanes (Ctrl-click their names), or show at least two nets');
        return;
      }
      this.desk.addDelay(a, b);
      return;
    }
    this.desk.addDelay(paths[0], paths[1]);
  }

  private addSkew(): void {
    const st = this.desk.state;
    const paths = st.rows().filter((r) => st.selected.has(r.key) && r.kind === 'net' && r.net).map((r) => (r.lane as NetLane).path);
    if (paths.length < 2) {
      this.desk.hooks.notice('choose two or more lanes for a skew group (Ctrl-click their names), then press + Skew; or edit the nets field to a glob');
      if (paths.length === 0) return;
    }
    this.desk.addSkew(paths.join(','));
  }

  render(): void {
    this.renderPlan();
    this.renderList();
    this.renderEditor();
    this.renderDetails();
  }

  private statusChip(e: Entry): HTMLElement {
    const s = this.desk.status(e);
    const text = e.running ? 'running' : s === null ? (e.view ? 'measured' : '—') : s;
    return h('span', { class: `chip chip-${e.running ? 'running' : (s ?? 'none')}`, text });
  }

  private summary(e: Entry): string {
    const v = e.view;
    if (e.error) return e.error;
    if (!v) return e.running ? 'measuring…' : '';
    if (v.kind === 'delay') {
      const f = v.figures;
      const part = (name: string, s: DelayStats) => (s.count ? `${name} ${t(s.min_s, 4)}…${t(s.max_s, 4)}` : '');
      return [part('tPLH', f.tPLH), part('tPHL', f.tPHL), part('tPD', f.tPD)].filter(Boolean).join(' · ') || 'no pairs';
    }
    if (v.kind === 'skew') return v.figures.max_skew_s === null ? 'no events' : `max skew ${t(v.figures.max_skew_s, 4)} · ${v.items.count} events`;
    return v.outcome.message;
  }

  private renderList(): void {
    const d = this.desk;
    if (d.entries.length === 0) {
      this.list.replaceChildren(h('p', { class: 'panel-lead', text: 'No measurements yet. Choose two lanes and press + Delay, or several and press + Skew; or right-click a trace. Open plan… runs a saved plan.' }));
      return;
    }
    const rows = d.entries.map((e) => {
      const remove = h('button', { class: 'btn btn-quiet m-remove', type: 'button', 'aria-label': `Remove ${e.spec.id}`, title: 'Remove this measurement', text: '×' });
      remove.addEventListener('click', (ev) => {
        ev.stopPropagation();
        d.remove(e.spec.id);
      });
      const viol = e.violations.length > 0 ? h('span', { class: 'm-viol', title: 'edges or events breaking a limit', text: `${e.violations.length} ⚑` }) : null;
      const row = h(
        'div',
        { class: 'm-item' + (e.spec.id === d.chosen ? ' is-chosen' : ''), role: 'option', 'aria-selected': String(e.spec.id === d.chosen), 'data-id': e.spec.id, tabindex: '0' },
        this.statusChip(e),
        h('span', { class: 'm-name', text: e.spec.id }),
        h('span', { class: 'm-kind', text: e.spec.kind }),
        viol,
        remove,
        h('span', { class: 'm-sum', text: this.summary(e) }),
      );
      row.addEventListener('click', () => d.choose(e.spec.id));
      row.addEventListener('keydown', (ev) => {
        if (ev.key === 'Enter' || ev.key === ' ') {
          ev.preventDefault();
          d.choose(e.spec.id);
        }
      });
      return row;
    });
    this.list.replaceChildren(...rows);
  }

  // ---- settings ---------------------------------------------------------------------------------

  private renderEditor(): void {
    const e = this.chosenEntry();
    const key = e ? JSON.stringify(e.spec) : '';
    if (key === this.editorKey && this.editor.childElementCount > 0) return;
    this.editorKey = key;
    this.problem.textContent = '';
    if (!e) {
      this.editor.replaceChildren();
      return;
    }
    const s = e.spec;
    const parts: HTMLElement[] = [];
    const shown = [...this.desk.state.shownPaths()];
    const list = h('datalist', { id: 'measure-nets' }, ...shown.map((p) => h('option', { value: p })));
    parts.push(list);
    const id = field('m-id', 'Name', s.id, 'id', 'Measurement id (letters, digits, _ . -): names it in plans and reports');
    parts.push(id.wrap);
    const inputs: Record<string, HTMLInputElement | HTMLSelectElement> = { id: id.input };
    const timeTip = 'A time with its unit: 5ns, 800ps';
    if (s.kind === 'delay') {
      const from = field('m-from', 'From', s.from, 'cause net', 'The net whose edges cause the effect (full path, unique suffix, or bus[3])');
      const to = field('m-to', 'To', s.to, 'effect net', 'The net whose edges follow');
      from.input.setAttribute('list', 'measure-nets');
      to.input.setAttribute('list', 'measure-nets');
      const swap = h('button', { class: 'btn', type: 'button', id: 'm-swap', title: 'Swap from and to', text: '⇅ Swap' });
      swap.addEventListener('click', () => this.commit({ ...s, from: s.to, to: s.from }));
      const edge = select('m-edge', 'Output edges', [['any', 'both (tPLH and tPHL)'], ['rise', 'rising only (tPLH)'], ['fall', 'falling only (tPHL)']], s.edge ?? 'any', 'Which output edges the limits and the worst rows count');
      parts.push(from.wrap, to.wrap, h('div', { class: 'panel-row' }, swap), edge.wrap);
      Object.assign(inputs, { from: from.input, to: to.input, edge: edge.input });
    } else if (s.kind === 'skew') {
      const nets = field('m-nets', 'Nets', Array.isArray(s.nets) ? s.nets.join(',') : s.nets, 'a,b,c or clk_*', 'Net names or globs, separated by commas (only * and ? are wildcards)');
      const use = h('button', { class: 'btn', type: 'button', id: 'm-use-chosen', title: 'Use the chosen lanes as the group', text: 'Use chosen lanes' });
      use.addEventListener('click', () => {
        const st = this.desk.state;
        const paths = st.rows().filter((r) => st.selected.has(r.key) && r.kind === 'net').map((r) => (r.lane as NetLane).path);
        if (paths.length < 2) this.desk.hooks.notice('choose two or more lanes first (Ctrl-click their names)');
        else this.commit({ ...s, nets: paths.join(',') });
      });
      const edge = select('m-edge', 'Edges', [['any', 'any'], ['rise', 'rising'], ['fall', 'falling']], s.edge ?? 'any', 'Which edges form the events');
      const v = this.chosenEntry()?.view;
      const refs: Array<[string, string]> = [['', 'earliest most often']];
      if (v && v.kind === 'skew') for (const n of v.nets) refs.push([n.label, shortName(n.label)]);
      else if (s.ref) refs.push([s.ref, s.ref]);
      const ref = select('m-ref', 'Reference net', refs, s.ref ?? '', 'Offsets are measured from this net');
      parts.push(nets.wrap, h('div', { class: 'panel-row' }, use), edge.wrap, ref.wrap);
      Object.assign(inputs, { nets: nets.input, edge: edge.input, ref: ref.input });
    } else {
      parts.push(h('pre', { class: 'm-spec', text: JSON.stringify(s, null, 1) }));
    }
    if (s.kind === 'delay' || s.kind === 'skew') {
      const win = field('m-window', 'Window', s.window ?? '', s.kind === 'delay' ? 'none' : 'auto', `${timeTip}. ${s.kind === 'delay' ? 'Pairs longer than this are dropped as unpaired' : 'Edges this close form one event (auto: half the busiest net’s shortest edge interval)'}`);
      const level = field('m-level', 'Reference level', s.level ?? '', '50%', 'Where edges of real nets are measured: a % of the swing (50%) or volts (1.2V); logic nets switch at their edges');
      parts.push(win.wrap, level.wrap);
      Object.assign(inputs, { window: win.input, level: level.input });
    }
    const count = s.kind === 'glitch';
    const min = field('m-min', 'Limit min', s.min === undefined ? '' : String(s.min), 'none', count ? 'Fewest allowed (a count)' : `Smallest allowed value. ${timeTip}`);
    const max = field('m-max', 'Limit max', s.max === undefined ? '' : String(s.max), 'none', count ? 'Most allowed (a count)' : `Largest allowed value. ${timeTip}`);
    parts.push(h('div', { class: 'm-limits' }, min.wrap, max.wrap));
    Object.assign(inputs, { min: min.input, max: max.input });
    for (const input of Object.values(inputs)) input.addEventListener('change', () => this.commit(this.read(s, inputs)));
    this.editor.replaceChildren(h('p', { class: 'panel-sub', text: 'Settings' }), ...parts);
  }

  /** The spec the fields now describe (empty fields drop optional settings). */
  private read(s: MeasurementSpec, f: Record<string, HTMLInputElement | HTMLSelectElement>): MeasurementSpec {
    const out = { ...s } as Record<string, unknown>;
    const text = (k: string) => f[k]?.value.trim();
    const opt = (k: string) => {
      if (!f[k]) return;
      const v = text(k);
      if (v === '' || (k === 'edge' && v === 'any')) delete out[k];
      else out[k] = v;
    };
    out.id = text('id') || s.id;
    if (s.kind === 'delay') {
      out.from = text('from');
      out.to = text('to');
    }
    if (s.kind === 'skew') out.nets = text('nets');
    for (const k of ['edge', 'window', 'level', 'ref', 'min', 'max']) opt(k);
    if (s.kind === 'glitch') for (const k of ['min', 'max']) if (typeof out[k] === 'string') out[k] = Number(out[k]);
    return out as unknown as MeasurementSpec;
  }

  private commit(spec: MeasurementSpec): void {
    const e = this.chosenEntry();
    if (!e) return;
    this.editorKey = JSON.stringify(spec);
    const problem = this.desk.update(e.spec.id, spec);
    this.problem.textContent = problem ?? '';
    if (problem) this.editorKey = '';
  }

  // ---- figures, histogram, table ------------------------------------------------------------------

  private renderDetails(): void {
    const e = this.chosenEntry();
    const v = e?.view;
    if (!e || !v) {
      this.details.replaceChildren(...(e?.error ? [h('p', { class: 'panel-warn', id: 'measure-error', text: e.error })] : []));
      this.tableFor = '';
      return;
    }
    this.renderVerdict(e);
    if (v.kind === 'verdict') {
      this.details.replaceChildren(this.verdict, this.worstList(e));
      this.tableFor = '';
      return;
    }
    if (v.kind === 'delay') this.delayFigures(v);
    else this.skewFigures(v);
    const kinds: Array<[string, string]> = [['', 'all values']];
    if (v.kind === 'delay') for (const k of [0, 1, 2]) if (v.items.kind.includes(k)) kinds.push([String(k), PAIR_KINDS[k]]);
    const keep = this.histKind.value;
    this.histKind.replaceChildren(...kinds.map(([value, text]) => h('option', { value, text })));
    this.histKind.value = kinds.some(([x]) => x === keep) ? keep : '';
    const kindOnly = this.histKind.value === '' ? undefined : Number(this.histKind.value);
    this.bins = binValues(v.items.value, v.items.count, kindOnly === undefined ? undefined : (i) => v.items.kind[i] === kindOnly);
    this.histogram.set(this.bins, v.kind === 'delay' ? 'delays' : 'skews');
    const worst = h('button', { class: 'btn', type: 'button', id: 'measure-worst', title: 'Sort worst first and jump to the worst pair or event', text: 'Worst' });
    worst.addEventListener('click', () => void this.worst());
    const addWorst = h('button', { class: 'btn', type: 'button', id: 'measure-add-worst', title: `Add the ${10} worst rows (of the kind shown in the histogram) to the worst-case sheet`, text: 'Add worst to sheet' });
    addWorst.addEventListener('click', () => this.desk.addWorst(e.spec.id, kindOnly));
    this.details.replaceChildren(
      this.verdict,
      this.figures,
      h('p', { class: 'panel-sub', text: 'Values' }),
      v.kind === 'delay' ? h('label', { class: 'field-label' }, 'Show ', this.histKind) : h('span'),
      this.histogram.el,
      h('div', { class: 'panel-row wrap' }, worst, addWorst, h('label', { class: 'check', title: 'List only the rows that break a limit' }, this.onlyViolations, 'only violations')),
      this.tableNote,
      this.table.el,
    );
    // A new result resets the table's filter; a new measurement its sort too.
    const key = `${e.spec.id}|${v.items.count}`;
    if (this.tableFor !== e.spec.id) {
      this.sortKey = 'time';
      this.descending = false;
    }
    if (!this.tableFor.startsWith(`${e.spec.id}|`) || this.tableFor !== key) {
      this.filter = kindOnly === undefined ? {} : { kind: kindOnly };
      this.onlyViolations.checked = false;
      this.table.setColumns(this.columns(v));
    }
    this.tableFor = key;
    this.reorder();
  }

  private renderVerdict(e: Entry): void {
    const v = e.view!;
    const outcome = v.outcome;
    const parts: Array<HTMLElement | string> = [];
    if (outcome) parts.push(h('span', { class: `chip chip-${outcome.status}`, text: outcome.status }), ' ', h('span', { class: 'm-verdict-text', text: outcome.message }));
    else parts.push(h('span', { class: 'muted', text: 'No limits set: add a min or max to check every pair or event against it.' }));
    if (v.kind !== 'verdict' && v.violations > 0) parts.push(h('p', { class: 'm-viol-count', id: 'measure-violations', text: `${v.violations} of ${v.judged} ${v.kind === 'delay' ? 'pairs' : 'events'} break a limit; they are hatched on the traces.` }));
    this.verdict.replaceChildren(...parts);
  }

  private figureCell(name: string, value: number | null, digits = 6, hz = false): HTMLElement {
    return h('td', { 'data-fig': name, 'data-value': value === null ? '' : String(value), text: hz ? (value === null ? '—' : formatFrequency(value, 6)) : t(value, digits) });
  }

  private delayFigures(v: DelayView): void {
    const f = v.figures;
    const row = (name: string, s: DelayStats) =>
      h('tr', {}, h('th', { text: name }), h('td', { 'data-fig': `${name}.count`, 'data-value': String(s.count), text: String(s.count) }), this.figureCell(`${name}.min_s`, s.min_s), this.figureCell(`${name}.max_s`, s.max_s), this.figureCell(`${name}.mean_s`, s.mean_s), this.figureCell(`${name}.std_s`, s.std_s, 4));
    const kinds: Array<[string, DelayStats]> = [
      ['tPLH', f.tPLH],
      ['tPHL', f.tPHL],
    ];
    if (f.tPD.count > 0) kinds.push(['tPD', f.tPD]);
    const stats = h('table', { class: 'm-stats' }, h('thead', {}, h('tr', {}, ...['', 'count', 'min', 'max', 'mean', 'std'].map((c) => h('th', { text: c })))), h('tbody', {}, ...kinds.map(([n, s]) => row(n, s))));
    const line = (label: string, cell: HTMLElement, note: string) => h('tr', {}, h('th', { text: label }), cell, h('td', { class: 'muted', text: note }));
    const more = h(
      'table',
      { class: 'm-more' },
      h(
        'tbody',
        {},
        line('tpd', this.figureCell('tpd_s', f.tpd_s), 'largest tPLH or tPHL'),
        line('tsk(p)', this.figureCell('tskp_s', f.tskp_s), `|mean tPHL − mean tPLH|; worst ${t(f.tskp_worst_s, 4)}`),
        line('fmax', this.figureCell('fmax_hz', f.fmax_hz, 6, true), '1 / tpd'),
      ),
    );
    const notes = [`${v.from.label} → ${v.to.label}`, `level ${f.level}`, f.window_s === null ? 'no window' : `window ${t(f.window_s, 4)}`, `${f.unpaired} unpaired`];
    if (f.unknown_spans) notes.push(`${f.unknown_spans} unknown spans`);
    this.figures.replaceChildren(stats, more, h('p', { class: 'm-caution', id: 'measure-caution', text: f.caution }), h('p', { class: 'muted m-notes', text: notes.join(' · ') }));
  }

  private skewFigures(v: SkewView): void {
    const f = v.figures;
    const line = (label: string, cell: HTMLElement) => h('tr', {}, h('th', { text: label }), cell);
    const main = h(
      'table',
      { class: 'm-more' },
      h(
        'tbody',
        {},
        line('max skew', this.figureCell('max_skew_s', f.max_skew_s)),
        line('mean skew', this.figureCell('mean_skew_s', f.mean_skew_s)),
        line('events', h('td', { 'data-fig': 'events', text: String(v.items.count) })),
        line('window', h('td', { text: `${t(f.window_s, 4)} (${f.window_source === 'given' ? 'given' : f.window_source === 'busiest-net' ? 'half the busiest net’s shortest edge interval' : 'whole dump'})` })),
      ),
    );
    const offsets = h(
      'table',
      { class: 'm-stats m-offsets' },
      h('thead', {}, h('tr', {}, h('th', { text: `offset from ${f.ref ? shortName(f.ref) : '—'}` }), h('th', { text: 'mean' }), h('th', { text: 'events' }))),
      h('tbody', {}, ...f.offsets.map((o) => h('tr', {}, h('th', { text: shortName(o.net), title: o.net }), this.figureCell(`offset.${o.net}`, o.mean_offset_s, 4), h('td', { text: String(o.events) })))),
    );
    this.figures.replaceChildren(main, offsets, h('p', { class: 'muted m-notes', text: `${v.nets.length} nets · edges ${f.edge} · reference ${f.ref ?? '—'}${f.unknown_spans ? ` · ${f.unknown_spans} unknown spans` : ''}` }));
  }

  private worstList(e: Entry): HTMLElement {
    const v = e.view;
    if (!v || v.kind !== 'verdict') return h('span');
    const items = v.outcome.worst_items;
    if (items.length === 0) return h('p', { class: 'muted', text: 'nothing to list' });
    const rows = items.map((w) => {
      const b = h('button', { class: 'btn btn-quiet m-worst-item', type: 'button', title: 'Go there', text: `${formatTime(w.time_s, 6)} · ${w.what}${w.margin !== null ? ` · margin ${w.margin}` : ''}` });
      b.addEventListener('click', () => {
        const tick = w.time_s / this.desk.tickSeconds;
        this.desk.state.centreOn(tick);
        this.desk.state.moveCursor(this.desk.state.active, tick);
      });
      return b;
    });
    return h('div', { class: 'm-worst-list' }, h('p', { class: 'panel-sub', text: 'Worst items' }), ...rows);
  }

  private columns(v: DelayView | SkewView): Column[] {
    const it = v.items;
    const bad = (i: number) => ((it.flags[i] & VIOLATES) !== 0 ? 'is-bad' : '');
    const cols: Column[] = [];
    if (v.kind === 'delay') {
      cols.push(
        { title: 'kind', sort: 'kind', text: (i) => `${PAIR_KINDS[it.kind[i]]} ${EDGE_WORDS[v.fromDir[i]][0]}→${it.kind[i] === 0 ? 'r' : it.kind[i] === 1 ? 'f' : 'c'}`, cls: bad },
        { title: 'effect at', sort: 'time', text: (i) => formatTime(it.time[i], 7) },
        { title: 'delay', sort: 'value', text: (i) => formatTime(it.value[i], 5), cls: (i) => `num ${bad(i)}` },
      );
    } else {
      cols.push(
        { title: 'edge', sort: 'kind', text: (i) => SKEW_KINDS[it.kind[i]], cls: bad },
        { title: 'at', sort: 'time', text: (i) => formatTime(it.time[i], 7) },
        { title: 'skew', sort: 'value', text: (i) => formatTime(it.value[i], 5), cls: (i) => `num ${bad(i)}` },
        { title: 'first → last', text: (i) => `${shortName(v.nets[v.earliest[i]]?.label ?? '?')} → ${shortName(v.nets[v.latest[i]]?.label ?? '?')}` },
      );
    }
    if (v.limits.min !== null || v.limits.max !== null) cols.push({ title: 'margin', sort: 'margin', text: (i) => (it.flags[i] & JUDGED ? t(marginOf(it.value[i], v.limits), 4) : 'not judged'), cls: (i) => `num ${bad(i)}` });
    return cols;
  }

  private onBin(index: number | null, bins: Bins): void {
    const f: RowFilter = { ...this.filter };
    if (index === null) delete f.bin;
    else f.bin = { lo: bins.lo, width: bins.width, bins: bins.counts.length, index };
    this.filter = f;
    this.reorder();
  }

  /** Orders the table (on the page when small, in the worker when big) and shows it. */
  private async reorder(): Promise<number | null> {
    const e = this.chosenEntry();
    const v = e?.view;
    if (!e || !v || v.kind === 'verdict') return null;
    this.table.setSort(this.sortKey, this.descending);
    const job = ++this.orderJob;
    let order: Uint32Array | null;
    const plain = this.sortKey === 'time' && !this.descending && !this.filter.bin && !this.filter.violations && this.filter.kind === undefined;
    if (plain) order = null;
    else if (v.items.count <= SORT_ON_PAGE) order = orderItems(v.items, this.sortKey, this.descending, this.filter, v.limits);
    else {
      this.tableNote.textContent = 'sorting…';
      order = await this.desk.client.order(e.spec.id, this.sortKey, this.descending, this.filter);
      if (job !== this.orderJob) return null;
    }
    const rows = order ? order.length : v.items.count;
    this.table.setRows(order, v.items.count);
    const what = v.kind === 'delay' ? 'pairs' : 'events';
    const filtered = this.filter.bin || this.filter.violations || this.filter.kind !== undefined;
    this.tableNote.textContent = `${rows.toLocaleString('en')} ${filtered ? `of ${v.items.count.toLocaleString('en')} ` : ''}${what} · click a row to go there, + puts it on the worst-case sheet`;
    return rows > 0 ? this.table.itemAt(0) : null;
  }

  /** Worst first (largest value, or smallest margin under limits), and jump to it. */
  private async worst(): Promise<void> {
    const e = this.chosenEntry();
    const v = e?.view;
    if (!e || !v || v.kind === 'verdict') return;
    const limited = v.limits.min !== null || v.limits.max !== null;
    this.sortKey = limited ? 'margin' : 'value';
    this.descending = !limited;
    const first = await this.reorder();
    if (first === null) return;
    this.table.choose(first);
    this.desk.jumpToItem(e.spec.id, first);
  }
}

