// The "Worst cases" tab: rows gathered from many measurements (net pair or group, edge, value,
// limit, margin), with Copy (tab-separated, for pasting into a spreadsheet) and exports to .xlsx
// and CSV through the same report writers as the CLI. Clicking a row goes there on the canvas.

import { formatTime } from '../../model/units';
import { button, h } from '../dom';
import { type MeasureDesk, shortName } from './desk';

const t = (s: number | null, digits = 5) => (s === null ? '' : formatTime(s, digits));

export class SheetPanel {
  readonly panel = h('div', { class: 'panel panel-sheet' });
  private readonly body = h('tbody', {});
  private readonly count = h('span', { class: 'muted', id: 'sheet-count' });

  constructor(private readonly desk: MeasureDesk) {
    this.panel.append(
      h('p', { class: 'panel-lead', text: 'Worst edges gathered from your measurements. Add rows with “Add worst to sheet” or a row’s + button.' }),
      h(
        'div',
        { class: 'panel-row wrap' },
        button('sheet-copy', 'Copy', 'Copy the rows as tab-separated text, ready to paste into a spreadsheet', () => void desk.copySheet()),
        button('sheet-xlsx', 'Export .xlsx', 'A workbook: these rows, each measurement’s full table, a summary and the provenance (dump SHA-256, settings)', () => void desk.exportSheet('xlsx')),
        button('sheet-csv', 'Export CSV', 'The same tables as one CSV file', () => void desk.exportSheet('csv')),
        button('sheet-clear', 'Clear', 'Remove every row', () => desk.clearSheet()),
      ),
      this.count,
      h(
        'div',
        { class: 'ws-wrap' },
        h('table', { class: 'ws', id: 'worst-sheet' }, h('thead', {}, h('tr', {}, ...['measurement · nets', 'edge', 'at', 'value', 'limit', 'margin', ''].map((c) => h('th', { text: c })))), this.body),
      ),
    );
    this.body.addEventListener('click', (e) => {
      const tr = (e.target as HTMLElement).closest<HTMLElement>('tr[data-row]');
      if (!tr) return;
      const k = Number(tr.dataset.row);
      const r = desk.sheetRows[k];
      if (!r) return;
      if ((e.target as HTMLElement).closest('.ws-remove')) desk.removeRow(k);
      else desk.jump(r.start_s / desk.tickSeconds, r.end_s / desk.tickSeconds);
    });
    desk.on((e) => {
      if (e === 'sheet') this.render();
    });
    this.render();
  }

  render(): void {
    const rows = this.desk.sheetRows;
    this.count.textContent = rows.length ? `${rows.length} row${rows.length === 1 ? '' : 's'}` : 'No rows yet.';
    // A sheet of many thousands of rows is for exporting; the tab shows the first 2000.
    this.body.replaceChildren(
      ...rows.slice(0, 2000).map((r, k) => {
        const limit = r.limit_min_s !== null && r.limit_max_s !== null ? `${t(r.limit_min_s)} … ${t(r.limit_max_s)}` : r.limit_max_s !== null ? `≤ ${t(r.limit_max_s)}` : r.limit_min_s !== null ? `≥ ${t(r.limit_min_s)}` : '';
        return h(
          'tr',
          { 'data-row': String(k), class: r.margin_s !== null && r.margin_s < 0 ? 'is-bad' : '', title: 'Go there' },
          h('td', { class: 'ws-what', title: `${r.measurement}: ${r.nets}` }, h('div', { class: 'ws-id', text: r.measurement }), h('div', { class: 'ws-nets', text: r.nets.split(/, | -> /).map(shortName).join(r.kind === 'delay' ? ' → ' : ', ') })),
          h('td', { text: r.edge.replace(/ \((\w)\w* → (\w)\w*\)$/, ' $1→$2'), title: r.edge }),
          h('td', { class: 'num', text: t(r.time_s, 7) }),
          h('td', { class: 'num', text: t(r.value_s) }),
          h('td', { class: 'num', text: limit }),
          h('td', { class: 'num', text: t(r.margin_s, 4) }),
          h('td', {}, h('button', { class: 'btn btn-quiet ws-remove', type: 'button', 'aria-label': `Remove row ${k + 1}`, text: '×' })),
        );
      }),
    );
  }
}
