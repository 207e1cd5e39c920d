// O(log n) lookups on a signal's change list, and value formatting.

import { type Dump, type Signal, LOGIC_CHARS, wordsFor } from './dump';

/** Tick of change i. */
export function changeTick(dump: Dump, sig: Signal, i: number): number {
  return dump.times[sig.timeIndex[i]];
}

/** Index of the first change at or after `tick` (sig.count if none). */
export function firstChangeAtOrAfter(dump: Dump, sig: Signal, tick: number): number {
  let lo = 0;
  let hi = sig.count;
  const times = dump.times;
  const idx = sig.timeIndex;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (times[idx[mid]] < tick) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Index of the change in effect at `tick`: the last change at or before it (-1 if none). */
export function changeInEffectAt(dump: Dump, sig: Signal, tick: number): number {
  let lo = 0;
  let hi = sig.count;
  const times = dump.times;
  const idx = sig.timeIndex;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (times[idx[mid]] <= tick) lo = mid + 1;
    else hi = mid;
  }
  return lo - 1;
}

/** Value of change i as text: MSB first, full width, 0/1/x/z lower case, other states upper case. */
export function valueText(sig: Signal, i: number): string {
  const t = sig.texts.get(i);
  if (t !== undefined) return t;
  switch (sig.kind) {
    case 'logic':
    case 'event':
      return LOGIC_CHARS[sig.logic[i]];
    case 'real':
      return String(sig.reals[i]);
    case 'vector': {
      const words = wordsFor(sig.width);
      const base = i * 2 * words;
      let out = '';
      for (let b = sig.width - 1; b >= 0; b--) {
        const w = b >>> 5;
        const m = 1 << (b & 31);
        const v = (sig.planes[base + w] & m) !== 0;
        const u = (sig.planes[base + words + w] & m) !== 0;
        out += u ? (v ? 'z' : 'x') : v ? '1' : '0';
      }
      return out;
    }
    default:
      return '';
  }
}

/** Value text at a tick ('x' repeated before the first change). */
export function valueTextAt(dump: Dump, sig: Signal, tick: number): string {
  const i = changeInEffectAt(dump, sig, tick);
  if (i < 0) return sig.kind === 'real' ? 'NaN' : 'x'.repeat(Math.max(1, sig.width));
  return valueText(sig, i);
}

/**
 * Logic code (index into LOGIC_CHARS) of bit `bit` (0 = rightmost) of change i of a vector.
 * For a 1-bit signal bit must be 0.
 */
export function bitCode(sig: Signal, i: number, bit: number): number {
  if (sig.kind === 'logic' || sig.kind === 'event') return sig.logic[i];
  const t = sig.texts.get(i);
  if (t !== undefined) {
    const ch = t[t.length - 1 - bit] ?? 'x';
    const k = LOGIC_CHARS.indexOf(ch === 'X' ? 'x' : ch === 'Z' ? 'z' : ch);
    return k < 0 ? 2 : k;
  }
  const words = wordsFor(sig.width);
  const base = i * 2 * words;
  const w = bit >>> 5;
  const m = 1 << (bit & 31);
  const v = (sig.planes[base + w] & m) !== 0;
  const u = (sig.planes[base + words + w] & m) !== 0;
  return u ? (v ? 3 : 2) : v ? 1 : 0;
}
