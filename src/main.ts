// Browser entry: starts the canvas, then the viewer, then opens `?dump=` when given.

import { Stage } from './render/stage';
import { THEMES } from './render/theme';
import { ViewerApp } from './view/app';

async function start(): Promise<void> {
  const host = document.getElementById('canvas-host');
  if (!host) return;
  let stage: Stage;
  try {
    stage = await Stage.create(host, THEMES.paper.background);
  } catch (e) {
    const note = document.getElementById('empty-note');
    if (note) note.textContent = `midrail cannot draw in this browser: ${(e as Error).message}`;
    return;
  }
  const app = new ViewerApp(stage);
  const dump = new URLSearchParams(window.location.search).get('dump');
  if (dump) await app.openUrl(dump);
}

void start();
