// Row order of a measurement's table: sorted by a column, optionally only the items whose value
// falls in one histogram bin or of one kind. Sorting is stable (ties keep time order), so "worst
// first" lists the earliest of equal values first, as the CLI's worst lists do. Pure; the worker
// runs it for big tables so the page never waits on a sort.

import { binOf } from './bins';
import { marginOf } from './limitcheck';
import { type Items, JUDGED, type LimitValues, VIOLATES } from './types';

export type SortKey = 'time' | 'value' | 'kind' | 'margin';

export interface RowFilter {
  /** Only this kind (index into the measurement's kind names). */
  kind?: number;
  /** Only the items in one bin of the histogram (bin of `binOf(value, lo, width, bins)`). */
  bin?: { lo: number; width: number; bins: number; index: number };
  /** Only violating items. */
  violations?: boolean;
}

export function orderItems(items: Items, key: SortKey, descending: boolean, filter: RowFilter, limits: LimitValues): Uint32Array {
  const keep: number[] = [];
  const f = filter;
  for (let i = 0; i < items.count; i++) {
    if (f.kind !== undefined && items.kind[i] !== f.kind) continue;
    if (f.bin && binOf(items.value[i], f.bin.lo, f.bin.width, f.bin.bins) !== f.bin.index) continue;
    if (f.violations && !(items.flags[i] & VIOLATES)) continue;
    keep.push(i);
  }
  const order = Uint32Array.from(keep);
  if (key === 'time') {
    if (descending) order.reverse();
    return order;
  }
  // Items that do not count toward the limits (the other output edge of a delay) sort after the
  // rest by value or margin, so "worst first" lists what the limits judge.
  const last = descending ? -Infinity : Infinity;
  let col: Float64Array;
  if (key === 'kind') col = Float64Array.from(items.kind);
  else {
    col = new Float64Array(items.count);
    for (const i of keep) {
      if (!(items.flags[i] & JUDGED)) col[i] = last;
      else col[i] = key === 'value' ? items.value[i] : (marginOf(items.value[i], limits) ?? -items.value[i]);
    }
  }
  const sign = descending ? -1 : 1;
  order.sort((a, b) => sign * (col[a] - col[b]) || a - b);
  return order;
}
