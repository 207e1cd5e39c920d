// midrail's keyboard scheme and the help overlay that lists it, with the mouse gestures.
// Every key here has a button or menu entry too.

import { h, isTyping } from './dom';

export interface Actions {
  zoomIn(): void;
  zoomOut(): void;
  fit(): void;
  zoomCursors(): void;
  pan(fraction: number): void;
  toStart(): void;
  toEnd(): void;
  focusGoTo(): void;
  focusSeek(): void;
  edge(dir: 1 | -1): void;
  seek(dir: 1 | -1): void;
  addCursor(): void;
  activateCursor(n: number): void;
  swapCursors(): void;
  stepLane(dir: 1 | -1): void;
  renameLane(): void;
  toggleBits(): void;
  removeChosen(): void;
  groupChosen(): void;
  laneSettings(): void;
  toggleDrawer(): void;
  focusFilter(): void;
  openDump(): void;
  saveView(): void;
  loadView(): void;
  toggleTheme(): void;
  help(show?: boolean): void;
  scrollLanes(pages: number): void;
  closeOverlays(): boolean;
}

interface Binding {
  keys: string[];
  what: string;
  run: (a: Actions, e: KeyboardEvent) => void;
}

interface Section {
  title: string;
  items: Binding[];
}

export const SCHEME: Section[] = [
  {
    title: 'Time',
    items: [
      { keys: ['=', '+'], what: 'zoom in around the active cursor', run: (a) => a.zoomIn() },
      { keys: ['-'], what: 'zoom out', run: (a) => a.zoomOut() },
      { keys: ['F'], what: 'fit the whole dump', run: (a) => a.fit() },
      { keys: ['W'], what: 'zoom to the span between active and reference cursor', run: (a) => a.zoomCursors() },
      { keys: ['←', '→'], what: 'pan a tenth of the window (Shift: a whole window)', run: () => undefined },
      { keys: ['Home', 'End'], what: 'go to the start or end of the dump', run: () => undefined },
      { keys: ['G'], what: 'type a time to go to (with units: 2.5us, 400ps)', run: (a) => a.focusGoTo() },
    ],
  },
  {
    title: 'Cursors',
    items: [
      { keys: ['C'], what: 'new cursor in the middle of the window', run: (a) => a.addCursor() },
      { keys: ['1', '…', '9'], what: 'make cursor 1–9 the active one', run: () => undefined },
      { keys: ['X'], what: 'swap active and reference cursor', run: (a) => a.swapCursors() },
      { keys: [']', '['], what: 'active cursor to the next / previous edge of the chosen lane', run: () => undefined },
      { keys: ['V'], what: 'type a value to look for on the chosen lane', run: (a) => a.focusSeek() },
      { keys: ['}', '{'], what: 'next / previous time the chosen lane takes that value', run: () => undefined },
    ],
  },
  {
    title: 'Lanes',
    items: [
      { keys: ['↑', '↓'], what: 'choose the lane above / below', run: () => undefined },
      { keys: ['R'], what: 'rename the chosen lane', run: (a) => a.renameLane() },
      { keys: ['B'], what: 'show or hide the bits of the chosen bus', run: (a) => a.toggleBits() },
      { keys: ['P'], what: 'group the chosen lanes under a heading', run: (a) => a.groupChosen() },
      { keys: ['E'], what: 'settings of the chosen lane (radix, colour, range)', run: (a) => a.laneSettings() },
      { keys: ['Delete'], what: 'remove the chosen lanes', run: (a) => a.removeChosen() },
      { keys: ['PgUp', 'PgDn'], what: 'scroll the lanes', run: () => undefined },
    ],
  },
  {
    title: 'Nets, files, look',
    items: [
      { keys: ['N'], what: 'show or hide the net drawer', run: (a) => a.toggleDrawer() },
      { keys: ['/'], what: 'filter nets', run: (a) => a.focusFilter() },
      { keys: ['O'], what: 'open a dump', run: (a) => a.openDump() },
      { keys: ['S'], what: 'save the view to a file', run: (a) => a.saveView() },
      { keys: ['L'], what: 'restore a view file', run: (a) => a.loadView() },
      { keys: ['T'], what: 'switch between paper and slate looks', run: (a) => a.toggleTheme() },
      { keys: ['?'], what: 'this list', run: (a) => a.help() },
      { keys: ['Esc'], what: 'close this list or a message', run: () => undefined },
    ],
  },
];

