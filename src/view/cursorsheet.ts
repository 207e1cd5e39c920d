// The cursors panel: every cursor with its name, time, and its distance from the reference
// cursor as a time and as a frequency (1/Δt). Names and times are editable; times take units.

import { TimeSyntaxError, formatFrequency, formatTime, parseTime } from '../model/units';
import { cssColor, THEMES } from '../render/theme';
import { h } from './dom';
import type { ViewState } from './state';

/** Δt and 1/Δt between two ticks as text: "12.5 ns · 80 MHz". */
export function deltaText(ticks: number, tickSeconds: number): string {
  const dt = ticks * tickSeconds;
  const f = dt === 0 ? '—' : formatFrequency(1 / Math.abs(dt));
  return `${dt === 0 ? '0 s' : formatTime(dt, 7)} · ${f}`;
}

export function cursorTimeText(tick: number, tickSeconds: number): string {
  return formatTime(tick * tickSeconds, 9);
}

export class CursorSheet {
  readonly panel = h('div', { class: 'panel panel-cursors' });
  private readonly list = h('div', { class: 'cursor-list' });

  constructor(
    private readonly state: ViewState,
    private readonly hooks: { notice(text: string): void; addCursor(): void; swap(): void },
  ) {
    const snap = h('input', { type: 'checkbox', id: 'snap-toggle' });
    snap.checked = state.snap;
    snap.addEventListener('change', () => (state.snap = snap.checked));
    this.panel.append(
      h('p', { class: 'panel-lead', text: 'Click a trace to move the active cursor; near an edge it snaps to it. Δ is measured from the reference cursor.' }),
      this.list,
      h(
        'div',
        { class: 'panel-row wrap' },
        h('button', { class: 'btn', type: 'button', id: 'sheet-add-cursor', text: '+ Cursor' }),
        h('button', { class: 'btn', type: 'button', id: 'sheet-swap-cursors', title: 'Swap the active and the reference cursor (X)', text: 'Swap active ⇄ ref' }),
        h('label', { class: 'check' }, snap, ' Snap to edges'),
      ),
    );
    this.panel.querySelector('#sheet-add-cursor')!.addEventListener('click', () => this.hooks.addCursor());
    this.panel.querySelector('#sheet-swap-cursors')!.addEventListener('click', () => this.hooks.swap());
  }

  render(): void {
    const st = this.state;
    const s = st.tickSeconds;
    const theme = THEMES[st.theme];
    const ref = st.referenceCursor;
    const rows = st.cursors.map((c, i) => {
      const swatch = h('span', { class: 'cursor-swatch' });
      swatch.style.backgroundColor = cssColor(theme.cursors[i % theme.cursors.length]);
      const name = h('input', { class: 'field cursor-name', 'aria-label': `Name of cursor ${c.name}`, maxlength: '24' });
      name.value = c.name;
      name.addEventListener('change', () => st.renameCursor(i, name.value));
      const time = h('input', { class: 'field cursor-time', 'aria-label': `Time of cursor ${c.name}`, title: 'Type a time with its unit and press Enter' });
      time.value = cursorTimeText(c.tick, s);
      time.addEventListener('change', () => {
        try {
          st.moveCursor(i, parseTime(time.value) / s);
          st.reveal(st.cursors[i].tick);
        } catch (e) {
          if (e instanceof TimeSyntaxError) this.hooks.notice(e.message);
          time.value = cursorTimeText(c.tick, s);
        }
      });
      const active = h('input', { type: 'radio', name: 'cursor-active', 'aria-label': `Make ${c.name} the active cursor` });
      active.checked = i === st.active;
      active.addEventListener('change', () => st.setActive(i));
      const refBox = h('input', { type: 'radio', name: 'cursor-ref', 'aria-label': `Measure from ${c.name}` });
      refBox.checked = i === st.reference;
      refBox.addEventListener('change', () => st.setReference(i));
      const delta = ref && ref !== c ? deltaText(c.tick - ref.tick, s) : 'reference';
      const remove = h('button', { class: 'btn btn-quiet', type: 'button', 'aria-label': `Remove cursor ${c.name}`, title: 'Remove this cursor', text: '×' });
      remove.disabled = st.cursors.length <= 1;
      remove.addEventListener('click', () => st.removeCursor(c.id));
      return h(
        'div',
        { class: 'cursor-row' + (i === st.active ? ' is-active' : ''), 'data-cursor': c.name },
        swatch,
        name,
        time,
        h('label', { class: 'check', title: 'Active: clicks and edge jumps move this one' }, active, 'active'),
        h('label', { class: 'check', title: 'Reference: Δ is measured from here' }, refBox, 'ref'),
        h('span', { class: 'cursor-delta', text: i === st.reference ? 'reference' : delta }),
        remove,
      );
    });
    this.list.replaceChildren(
      h('div', { class: 'cursor-head' }, h('span', { text: '' }), h('span', { text: 'name' }), h('span', { text: 'time' }), h('span', { text: '' }), h('span', { text: '' }), h('span', { text: 'Δ from ref · 1/Δ' }), h('span', { text: '' })),
      ...rows,
    );
  }
}
