// The side sheet: a column of tabbed panels to the right of the traces. Cursors and lane
// settings live here now; measurement panels add their own tabs with addTab().

import { h } from './dom';

export interface SheetTab {
  id: string;
  title: string;
  panel: HTMLElement;
  /** Called when the tab is shown, so it can refresh. */
  onShow?: () => void;
}

export class SideSheet {
  private tabs: SheetTab[] = [];
  private current: string | null = null;
  private readonly buttons = new Map<string, HTMLButtonElement>();

  constructor(
    private readonly root: HTMLElement,
    private readonly tabBar: HTMLElement,
    private readonly body: HTMLElement,
  ) {}

  addTab(tab: SheetTab): void {
    this.tabs.push(tab);
    const b = h('button', { class: 'sheet-tab', type: 'button', role: 'tab', id: `tab-${tab.id}`, 'aria-controls': `panel-${tab.id}`, text: tab.title });
    b.addEventListener('click', () => this.show(tab.id));
    this.buttons.set(tab.id, b);
    this.tabBar.append(b);
    tab.panel.id = `panel-${tab.id}`;
    tab.panel.setAttribute('role', 'tabpanel');
    tab.panel.setAttribute('aria-labelledby', `tab-${tab.id}`);
    tab.panel.hidden = true;
    this.body.append(tab.panel);
    if (this.current === null) this.show(tab.id);
  }

  show(id: string): void {
    const tab = this.tabs.find((t) => t.id === id);
    if (!tab) return;
    this.current = id;
    this.root.hidden = false;
    for (const t of this.tabs) {
      t.panel.hidden = t.id !== id;
      const b = this.buttons.get(t.id)!;
      b.setAttribute('aria-selected', String(t.id === id));
      b.classList.toggle('is-current', t.id === id);
    }
    tab.onShow?.();
  }

  get shown(): string | null {
    return this.current;
  }
}
