// Edges of the bits of a vector net, every chosen bit in ONE pass over the vector's changes: per
// change, the bits whose state differs from the settled one are found a 32-bit word at a time, so
// the work grows with the number of bits that switch, not with the width. Each bit follows the
// 1-bit rules of logicEdges.ts (same state table): rise/fall between 0 and 1, unknown spans for
// x/z/U/W/-, weak L/H as 0/1, same-timestamp changes collapsed, zero-width glitches per bit.

import { type Net, type Signal, wordsFor } from '../model/dump';
import { bitCode } from '../model/lookup';
import { NO_STATE, STATE } from './logicEdges';
import { type EdgeList, edgeListOf } from './types';

/** Declared index of bit position p (0 = rightmost). */
export function declaredBit(net: Net, p: number): number {
  return net.msb >= net.lsb ? net.lsb + p : net.lsb - p;
}

class BitSink {
  count = 0;
  ticks = new Float64Array(16);
  dir = new Uint8Array(16);
  unknown: number[] = [];
  unknownState: number[] = [];
  zeroWidth: number[] = [];
  settled = NO_STATE;

  /** The settled state of this bit becomes `state` (a STATE value) at `tick`; `code` is its logic code. */
  apply(tick: number, state: number, code: number): void {
    const prev = this.settled;
    if (state === prev) return;
    if ((state | prev) <= 1) {
      if (this.count === this.ticks.length) {
        const t = new Float64Array(this.count * 2);
        t.set(this.ticks);
        this.ticks = t;
        const d = new Uint8Array(this.count * 2);
        d.set(this.dir);
        this.dir = d;
      }
      this.ticks[this.count] = tick;
      this.dir[this.count++] = state;
    } else if (state <= 1) {
      if (prev !== NO_STATE) this.unknown.push(tick);
    } else if (prev <= 1 || prev === NO_STATE) {
      this.unknown.push(tick);
      this.unknownState.push(code);
    }
    this.settled = state;
  }

  finish(label: string): EdgeList {
    if (this.unknown.length % 2 === 1) this.unknown.push(Number.NaN);
    return edgeListOf({
      label,
      source: 'logic',
      count: this.count,
      ticks: this.ticks.slice(0, this.count),
      dir: this.dir.slice(0, this.count),
      transition: null,
      unknown: this.unknown,
      unknownState: this.unknownState,
      zeroWidth: this.zeroWidth,
      runts: [],
      levels: null,
    });
  }
}

/** Logic code of a bit from the two planes: 0, 1, 2 (x) or 3 (z), as in lookup.bitCode. */
function planeCode(v: number, u: number): number {
  return u ? (v ? 3 : 2) : v;
}

/**
 * EdgeLists for the given bit positions (0 = rightmost) of a vector signal, labelled
 * `path[declared index]`. Positions outside the width are ignored.
 */
export function vectorBitEdges(times: Float64Array, sig: Signal, net: Net, positions: number[]): Map<number, EdgeList> {
  const width = sig.width;
  const words = wordsFor(width);
  const sinks: Array<BitSink | undefined> = new Array(width);
  const mask = new Uint32Array(words);
  for (const p of positions) {
    if (p < 0 || p >= width || sinks[p]) continue;
    sinks[p] = new BitSink();
    mask[p >>> 5] |= 1 << (p & 31);
  }
  const planes = sig.planes;
  const idx = sig.timeIndex;
  const n = sig.count;
  const stride = 2 * words;
  // Planes of the settled value (valid unless `dirty`: before the first change, or after a change
  // with states beyond 0/1/x/z, whose planes do not tell them apart).
  const sv = new Uint32Array(words);
  const su = new Uint32Array(words);
  let dirty = true;
  const passed = new Uint32Array(words);

  for (let i = 0; i < n; i++) {
    const ti = idx[i];
    const tick = times[ti];
    let groupEnd = i;
    while (groupEnd + 1 < n && idx[groupEnd + 1] === ti) groupEnd++;
    const hasText = sig.texts.size > 0 && hasTextIn(sig, i, groupEnd);
    if (dirty || hasText) {
      // Bit by bit, through the logic codes.
      for (let p = 0; p < width; p++) {
        const sink = sinks[p];
        if (!sink) continue;
        const before = sink.settled;
        let code = bitCode(sig, i, p);
        let state = STATE[code];
        let through = state !== before;
        for (let k = i + 1; k <= groupEnd; k++) {
          code = bitCode(sig, k, p);
          state = STATE[code];
          if (state !== before) through = true;
        }
        if (state === before) {
          if (through && before !== NO_STATE) sink.zeroWidth.push(tick);
        } else sink.apply(tick, state, code);
      }
      dirty = hasText;
    } else {
      // A word at a time: bits whose planes differ from the settled planes.
      if (groupEnd > i) {
        passed.fill(0);
        for (let k = i; k < groupEnd; k++) {
          const base = k * stride;
          for (let w = 0; w < words; w++) passed[w] |= (planes[base + w] ^ sv[w]) | (planes[base + words + w] ^ su[w]);
        }
      }
      const base = groupEnd * stride;
      for (let w = 0; w < words; w++) {
        const v = planes[base + w];
        const u = planes[base + words + w];
        const changed = ((v ^ sv[w]) | (u ^ su[w])) & mask[w];
        if (groupEnd > i) {
          let zw = passed[w] & ~changed & mask[w];
          while (zw !== 0) {
            const b = 31 - Math.clz32(zw);
            zw &= ~(1 << b);
            sinks[(w << 5) + b]!.zeroWidth.push(tick);
          }
        }
        let c = changed;
        while (c !== 0) {
          const b = 31 - Math.clz32(c);
          c &= ~(1 << b);
          const code = planeCode((v >>> b) & 1, (u >>> b) & 1);
          sinks[(w << 5) + b]!.apply(tick, STATE[code], code);
        }
      }
    }
    const base = groupEnd * stride;
    for (let w = 0; w < words; w++) {
      sv[w] = planes[base + w];
      su[w] = planes[base + words + w];
    }
    i = groupEnd;
  }
  const out = new Map<number, EdgeList>();
  for (let p = 0; p < width; p++) {
    const sink = sinks[p];
    if (sink) out.set(p, sink.finish(`${net.path}[${declaredBit(net, p)}]`));
  }
  return out;
}

function hasTextIn(sig: Signal, from: number, to: number): boolean {
  for (let k = from; k <= to; k++) if (sig.texts.has(k)) return true;
  return false;
}
