// Grows a Dump change by change. The parser feeds it; tests use it to build small dumps by hand.
// Each signal fills fixed blocks (64 entries, doubling up to 64 Ki) that are never copied while
// parsing; finish() joins them once into exact-size arrays, one signal at a time. So the peak stays
// near the final size (4-byte time index + 1-byte code per 1-bit change) instead of the 1.5–2×
// of doubling arrays, and no change is copied more than once.

import type { Dump, DumpWarning, Net, Scope, Signal, SignalKind, Timescale } from './dump';
import { wordsFor } from './dump';

const BLOCK_MIN = 64;
const BLOCK_MAX = 1 << 16;
const EMPTY_U8 = new Uint8Array(0);
const EMPTY_U32 = new Uint32Array(0);
const EMPTY_F64 = new Float64Array(0);

function grownInt32(a: Int32Array<ArrayBuffer>, need: number): Int32Array<ArrayBuffer> {
  if (need <= a.length) return a;
  const b = new Int32Array(Math.max(need, a.length * 2));
  b.set(a);
  return b;
}

function joinBlocks<T extends Uint8Array | Uint32Array | Float64Array>(blocks: T[], last: T, lastFill: number, out: T): T {
  let at = 0;
  for (const b of blocks) {
    out.set(b, at);
    at += b.length;
  }
  out.set(last.subarray(0, lastFill), at);
  return out;
}

export class DumpBuilder {
  readonly scopes: Scope[] = [];
  readonly nets: Net[] = [];
  readonly warnings: DumpWarning[] = [];
  readonly dumpOff: Array<[number, number]> = [];
  private sigs: Signal[] = [];
  private words: number[] = [];
  // Per signal, hot while parsing: current block fill and capacity, entries in full blocks.
  private fill = new Int32Array(64);
  private cap = new Int32Array(64);
  private done = new Int32Array(64);
  private written = new Int32Array(64);
  private curT: Uint32Array[] = [];
  private curL: Uint8Array[] = [];
  private curP: Uint32Array[] = [];
  private curR: Float64Array[] = [];
  // Full blocks per signal.
  private fullT: Uint32Array[][] = [];
  private fullV: Array<Array<Uint8Array | Uint32Array | Float64Array>> = [];
  private times = new Float64Array(1024);
  private timeCount = 0;
  /** Index of the current timestamp in `times`, -1 before the first `#`. */
  private current = -1;
  endTick = 0;
  changes = 0;
  date = '';
  version = '';
  timescale: Timescale = { magnitude: 1, unit: 's', seconds: 1 };

  constructor(readonly source: string) {}

  get signalCount(): number {
    return this.sigs.length;
  }

  get currentTick(): number {
    return this.current < 0 ? 0 : this.times[this.current];
  }

  get timeStamps(): number {
    return this.timeCount;
  }

  addScope(name: string, kind: string, parent: number): number {
    const path = parent < 0 ? name : `${this.scopes[parent].path}.${name}`;
    this.scopes.push({ name, kind, parent, path });
    return this.scopes.length - 1;
  }

  /** Storage for a new identifier code. */
  addSignal(kind: SignalKind, width: number): number {
    const k = this.sigs.length;
    this.sigs.push({
      kind,
      width,
      count: 0,
      timeIndex: EMPTY_U32,
      logic: EMPTY_U8,
      planes: EMPTY_U32,
      reals: EMPTY_F64,
      texts: new Map(),
      written: 0,
    });
    this.words.push(kind === 'vector' ? wordsFor(width) : 0);
    this.fill = grownInt32(this.fill, k + 1);
    this.cap = grownInt32(this.cap, k + 1);
    this.done = grownInt32(this.done, k + 1);
    this.written = grownInt32(this.written, k + 1);
    this.curT.push(EMPTY_U32);
    this.curL.push(EMPTY_U8);
    this.curP.push(EMPTY_U32);
    this.curR.push(EMPTY_F64);
    this.fullT.push([]);
    this.fullV.push([]);
    return k;
  }

  /** Kind and width of a signal (its arrays are filled only by finish()). */
  signal(index: number): Signal {
    return this.sigs[index];
  }

  /** Changes stored so far for a signal. */
  countOf(index: number): number {
    return this.done[index] + this.fill[index];
  }

  addNet(net: Net): void {
    this.nets.push(net);
  }

  /** Moves to a timestamp; equal ticks reuse the current slot, earlier ones are the caller's error to report. */
  setTime(tick: number): void {
    if (this.current >= 0 && this.times[this.current] === tick) return;
    if (this.timeCount === this.times.length) {
      const grown = new Float64Array(this.times.length * 2);
      grown.set(this.times);
      this.times = grown;
    }
    this.times[this.timeCount] = tick;
    this.current = this.timeCount++;
    this.endTick = tick;
  }

  /** Retires a signal's full block and starts the next; returns the new fill (0). */
  private nextBlock(k: number): number {
    const old = this.cap[k];
    const kind = this.sigs[k].kind;
    if (old > 0) {
      this.fullT[k].push(this.curT[k]);
      this.fullV[k].push(kind === 'real' ? this.curR[k] : kind === 'vector' ? this.curP[k] : this.curL[k]);
      this.done[k] += old;
    }
    // Wide vectors get fewer entries per block so a block stays under about 1 MiB.
    const limit = kind === 'vector' ? Math.max(1, Math.floor((1 << 18) / (2 * this.words[k]))) : BLOCK_MAX;
    const size = Math.min(limit, BLOCK_MAX, Math.max(BLOCK_MIN, old * 2));
    this.curT[k] = new Uint32Array(size);
    if (kind === 'real') this.curR[k] = new Float64Array(size);
    else if (kind === 'vector') this.curP[k] = new Uint32Array(size * 2 * this.words[k]);
    else this.curL[k] = new Uint8Array(size);
    this.cap[k] = size;
    this.fill[k] = 0;
    return 0;
  }

