// Puts measuring into the viewer: the desk, its three side-sheet tabs (Measure, Glitches, Worst
// cases), the traces' context menu, and the measuring part of saved views.

import { keepInView } from '../viewio';
import { type DeskHooks, MeasureDesk } from './desk';
import { GlitchPanel } from './glitchpanel';
import { installLaneMenu } from './lanemenu';
import { MeasurePanel } from './measurepanel';
import { SheetPanel } from './sheetpanel';

const MINE = new Set(['measure', 'glitches', 'worst']);

export function installMeasuring(hooks: DeskHooks, lanes: HTMLElement, sheetRoot: HTMLElement): MeasureDesk {
  const desk = new MeasureDesk(hooks);
  const measure = new MeasurePanel(desk);
  const glitches = new GlitchPanel(desk);
  const worst = new SheetPanel(desk);
  const sheet = hooks.sheet;
  // The measuring tabs hold tables: the side sheet widens while one of them is shown.
  const show = sheet.show.bind(sheet);
  sheet.show = (id: string) => {
    show(id);
    sheetRoot.classList.toggle('is-wide', MINE.has(id));
  };
  sheet.addTab({ id: 'measure', title: 'Measure', panel: measure.panel, onShow: () => measure.render() });
  sheet.addTab({ id: 'glitches', title: 'Glitches', panel: glitches.panel, onShow: () => glitches.render() });
  sheet.addTab({ id: 'worst', title: 'Worst cases', panel: worst.panel, onShow: () => worst.render() });
  installLaneMenu(desk, lanes, { showTab: (id) => sheet.show(id) });
  keepInView({ save: () => desk.savePart(), restore: (p) => desk.restorePart(p) });
  return desk;
}
