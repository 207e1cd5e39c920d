// Histogram of a measurement's values (delay per kind, skew, glitch width) as SVG: bars with their
// counts, and the min, mean and max marked beneath. Clicking a bar filters the table to the items
// in that bin; clicking it again clears the filter.

import { formatTime } from '../../model/units';
import { h } from '../dom';
import type { Bins } from './bins';

const NS = 'http://www.w3.org/2000/svg';
const W = 360;
const H = 112;
const PAD_X = 6;
const BASE = 78;

function svg<K extends keyof SVGElementTagNameMap>(tag: K, attrs: Record<string, string | number>, text?: string): SVGElementTagNameMap[K] {
  const el = document.createElementNS(NS, tag);
  for (const [k, v] of Object.entries(attrs)) el.setAttribute(k, String(v));
  if (text !== undefined) el.textContent = text;
  return el;
}

export class Histogram {
  readonly el: HTMLElement;
  private readonly plot: SVGSVGElement;
  private readonly caption: HTMLElement;
  private bins: Bins | null = null;
  private chosen = -1;

  constructor(
    id: string,
    private readonly hooks: { bin(index: number | null, bins: Bins): void },
  ) {
    this.plot = svg('svg', { viewBox: `0 0 ${W} ${H}`, class: 'hist-plot', role: 'img' });
    this.caption = h('div', { class: 'hist-caption' });
    this.el = h('div', { class: 'hist', id }, this.plot, this.caption);
    this.plot.addEventListener('click', (e) => {
      const bar = (e.target as Element).closest('[data-bin]');
      if (!bar || !this.bins) return;
      const b = Number(bar.getAttribute('data-bin'));
      this.chosen = this.chosen === b ? -1 : b;
      this.paint();
      this.hooks.bin(this.chosen < 0 ? null : this.chosen, this.bins);
    });
  }

  get chosenBin(): number {
    return this.chosen;
  }

  clearChoice(): void {
    this.chosen = -1;
    this.paint();
  }

  set(bins: Bins | null, what: string): void {
    this.bins = bins;
    this.chosen = -1;
    this.plot.setAttribute('aria-label', `Histogram of ${what}`);
    this.paint();
  }

  private paint(): void {
    const b = this.bins;
    this.plot.replaceChildren();
    if (!b) {
      this.caption.textContent = 'nothing measured yet';
      return;
    }
    const n = b.counts.length;
    const peak = Math.max(...b.counts);
    const slot = (W - 2 * PAD_X) / n;
    const xOf = (v: number) => (b.width === 0 ? W / 2 : PAD_X + ((v - b.lo) / (b.width * n)) * (W - 2 * PAD_X));
    this.plot.append(svg('line', { x1: PAD_X, y1: BASE + 0.5, x2: W - PAD_X, y2: BASE + 0.5, class: 'hist-axis' }));
    for (let k = 0; k < n; k++) {
      const c = b.counts[k];
      const hgt = peak > 0 ? Math.max(c > 0 ? 2 : 0, Math.round((c / peak) * (BASE - 16))) : 0;
      const x = b.width === 0 ? W / 2 - 20 : PAD_X + k * slot + 1;
      const w = b.width === 0 ? 40 : Math.max(1, slot - 2);
      const lo = b.lo + k * b.width;
      const hi = b.width === 0 ? b.lo : lo + b.width;
      const g = svg('g', { 'data-bin': k, class: 'hist-bin' + (k === this.chosen ? ' is-chosen' : ''), tabindex: 0 });
      g.append(svg('title', {}, `${c} between ${formatTime(lo, 4)} and ${formatTime(hi, 4)} — click to list only these`));
      g.append(svg('rect', { x, y: 2, width: w, height: BASE - 2, class: 'hist-hit' }));
      g.append(svg('rect', { x, y: BASE - hgt, width: w, height: hgt, class: 'hist-bar' }));
      if (c > 0 && slot >= 14) g.append(svg('text', { x: x + w / 2, y: BASE - hgt - 3, class: 'hist-count' }, String(c)));
      this.plot.append(g);
    }
    // Min, mean and max under the axis: the mean as a solid mark, the ends as short ticks.
    const marks: Array<[string, number, string]> = [
      ['min', b.min, 'start'],
      ['mean', b.mean, 'middle'],
      ['max', b.max, 'end'],
    ];
    marks.forEach(([name, v, anchor], k) => {
      const x = xOf(v);
      this.plot.append(svg('line', { x1: x, y1: BASE, x2: x, y2: BASE + (name === 'mean' ? 9 : 5), class: `hist-mark hist-${name}` }));
      const tx = anchor === 'start' ? PAD_X : anchor === 'end' ? W - PAD_X : Math.min(W - 70, Math.max(70, x));
      this.plot.append(svg('text', { x: tx, y: BASE + 20 + (k === 1 ? 12 : 0), class: `hist-label hist-${name}`, 'text-anchor': anchor }, `${name} ${formatTime(v, 4)}`));
    });
    this.caption.textContent = `${b.count.toLocaleString('en')} values in ${n} bin${n === 1 ? '' : 's'}${this.chosen >= 0 ? ` · listing bin ${this.chosen + 1} only (click it again for all)` : ' · click a bar to list only those'}`;
  }
}
