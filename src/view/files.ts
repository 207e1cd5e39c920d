// Files coming in: the dump picker, the view-file picker, and a dump dropped anywhere on the
// page (with a veil while it is dragged over). Nets dragged from the drawer are not files and
// pass through untouched.

import { byId } from './dom';

export interface FileHooks {
  openDump(file: File): void;
  restoreView(file: File): void;
}

export function installFileInputs(hooks: FileHooks): void {
  const input = byId<HTMLInputElement>('file-input');
  input.addEventListener('change', () => {
    const f = input.files?.[0];
    if (f) hooks.openDump(f);
    input.value = '';
  });
  const viewInput = byId<HTMLInputElement>('view-input');
  viewInput.addEventListener('change', () => {
    const f = viewInput.files?.[0];
    if (f) hooks.restoreView(f);
    viewInput.value = '';
  });
  const veil = byId('drop-veil');
  let depth = 0;
  const hasFiles = (e: DragEvent) => !!e.dataTransfer && e.dataTransfer.types.includes('Files');
  window.addEventListener('dragenter', (e) => {
    if (!hasFiles(e)) return;
    depth++;
    veil.hidden = false;
  });
  window.addEventListener('dragleave', (e) => {
    if (!hasFiles(e)) return;
    depth = Math.max(0, depth - 1);
    if (depth === 0) veil.hidden = true;
  });
  window.addEventListener('dragover', (e) => {
    if (!hasFiles(e)) return;
    e.preventDefault();
    e.dataTransfer!.dropEffect = 'copy';
  });
  window.addEventListener('drop', (e) => {
    if (!hasFiles(e)) return;
    e.preventDefault();
    depth = 0;
    veil.hidden = true;
    const f = e.dataTransfer!.files[0];
    if (f) hooks.openDump(f);
  });
}
