// The reference for the measurement figures: one plain pass that reads every change once (its
// timestamp and its value) and does nothing else. A measurement must read each change at least
// this once, so its speed as a fraction of this pass shows its overhead.

import type { Dump, Signal } from '../../../src/model/dump';
import { wordsFor } from '../../../src/model/dump';

function readSignal(times: Float64Array, sig: Signal): number {
  let acc = 0;
  const n = sig.count;
  const ti = sig.timeIndex;
  if (sig.kind === 'vector') {
    const step = 2 * wordsFor(sig.width);
    const planes = sig.planes;
    for (let i = 0; i < n; i++) {
      acc += times[ti[i]];
      for (let w = 0; w < step; w++) acc += planes[i * step + w];
    }
  } else if (sig.kind === 'real') {
    const r = sig.reals;
    for (let i = 0; i < n; i++) acc += times[ti[i]] + r[i];
  } else {
    const l = sig.logic;
    for (let i = 0; i < n; i++) acc += times[ti[i]] + l[i];
  }
  return acc;
}

/** Reads every stored change of the given signals once; returns a sum so the work is not dropped. */
export function plainPass(dump: Dump, signals: Iterable<number>): number {
  let acc = 0;
  for (const s of signals) acc += readSignal(dump.times, dump.signals[s]);
  return acc;
}

/** Stored changes of the given signals (the pass's count). */
export function changeCount(dump: Dump, signals: Iterable<number>): number {
  let n = 0;
  for (const s of signals) n += dump.signals[s].count;
  return n;
}