  /** Claims the next change slot of a signal at the current time; returns its place in the current block. */
  private slot(k: number): number {
    let f = this.fill[k];
    if (f === this.cap[k]) f = this.nextBlock(k);
    if (this.current < 0) this.setTime(0);
    this.curT[k][f] = this.current;
    this.fill[k] = f + 1;
    return f;
  }

  /** `counted` is false for values the parser adds itself (x at $dumpoff). */
  pushLogic(index: number, code: number, counted = true): void {
    let f = this.fill[index];
    if (f === this.cap[index]) f = this.nextBlock(index);
    if (this.current < 0) this.setTime(0);
    this.curT[index][f] = this.current;
    this.curL[index][f] = code;
    this.fill[index] = f + 1;
    if (counted) {
      this.written[index]++;
      this.changes++;
    }
  }

  pushReal(index: number, value: number, counted = true): void {
    const f = this.slot(index);
    this.curR[index][f] = value;
    if (counted) {
      this.written[index]++;
      this.changes++;
    }
  }

  /**
   * Vector change from its planes (each `words` long, bit 0 of word 0 = rightmost bit).
   * `text` is set only for values holding states beyond 0/1/x/z.
   */
  pushVector(index: number, value: Uint32Array, unknown: Uint32Array, text: string | null, counted = true): void {
    const f = this.slot(index);
    const words = this.words[index];
    const planes = this.curP[index];
    const base = f * 2 * words;
    for (let w = 0; w < words; w++) {
      planes[base + w] = value[w];
      planes[base + words + w] = unknown[w];
    }
    if (text !== null) this.sigs[index].texts.set(this.countOf(index) - 1, text);
    if (counted) {
      this.written[index]++;
      this.changes++;
    }
  }

  /** Vector of at most 32 bits, given as its two plane words. */
  pushVectorWord(index: number, value: number, unknown: number, text: string | null): void {
    const f = this.slot(index);
    const planes = this.curP[index];
    planes[2 * f] = value;
    planes[2 * f + 1] = unknown;
    if (text !== null) this.sigs[index].texts.set(this.countOf(index) - 1, text);
    this.written[index]++;
    this.changes++;
  }

  /** String value (kind 'string'), kept as written. */
  pushText(index: number, text: string, counted = true): void {
    this.slot(index);
    this.sigs[index].texts.set(this.countOf(index) - 1, text);
    if (counted) {
      this.written[index]++;
      this.changes++;
    }
  }

  /** Vector of all-x (for $dumpoff). */
  pushVectorX(index: number, counted = false): void {
    const words = this.words[index];
    this.pushVector(index, new Uint32Array(words), new Uint32Array(words).fill(0xffffffff), null, counted);
  }

  /** Removes every change at the current timestamp (used when a dump is cut off mid-step). */
  dropCurrentStep(): void {
    if (this.current < 0) return;
    const t = this.current;
    for (let k = 0; k < this.sigs.length; k++) {
      for (;;) {
        if (this.fill[k] === 0) {
          const prev = this.fullT[k].pop();
          if (!prev) break;
          const v = this.fullV[k].pop()!;
          const kind = this.sigs[k].kind;
          this.curT[k] = prev;
          if (kind === 'real') this.curR[k] = v as Float64Array;
          else if (kind === 'vector') this.curP[k] = v as Uint32Array;
          else this.curL[k] = v as Uint8Array;
          this.cap[k] = prev.length;
          this.fill[k] = prev.length;
          this.done[k] -= prev.length;
        }
        const f = this.fill[k];
        if (this.curT[k][f - 1] !== t) break;
        this.fill[k] = f - 1;
        this.sigs[k].texts.delete(this.countOf(k));
        if (this.written[k] > 0) this.written[k]--;
        this.changes--;
      }
    }
  }

  warn(line: number, offset: number, message: string): void {
    if (this.warnings.length < 1000) this.warnings.push({ line, offset, message });
  }

  finish(bytes: number, truncated: boolean): Dump {
    for (let k = 0; k < this.sigs.length; k++) {
      const s = this.sigs[k];
      const n = this.countOf(k);
      const f = this.fill[k];
      s.count = n;
      s.written = this.written[k];
      // Each joined array owns an exactly sized buffer, so it can be transferred to another thread.
      s.timeIndex = joinBlocks(this.fullT[k], this.curT[k], f, new Uint32Array(n));
      if (s.kind === 'real') s.reals = joinBlocks(this.fullV[k] as Float64Array[], this.curR[k], f, new Float64Array(n));
      else if (s.kind === 'vector') {
        const stride = 2 * this.words[k];
        s.planes = joinBlocks(this.fullV[k] as Uint32Array[], this.curP[k], f * stride, new Uint32Array(n * stride));
      } else if (s.kind === 'logic' || s.kind === 'event') s.logic = joinBlocks(this.fullV[k] as Uint8Array[], this.curL[k], f, new Uint8Array(n));
      this.fullT[k] = [];
      this.fullV[k] = [];
      this.curT[k] = EMPTY_U32;
      this.curL[k] = EMPTY_U8;
      this.curP[k] = EMPTY_U32;
      this.curR[k] = EMPTY_F64;
    }
    return {
      source: this.source,
      date: this.date,
      version: this.version,
      timescale: this.timescale,
      times: this.times.slice(0, this.timeCount),
      endTick: this.endTick,
      scopes: this.scopes,
      nets: this.nets,
      signals: this.sigs,
      dumpOff: this.dumpOff,
      changes: this.changes,
      bytes,
      truncated,
      warnings: this.warnings,
    };
  }
}
