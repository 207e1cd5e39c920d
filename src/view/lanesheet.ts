// The lane panel: settings of the chosen lane (display name, radix, colour, bits, plot range of
// real nets) and the lane-list actions that the captions and keys also offer.

import { parseLevel } from '../measure/level';
import { RADIXES, RADIX_LABEL, radixAllowed } from '../render/radix';
import { cssColor, resolveColor, THEMES } from '../render/theme';
import { h } from './dom';
import type { GroupLane, NetLane, Row, ViewState } from './state';

export class LaneSheet {
  readonly panel = h('div', { class: 'panel panel-lane' });

  constructor(
    private readonly state: ViewState,
    private readonly hooks: { notice(text: string): void; rename(key: string): void; realNote(row: Row): string | null },
  ) {}

  render(): void {
    const st = this.state;
    const row = st.rowByKey(st.focus);
    const picked = st.selected.size;
    const actions = h(
      'div',
      { class: 'panel-row wrap' },
      this.button('Group chosen lanes', 'lane-group', picked === 0, () => {
        const g = st.groupSelected('group');
        if (g) this.hooks.rename(`g${g.id}`);
      }),
      this.button('Move up', 'lane-up', !row, () => row && st.nudge(row.key, -1)),
      this.button('Move down', 'lane-down', !row, () => row && st.nudge(row.key, 1)),
      this.button('Remove chosen', 'lane-remove', picked === 0, () => st.removeRows([...st.selected])),
    );
    if (!row) {
      this.panel.replaceChildren(h('p', { class: 'panel-lead', text: 'Choose a lane by clicking its name. Ctrl-click or Shift-click chooses several, to group or remove together.' }), actions);
      return;
    }
    const parts: HTMLElement[] = [];
    if (row.kind === 'group') {
      const g = row.lane as GroupLane;
      parts.push(
        h('p', { class: 'panel-title', text: `Group “${g.label}”` }),
        this.nameField(row.key, g.label),
        h('div', { class: 'panel-row' }, this.button(g.collapsed ? 'Open group' : 'Fold group', 'group-fold', false, () => st.toggleCollapsed(g.id)), this.button('Ungroup', 'group-ungroup', false, () => st.ungroup(g.id))),
      );
    } else {
      const lane = row.lane as NetLane;
      const net = row.net;
      const sig = row.signal;
      const width = row.kind === 'bit' ? 1 : lane.bit !== null ? 1 : (net?.width ?? 1);
      parts.push(
        h('p', { class: 'panel-title', text: st.rowLabel(row) }),
        h('p', { class: 'panel-path', text: `${lane.path}${row.bit !== null ? `[${row.bit}]` : ''}` }),
        h('p', { class: 'muted', text: `${net?.type ?? ''} · ${sig?.kind === 'real' ? 'real' : `${width} bit${width === 1 ? '' : 's'}`} · ${sig?.count.toLocaleString('en') ?? 0} changes` }),
      );
      if (row.kind === 'net') {
        parts.push(this.nameField(row.key, lane.label ?? ''));
        if (sig && (sig.kind === 'vector' || sig.kind === 'logic') && width > 1) {
          const sel = h('select', { class: 'field', id: 'lane-radix', 'aria-label': 'Radix' });
          for (const r of RADIXES) {
            const o = h('option', { value: r, text: RADIX_LABEL[r] });
            o.disabled = !radixAllowed(r, width);
            sel.append(o);
          }
          sel.value = lane.radix;
          sel.addEventListener('change', () => st.setRadix(lane, sel.value as NetLane['radix']));
          parts.push(h('label', { class: 'field-label' }, 'Radix ', sel));
          parts.push(h('div', { class: 'panel-row' }, this.button(lane.expanded ? 'Hide bits' : 'Show bits', 'lane-bits', false, () => st.toggleExpanded(lane))));
        }
        parts.push(this.colorPicker(lane));
        if (sig?.kind === 'real') {
          parts.push(this.rangeFields(lane));
          const note = this.hooks.realNote(row);
          if (note) parts.push(h('p', { class: 'panel-warn', role: 'status', text: `No edges at this level: ${note}` }));
        }
      }
    }
    this.panel.replaceChildren(...parts, h('p', { class: 'panel-sub', text: 'Lane list' }), actions);
  }