const MOUSE: Array<[string, string]> = [
  ['wheel over traces', 'zoom around the pointer (pinch works too)'],
  ['Shift + wheel, or sideways swipe', 'pan'],
  ['wheel over lane names', 'scroll the lanes'],
  ['drag on traces', 'pan'],
  ['click on a trace', 'active cursor there; snaps to an edge within 8 px'],
  ['drag a cursor line or its flag', 'move that cursor'],
  ['drag along the ruler', 'zoom to that range'],
  ['⠿ grip on a lane', 'drag to reorder; drop nets from the drawer between lanes'],
  ['double-click a lane name', 'rename it'],
  ['double-click a net in the drawer', 'add it (also Enter, the + button, or drag)'],
];

export function renderHelp(body: HTMLElement): void {
  const sections = SCHEME.map((s) =>
    h(
      'section',
      { class: 'help-section' },
      h('h3', { text: s.title }),
      h('dl', {}, ...s.items.flatMap((b) => [h('dt', {}, ...b.keys.map((k) => (k === '…' ? h('span', { text: '…' }) : h('kbd', { text: k })))), h('dd', { text: b.what })])),
    ),
  );
  const mouse = h('section', { class: 'help-section help-pointer' }, h('h3', { text: 'Pointer' }), h('dl', {}, ...MOUSE.flatMap(([k, v]) => [h('dt', { text: k }), h('dd', { text: v })])));
  body.replaceChildren(...sections, mouse);
}

export function installKeys(actions: Actions): void {
  window.addEventListener('keydown', (e) => {
    if (e.key === 'Escape') {
      if (actions.closeOverlays()) e.preventDefault();
      return;
    }
    if (isTyping(e.target) || e.ctrlKey || e.metaKey || e.altKey) return;
    const k = e.key;
    let handled = true;
    switch (k) {
      case '=':
      case '+':
        actions.zoomIn();
        break;
      case '-':
      case '_':
        actions.zoomOut();
        break;
      case 'ArrowLeft':
        actions.pan(e.shiftKey ? -1 : -0.1);
        break;
      case 'ArrowRight':
        actions.pan(e.shiftKey ? 1 : 0.1);
        break;
      case 'Home':
        actions.toStart();
        break;
      case 'End':
        actions.toEnd();
        break;
      case 'ArrowUp':
        actions.stepLane(-1);
        break;
      case 'ArrowDown':
        actions.stepLane(1);
        break;
      case 'PageUp':
        actions.scrollLanes(-1);
        break;
      case 'PageDown':
        actions.scrollLanes(1);
        break;
      case ']':
        actions.edge(1);
        break;
      case '[':
        actions.edge(-1);
        break;
      case '}':
        actions.seek(1);
        break;
      case '{':
        actions.seek(-1);
        break;
      case 'Delete':
      case 'Backspace':
        actions.removeChosen();
        break;
      case '?':
        actions.help();
        break;
      default: {
        if (/^[1-9]$/.test(k)) {
          actions.activateCursor(Number(k) - 1);
          break;
        }
        const lower = k.length === 1 ? k.toLowerCase() : '';
        const binding = SCHEME.flatMap((s) => s.items).find((b) => b.keys.some((x) => x.length === 1 && x.toLowerCase() === lower && /[a-z/]/.test(lower)));
        if (binding) binding.run(actions, e);
        else handled = false;
      }
    }
    if (handled) e.preventDefault();
  });
}
