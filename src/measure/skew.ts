// Skew across a group of nets (JEDEC JESD65B idea of output skew, applied to simulated edges).
// All edges of the group (optionally one direction only) are sorted by time and grouped into events:
// an event starts at the earliest edge not yet in one and takes the following edges that lie within
// the window after it. One net contributes at most one edge to an event; its next edge starts a new
// event. Skew = latest − earliest edge of the event. Every event is listed, single-net ones too (skew
// 0), and the mean skew is over all listed events.
// Default window: half the shortest interval between successive (counted) edges of the group's
// busiest net, so one net's successive edges never fall into one event.

import type { Dump } from '../model/dump';
import type { NetRef } from '../model/netref';
import { edgeLists } from './edges';
import { MeasureError } from './errors';
import type { LevelSpec } from './level';
import { ticksToSeconds, windowTicks } from './ticks';
import { EdgeDir, type EdgeList, type SkewEdge, type SkewEvent, type SkewOffset, type SkewResult } from './types';
import { unknownSpans } from './unknown';

export interface SkewOptions {
  nets: NetRef[];
  edge?: SkewEdge;
  windowS?: number;
  /** Reference net for the mean offsets; must be one of `nets`. Default: the net that is earliest in most events. */
  ref?: NetRef;
  level?: LevelSpec;
}

function counts(dir: number, edge: SkewEdge): boolean {
  if (edge === 'any') return true;
  return dir === (edge === 'rise' ? EdgeDir.Rise : EdgeDir.Fall);
}

export function measureSkew(dump: Dump, opts: SkewOptions): SkewResult {
  const edge = opts.edge ?? 'any';
  const nets = opts.nets;
  const ts = dump.timescale;
  const s = (t: number) => ticksToSeconds(ts, t);
  let refIndex = -1;
  if (opts.ref) {
    refIndex = nets.findIndex((n) => n.label === opts.ref!.label);
    if (refIndex < 0) throw new MeasureError(`the reference net '${opts.ref.label}' is not one of the nets measured for skew`);
  }
  const lists: EdgeList[] = edgeLists(dump, nets, { level: opts.level });

  // Flatten the counted edges.
  let total = 0;
  for (const l of lists) for (let k = 0; k < l.count; k++) if (counts(l.dir[k], edge)) total++;
  const tick = new Float64Array(total);
  const net = new Int32Array(total);
  const dir = new Uint8Array(total);
  const perNet = new Int32Array(nets.length);
  let p = 0;
  lists.forEach((l, ni) => {
    for (let k = 0; k < l.count; k++) {
      if (!counts(l.dir[k], edge)) continue;
      tick[p] = l.ticks[k];
      net[p] = ni;
      dir[p++] = l.dir[k];
      perNet[ni]++;
    }
  });

  // Window: given, or half the busiest net's shortest edge interval.
  let win: number;
  let windowSource: SkewResult['window_source'];
  if (opts.windowS !== undefined) {
    win = windowTicks(ts, opts.windowS);
    windowSource = 'given';
  } else {
    let busiest = 0;
    for (let ni = 1; ni < nets.length; ni++) if (perNet[ni] > perNet[busiest]) busiest = ni;
    let shortest = Infinity;
    let prev = Number.NaN;
    for (let q = 0; q < total; q++) {
      if (net[q] !== busiest) continue;
      if (!Number.isNaN(prev)) shortest = Math.min(shortest, tick[q] - prev);
      prev = tick[q];
    }
    if (Number.isFinite(shortest)) {
      win = shortest / 2;
      windowSource = 'busiest-net';
    } else {
      win = Math.max(dump.endTick, total > 0 ? tick[total - 1] : 0);
      windowSource = 'whole-dump';
    }
  }

  if (!(win >= 0)) throw new MeasureError(`the skew window must be a time of zero or more, not ${opts.windowS}`);
  const order = Uint32Array.from({ length: total }, (_, i) => i).sort((a, b) => tick[a] - tick[b] || net[a] - net[b]);

  // Events are contiguous runs of `order`: [starts[e], starts[e+1]).
  const starts: number[] = [];
  const stamp = new Int32Array(nets.length).fill(-1);
  let q = 0;
  while (q < total) {
    const e = starts.length;
    starts.push(q);
    const t0 = tick[order[q]];
    while (q < total && tick[order[q]] - t0 <= win && stamp[net[order[q]]] !== e) {
      stamp[net[order[q]]] = e;
      q++;
    }
  }
  starts.push(total);

  const events: SkewEvent[] = [];
  const earliestCount = new Int32Array(nets.length);
  let maxSkew = -Infinity;
  let sumSkew = 0;
  for (let e = 0; e + 1 < starts.length; e++) {
    const a = order[starts[e]];
    const z = order[starts[e + 1] - 1];
    let rises = 0;
    let falls = 0;
    for (let r = starts[e]; r < starts[e + 1]; r++) {
      if (dir[order[r]] === EdgeDir.Rise) rises++;
      else if (dir[order[r]] === EdgeDir.Fall) falls++;
    }
    const n = starts[e + 1] - starts[e];
    const kind = rises === n ? 'rise' : falls === n ? 'fall' : rises + falls === 0 ? 'change' : 'mixed';
    const skew = tick[z] - tick[a];
    maxSkew = Math.max(maxSkew, skew);
    sumSkew += skew;
    earliestCount[net[a]]++;
    events.push({ edge: kind, time_s: s(tick[a]), skew_s: s(skew), edges: n, earliest: nets[net[a]].label, latest: nets[net[z]].label });
  }

  if (refIndex < 0 && events.length > 0) {
    refIndex = 0;
    for (let ni = 1; ni < nets.length; ni++) if (earliestCount[ni] > earliestCount[refIndex]) refIndex = ni;
  }

  // Mean offset of each net from the reference net, over events holding both.
  const offSum = new Float64Array(nets.length);
  const offCount = new Int32Array(nets.length);
  if (refIndex >= 0) {
    for (let e = 0; e + 1 < starts.length; e++) {
      let refTick = Number.NaN;
      for (let r = starts[e]; r < starts[e + 1]; r++) if (net[order[r]] === refIndex) refTick = tick[order[r]];
      if (Number.isNaN(refTick)) continue;
      for (let r = starts[e]; r < starts[e + 1]; r++) {
        const ni = net[order[r]];
        if (ni === refIndex) continue;
        offSum[ni] += tick[order[r]] - refTick;
        offCount[ni]++;
      }
    }
  }
  const offsets: SkewOffset[] = [];
  for (let ni = 0; ni < nets.length; ni++) {
    if (ni === refIndex) continue;
    offsets.push({ net: nets[ni].label, mean_offset_s: offCount[ni] > 0 ? s(offSum[ni] / offCount[ni]) : null, events: offCount[ni] });
  }

  return {
    nets: nets.map((n) => n.label),
    edge,
    window_s: s(win),
    window_source: windowSource,
    ref: refIndex >= 0 ? nets[refIndex].label : null,
    events,
    max_skew_s: events.length > 0 ? s(maxSkew) : null,
    mean_skew_s: events.length > 0 ? s(sumSkew / events.length) : null,
    offsets,
    unknown_spans: lists.flatMap((l) => unknownSpans(dump, l)),
  };
}
