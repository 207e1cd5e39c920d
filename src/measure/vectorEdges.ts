// Edges of a whole vector net: every settled change of value between fully known values is a
// `change` edge. A value with any x/z/U/W/- bit is unknown: changes into and out of such values open
// and close an unknown span instead. Same-timestamp changes collapse as for 1-bit nets. Weak L/H bits
// count as 0/1, as for 1-bit nets.

import { type Signal, wordsFor } from '../model/dump';
import { EdgeDir, type EdgeList, edgeListOf } from './types';

const WEAK_OR_STRONG = /^[01LHlh]*$/;

function isKnown(sig: Signal, i: number, words: number): boolean {
  const text = sig.texts.get(i);
  if (text !== undefined) return WEAK_OR_STRONG.test(text);
  const base = i * 2 * words + words;
  for (let w = 0; w < words; w++) if (sig.planes[base + w] !== 0) return false;
  return true;
}

function normalText(text: string): string {
  return text.replace(/[Ll]/g, '0').replace(/[Hh]/g, '1');
}

/** Same value (both planes, or the same normalised text). */
function sameValue(sig: Signal, a: number, b: number, words: number): boolean {
  const ta = sig.texts.get(a);
  const tb = sig.texts.get(b);
  if (ta !== undefined || tb !== undefined) {
    if (ta === undefined || tb === undefined) return false;
    return normalText(ta) === normalText(tb);
  }
  const pa = a * 2 * words;
  const pb = b * 2 * words;
  for (let w = 0; w < 2 * words; w++) if (sig.planes[pa + w] !== sig.planes[pb + w]) return false;
  return true;
}

export function vectorEdges(times: Float64Array, sig: Signal, label: string): EdgeList {
  const n = sig.count;
  const idx = sig.timeIndex;
  const words = wordsFor(sig.width);
  const ticks = new Float64Array(n);
  const dir = new Uint8Array(n);
  const unknown: number[] = [];
  const zeroWidth: number[] = [];
  let count = 0;
  let settled = -1; // change index holding the settled value
  let settledKnown = false;
  let i = 0;
  while (i < n) {
    const ti = idx[i];
    let passed = settled >= 0 && !sameValue(sig, i, settled, words);
    let j = i + 1;
    while (j < n && idx[j] === ti) {
      if (settled >= 0 && !passed && !sameValue(sig, j, settled, words)) passed = true;
      j++;
    }
    const last = j - 1;
    const tick = times[ti];
    const known = isKnown(sig, last, words);
    if (settled >= 0 && sameValue(sig, last, settled, words)) {
      if (passed && j - i > 1) zeroWidth.push(tick);
    } else if (known) {
      if (settled >= 0 && settledKnown) {
        ticks[count] = tick;
        dir[count++] = EdgeDir.Change;
      } else if (settled >= 0) unknown.push(tick);
    } else if (settled < 0 || settledKnown) unknown.push(tick);
    settled = last;
    settledKnown = known;
    i = j;
  }
  if (unknown.length % 2 === 1) unknown.push(Number.NaN);
  return edgeListOf({
    label,
    source: 'vector',
    count,
    ticks: ticks.slice(0, count),
    dir: dir.slice(0, count),
    transition: null,
    unknown,
    unknownState: new Array<number>(unknown.length / 2).fill(-1),
    zeroWidth,
    runts: [],
    levels: null,
  });
}
