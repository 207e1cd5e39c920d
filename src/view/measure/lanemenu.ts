// The traces' context menu (right-click a lane, or Shift+F10 / the menu key on the chosen lane):
// start a delay from this net, finish it on another, measure skew across the chosen lanes, or go to
// this net's next glitch. Every entry also has a button in the Measure or Glitches tab.

import { h } from '../dom';
import type { NetLane, Row } from '../state';
import { type MeasureDesk, shortName } from './desk';

export interface MenuHooks {
  showTab(id: 'measure' | 'glitches'): void;
}

function pathOf(row: Row): string {
  const lane = row.lane as NetLane;
  if (row.kind === 'bit') return `${lane.path}[${row.bit}]`;
  return lane.bit !== null ? `${lane.path}[${lane.bit}]` : lane.path;
}

export function installLaneMenu(desk: MeasureDesk, lanes: HTMLElement, hooks: MenuHooks): void {
  const menu = h('div', { class: 'lane-menu', id: 'lane-menu', role: 'menu', hidden: true });
  document.body.append(menu);
  const close = () => {
    menu.hidden = true;
  };
  const item = (id: string, text: string, fn: () => void, disabled = false) => {
    const b = h('button', { class: 'lane-menu-item', type: 'button', role: 'menuitem', id, text });
    b.disabled = disabled;
    b.addEventListener('click', () => {
      close();
      fn();
    });
    return b;
  };

  const open = (row: Row, x: number, y: number) => {
    const st = desk.state;
    const path = pathOf(row);
    const name = shortName(path);
    const items: HTMLElement[] = [h('div', { class: 'lane-menu-title', text: path })];
    const from = desk.pendingFrom;
    if (from && from !== path) {
      items.push(
        item('menu-delay-to', `Delay from ${shortName(from)} to ${name}`, () => {
          desk.pendingFrom = null;
          desk.addDelay(from, path);
          hooks.showTab('measure');
        }),
      );
    }
    items.push(
      item('menu-delay-from', `Delay from ${name}…`, () => {
        desk.pendingFrom = path;
        desk.hooks.notice(`delay from ${name}: now right-click the lane of the effect net and choose “Delay from ${name} to …”`, 12000);
      }),
    );
    const chosen = st.rows().filter((r) => st.selected.has(r.key) && (r.kind === 'net' || r.kind === 'bit') && r.net);
    const group = chosen.some((r) => r.key === row.key) ? chosen : [...chosen, row];
    items.push(
      item(
        'menu-skew',
        group.length >= 2 ? `Skew across ${group.length} lanes` : 'Skew across the chosen lanes (choose two or more)',
        () => {
          desk.addSkew(group.map(pathOf).join(','));
          hooks.showTab('measure');
        },
        group.length < 2,
      ),
    );
    const n = desk.glitch.perPath.get((row.lane as NetLane).path) ?? 0;
    items.push(
      item(
        'menu-glitch-next',
        n ? `Next glitch on ${name} (${n})` : `No glitches on ${name}`,
        () => {
          const v = desk.glitch.view;
          if (!v) return;
          const t = st.activeCursor?.tick ?? -Infinity;
          const lanePath = (row.lane as NetLane).path;
          let first = -1;
          for (let i = 0; i < v.items.count; i++) {
            const p = v.paths[v.target[i]];
            if (p !== lanePath) continue;
            if (first < 0) first = i;
            if (v.items.start[i] > t) {
              desk.focusGlitch(i);
              hooks.showTab('glitches');
              return;
            }
          }
          if (first >= 0) desk.focusGlitch(first);
          hooks.showTab('glitches');
        },
        n === 0,
      ),
    );
    menu.replaceChildren(...items);
    menu.hidden = false;
    const w = menu.offsetWidth;
    const hgt = menu.offsetHeight;
    menu.style.left = `${Math.max(4, Math.min(window.innerWidth - w - 4, x))}px`;
    menu.style.top = `${Math.max(4, Math.min(window.innerHeight - hgt - 4, y))}px`;
    (menu.querySelector('button:not(:disabled)') as HTMLElement | null)?.focus();
  };

  const rowAt = (clientY: number): Row | null => {
    const y = clientY - lanes.getBoundingClientRect().top + lanes.scrollTop;
    return desk.state.rows().find((r) => y >= r.top && y < r.top + r.height && (r.kind === 'net' || r.kind === 'bit') && r.net) ?? null;
  };

  lanes.addEventListener('contextmenu', (e) => {
    const row = rowAt(e.clientY);
    if (!row) return;
    e.preventDefault();
    if (!desk.state.selected.has(row.key) && !e.ctrlKey && !e.shiftKey) desk.state.select(row.key, 'only');
    open(row, e.clientX, e.clientY);
  });
  window.addEventListener('keydown', (e) => {
    if (!menu.hidden && e.key === 'Escape') {
      e.preventDefault();
      e.stopPropagation();
      close();
      return;
    }
    if (menu.hidden && (e.key === 'ContextMenu' || (e.key === 'F10' && e.shiftKey)) && document.activeElement === lanes) {
      const row = desk.state.rowByKey(desk.state.focus);
      if (!row || !row.net) return;
      e.preventDefault();
      const r = lanes.getBoundingClientRect();
      open(row, r.left + 40, r.top + row.top - lanes.scrollTop + 20);
    }
  }, true);
  window.addEventListener('pointerdown', (e) => {
    if (!menu.hidden && !menu.contains(e.target as Node)) close();
  });
  lanes.addEventListener('scroll', close);
}
