// Resident memory of this process. Linux keeps a high-water mark (VmHWM) that catches short
// peaks between samples (such as an array being copied while it grows); writing 5 to
// /proc/self/clear_refs resets it to the current size (Linux ≥ 4.0, proc(5)).

import { readFileSync, writeFileSync } from 'node:fs';

export function resetPeakResident(): boolean {
  try {
    writeFileSync('/proc/self/clear_refs', '5');
    return true;
  } catch {
    return false;
  }
}

/** VmHWM in bytes, or 0 where /proc is not there. */
export function peakResident(): number {
  try {
    const m = /VmHWM:\s+(\d+)\s+kB/.exec(readFileSync('/proc/self/status', 'utf8'));
    return m ? Number(m[1]) * 1024 : 0;
  } catch {
    return 0;
  }
}

export function collectGarbage(): void {
  const gc = (globalThis as { gc?: () => void }).gc;
  if (!gc) throw new Error('run this child with node --expose-gc');
  gc();
  gc();
}

/** Samples rss and arrayBuffers and keeps the largest of each. */
export class MemoryPeaks {
  rss = 0;
  arrayBuffers = 0;
  sample(): void {
    const m = process.memoryUsage();
    if (m.rss > this.rss) this.rss = m.rss;
    if (m.arrayBuffers > this.arrayBuffers) this.arrayBuffers = m.arrayBuffers;
  }
}