  private button(text: string, id: string, disabled: boolean, fn: () => void): HTMLButtonElement {
    const b = h('button', { class: 'btn', type: 'button', id, text });
    b.disabled = disabled;
    b.addEventListener('click', fn);
    return b;
  }

  private nameField(key: string, value: string): HTMLElement {
    const input = h('input', { class: 'field', id: 'lane-name', placeholder: 'display name', maxlength: '256' });
    input.value = value;
    input.addEventListener('change', () => this.state.rename(key, input.value));
    return h('label', { class: 'field-label' }, 'Name ', input);
  }

  private colorPicker(lane: NetLane): HTMLElement {
    const theme = THEMES[this.state.theme];
    const box = h('div', { class: 'swatches', role: 'radiogroup', 'aria-label': 'Trace colour' });
    theme.traces.forEach((c, i) => {
      const b = h('button', { class: 'swatch' + (lane.color === i ? ' is-current' : ''), type: 'button', role: 'radio', 'aria-checked': String(lane.color === i), 'aria-label': theme.traceNames[i], title: theme.traceNames[i] });
      b.style.backgroundColor = cssColor(c);
      b.addEventListener('click', () => this.state.setColor(lane, i));
      box.append(b);
    });
    const own = h('input', { type: 'color', class: 'swatch-own', 'aria-label': 'Colour of your own', title: 'Colour of your own (kept in both looks)' });
    own.value = cssColor(resolveColor(theme, lane.color));
    own.addEventListener('change', () => this.state.setColor(lane, own.value));
    box.append(own);
    return h('div', { class: 'field-label' }, 'Colour ', box);
  }

  private rangeFields(lane: NetLane): HTMLElement {
    const mk = (id: string, v: string, ph: string) => {
      const i = h('input', { class: 'field field-num', id, placeholder: ph });
      i.value = v;
      return i;
    };
    const lo = mk('lane-lo', lane.lo === null ? '' : String(lane.lo), 'fit');
    const hi = mk('lane-hi', lane.hi === null ? '' : String(lane.hi), 'fit');
    const level = mk('lane-level', lane.level ?? '', '50%');
    const apply = () => {
      const read = (i: HTMLInputElement) => (i.value.trim() === '' ? null : Number(i.value));
      const [a, b] = [read(lo), read(hi)];
      if ([a, b].some((v) => v !== null && !Number.isFinite(v))) {
        this.hooks.notice('plot range: type plain numbers, or leave a box empty to fit the data');
        return;
      }
      if (a !== null && b !== null && !(a < b)) {
        this.hooks.notice('plot range: the bottom must be below the top');
        return;
      }
      const text = level.value.trim();
      if (text !== '') {
        try {
          parseLevel(text);
        } catch (e) {
          this.hooks.notice((e as Error).message);
          return;
        }
      }
      this.state.setAnalog(lane, a, b, text === '' ? null : text);
    };
    for (const i of [lo, hi, level]) i.addEventListener('change', apply);
    return h(
      'fieldset',
      { class: 'range-box' },
      h('legend', { text: 'Real net' }),
      h('label', { class: 'field-label' }, 'Plot bottom ', lo),
      h('label', { class: 'field-label' }, 'Plot top ', hi),
      h(
        'label',
        { class: 'field-label', title: 'Where edges are measured (IEEE 181 state levels, as midrail delay --level): a % of the swing such as 50%, or volts such as 1.2V. Drawn dashed; cursors snap to its crossings.' },
        'Reference level ',
        level,
      ),
    );
  }
}
