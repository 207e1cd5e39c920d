// Glitch search, O(n) in the changes: a glitch is a pulse (two successive opposite edges with no
// unknown span between them) strictly narrower than the chosen width: `high` = rise then fall,
// `low` = fall then rise. A timestamp where several changes left the net where it started is a
// `zero-width` glitch. Runts on real nets are always reported, whatever their width, because a pulse
// that never reaches a valid level is a defect at any width. Default targets: every 1-bit net, every
// bit of every vector (all bits of a vector in one pass) and every real net.
// Found glitches are kept in typed arrays; the `glitches` records, sorted by time then net name, are
// built on first read (sorting is O(g log g) in the number of glitches g, not in the changes).

import type { Dump } from '../model/dump';
import { type NetRef, allBitRefs } from '../model/netref';
import { edgeLists } from './edges';
import { MeasureError } from './errors';
import { lazyField } from './lazy';
import type { LevelSpec } from './level';
import { ticksToSeconds, windowTicks } from './ticks';
import { EdgeDir, type EdgeList, type Glitch, type GlitchPolarity, type GlitchResult, type UnknownSpan } from './types';
import { unknownSpans } from './unknown';

export interface GlitchOptions {
  maxWidthS: number;
  /** Nets or bits to search; a whole vector stands for each of its bits. Default: all (see above). */
  nets?: NetRef[];
  level?: LevelSpec;
}

/** Whole vectors become their bits; 1-bit nets, bits and real nets stay as they are. */
export function glitchTargets(dump: Dump, nets?: NetRef[]): NetRef[] {
  if (!nets) {
    const out = allBitRefs(dump);
    const seen = new Set<string>();
    for (const net of dump.nets) {
      if (dump.signals[net.signal].kind === 'real' && !seen.has(net.path)) {
        seen.add(net.path);
        out.push({ net, bit: null, label: net.path });
      }
    }
    return out;
  }
  const out: NetRef[] = [];
  for (const ref of nets) {
    const net = ref.net;
    if (ref.bit === null && dump.signals[net.signal].kind === 'vector') {
      const step = net.msb >= net.lsb ? -1 : 1;
      for (let b = net.msb; ; b += step) {
        out.push({ net, bit: b, label: `${net.path}[${b}]` });
        if (b === net.lsb) break;
      }
    } else out.push(ref);
  }
  return out;
}

const POLARITIES: readonly GlitchPolarity[] = ['low', 'high', 'zero-width', 'runt'];
const LOW = 0;
const HIGH = 1;
const ZERO = 2;
const RUNT = 3;

/** Glitches found so far, in typed arrays that grow by doubling. */
export class GlitchSink {
  count = 0;
  tick = new Float64Array(64);
  width = new Float64Array(64);
  target = new Int32Array(64);
  polarity = new Uint8Array(64);

  push(tick: number, width: number, target: number, polarity: number): void {
    if (this.count === this.tick.length) this.grow();
    const k = this.count++;
    this.tick[k] = tick;
    this.width[k] = width;
    this.target[k] = target;
    this.polarity[k] = polarity;
  }

  private grow(): void {
    const n = this.tick.length * 2;
    const t = new Float64Array(n);
    t.set(this.tick);
    this.tick = t;
    const w = new Float64Array(n);
    w.set(this.width);
    this.width = w;
    const g = new Int32Array(n);
    g.set(this.target);
    this.target = g;
    const p = new Uint8Array(n);
    p.set(this.polarity);
    this.polarity = p;
  }
}

/**
 * Pulses narrower than maxTicks in one edge list (two successive opposite edges, no unknown span
 * starting between them). Takes the arrays, not the EdgeList, so this hot loop sees the same few
 * object shapes whatever kind of net the edges came from.
 */
function pulses(ticks: Float64Array, dir: Uint8Array, count: number, unknown: number[], maxTicks: number, target: number, out: GlitchSink): void {
  let ui = 0;
  for (let k = 1; k < count; k++) {
    const a = dir[k - 1];
    const b = dir[k];
    if (a === b || a === EdgeDir.Change || b === EdgeDir.Change) continue;
    const t0 = ticks[k - 1];
    const t1 = ticks[k];
    const width = t1 - t0;
    if (!(width < maxTicks)) continue;
    while (2 * ui < unknown.length && unknown[2 * ui] <= t0) ui++;
    if (2 * ui < unknown.length && unknown[2 * ui] < t1) continue; // an unknown span inside: not a clean pulse
    out.push(t0, width, target, a === EdgeDir.Rise ? HIGH : LOW);
  }
}

/** Pulses narrower than maxTicks, zero-width glitches and runts of one net (target index `target`). */
export function netGlitches(list: EdgeList, maxTicks: number, target: number, out: GlitchSink): void {
  pulses(list.ticks, list.dir, list.count, list.unknown, maxTicks, target, out);
  const zw = list.zeroWidth;
  for (let k = 0; k < zw.length; k++) out.push(zw[k], 0, target, ZERO);
  const r = list.runts;
  for (let k = 0; k + 2 < r.length; k += 3) out.push(r[k], r[k + 1] - r[k], target, RUNT);
}

export function findGlitches(dump: Dump, opts: GlitchOptions): GlitchResult {
  if (!(opts.maxWidthS > 0)) throw new MeasureError(`the glitch width limit must be a positive time, not ${opts.maxWidthS}`);
  const ts = dump.timescale;
  const maxTicks = windowTicks(ts, opts.maxWidthS);
  const targets = glitchTargets(dump, opts.nets);
  const lists = edgeLists(dump, targets, { level: opts.level });
  const sink = new GlitchSink();
  const withUnknown: EdgeList[] = [];
  lists.forEach((list, t) => {
    netGlitches(list, maxTicks, t, sink);
    if (list.unknown.length > 0) withUnknown.push(list);
  });
  const result: GlitchResult = { max_width_s: opts.maxWidthS, nets: targets.length, count: sink.count, glitches: [], unknown_spans: [] };
  lazyField(result, 'glitches', () => sortedGlitches(dump, sink, targets));
  lazyField(result, 'unknown_spans', (): UnknownSpan[] => withUnknown.flatMap((l) => unknownSpans(dump, l)));
  return result;
}

/** The glitch records, sorted by time, then net name. */
function sortedGlitches(dump: Dump, sink: GlitchSink, targets: NetRef[]): Glitch[] {
  const byName = targets.map((_, i) => i).sort((a, b) => (targets[a].label < targets[b].label ? -1 : targets[a].label > targets[b].label ? 1 : a - b));
  const rank = new Int32Array(targets.length);
  byName.forEach((t, r) => (rank[t] = r));
  const order = new Uint32Array(sink.count);
  for (let k = 0; k < sink.count; k++) order[k] = k;
  order.sort((x, y) => sink.tick[x] - sink.tick[y] || rank[sink.target[x]] - rank[sink.target[y]] || x - y);
  const ts = dump.timescale;
  const out: Glitch[] = new Array(sink.count);
  for (let k = 0; k < sink.count; k++) {
    const g = order[k];
    out[k] = {
      net: targets[sink.target[g]].label,
      start_s: ticksToSeconds(ts, sink.tick[g]),
      width_s: ticksToSeconds(ts, sink.width[g]),
      polarity: POLARITIES[sink.polarity[g]],
    };
  }
  return out;
}
