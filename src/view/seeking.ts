// Where the active cursor goes for "next edge" and "next value" on the chosen lane. Pure (no
// DOM): each search gives a tick, or a sentence saying why there is none.

import { parseTypedValue } from '../render/radix';
import { nextCrossing, nextEdge, nextValue } from '../render/seek';
import type { RealInfo } from './realnets';
import { nextInstant } from './realnets';
import type { NetLane, Row, ViewState } from './state';

export type Found = { tick: number } | { problem: string };

const way = (dir: 1 | -1) => (dir > 0 ? 'later' : 'earlier');

/** Next or previous edge after `from`: change times on digital lanes, measured instants on real ones. */
export function findEdge(st: ViewState, row: Row, real: RealInfo | null, from: number, dir: 1 | -1): Found {
  if (!st.dump || !row.signal) return { problem: 'choose a lane first: click its name or its trace' };
  if (real?.error) return { problem: real.error };
  const t = real ? nextInstant(real.ticks, from, dir) : nextEdge(st.dump, row.signal, from, dir);
  return t === null ? { problem: `no ${way(dir)} edge on ${st.rowLabel(row)}` } : { tick: t };
}

/**
 * Next or previous time after `from` that the lane starts holding the typed value: a bus value
 * in any radix or literal form, a state such as x, a string, or for a real net a level it crosses.
 */
export function findValue(st: ViewState, row: Row, text: string, from: number, dir: 1 | -1): Found {
  const sig = row.signal;
  if (!st.dump || !sig) return { problem: 'choose a lane first: click its name or its trace' };
  if (text.trim() === '') return { problem: 'type a value to look for first' };
  const label = st.rowLabel(row);
  if (sig.kind === 'real') {
    const level = Number(text);
    if (!Number.isFinite(level)) return { problem: `'${text}' is not a number; ${label} is a real net` };
    const t = nextCrossing(st.dump, sig, level, from, dir);
    return t === null ? { problem: `no ${way(dir)} crossing of ${level} on ${label}` } : { tick: t };
  }
  let bits: string | null = text;
  if (sig.kind !== 'string') {
    const width = sig.width;
    bits = parseTypedValue(text, width, row.kind === 'bit' || width === 1 ? 'bin' : (row.lane as NetLane).radix);
    if (bits === null) return { problem: `'${text}' is not a value of the ${width}-bit ${label}; write for example 0x1f, 0b101, 'h3a, 42, -3 or x` };
  }
  const t = nextValue(st.dump, sig, bits, from, dir);
  return t === null ? { problem: `no ${way(dir)} time ${label} = ${text}` } : { tick: t };
}
