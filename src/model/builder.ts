// Grows a Dump change by change. The parser feeds it; tests use it to build small dumps by hand.
// Per-signal arrays grow by 1.5× and are trimmed once at finish, which keeps the peak near
// 1.5 × (4-byte time index + 1-byte code) per 1-bit change.

import {
  type Dump,
  type DumpWarning,
  type Net,
  type Scope,
  type Signal,
  type SignalKind,
  type Timescale,
  wordsFor,
} from './dump';

const FIRST_CAPACITY = 16;

interface Growing {
  sig: Signal;
  cap: number;
  words: number;
}

function grownCapacity(cap: number, need: number): number {
  let next = cap;
  while (next < need) next = Math.max(FIRST_CAPACITY, Math.ceil(next * 1.5));
  return next;
}

function copyInto<T extends Uint8Array | Uint32Array | Float64Array>(old: T, make: (n: number) => T, n: number): T {
  const fresh = make(n);
  fresh.set(old.subarray(0, Math.min(old.length, n)));
  return fresh;
}

export class DumpBuilder {
  readonly scopes: Scope[] = [];
  readonly nets: Net[] = [];
  readonly warnings: DumpWarning[] = [];
  readonly dumpOff: Array<[number, number]> = [];
  private growing: Growing[] = [];
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
    return this.growing.length;
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
    const words = kind === 'vector' ? wordsFor(width) : 0;
    const sig: Signal = {
      kind,
      width,
      count: 0,
      timeIndex: new Uint32Array(0),
      logic: new Uint8Array(0),
      planes: new Uint32Array(0),
      reals: new Float64Array(0),
      texts: new Map(),
      written: 0,
    };
    this.growing.push({ sig, cap: 0, words });
    return this.growing.length - 1;
  }

  signal(index: number): Signal {
    return this.growing[index].sig;
  }

  addNet(net: Net): void {
    this.nets.push(net);
  }

  /** Moves to a timestamp; equal ticks reuse the current slot, earlier ones are the caller's error to report. */
  setTime(tick: number): void {
    if (this.current >= 0 && this.times[this.current] === tick) return;
    if (this.timeCount === this.times.length) this.times = copyInto(this.times, (n) => new Float64Array(n), this.times.length * 2);
    this.times[this.timeCount] = tick;
    this.current = this.timeCount++;
    this.endTick = tick;
  }

  private grow(g: Growing): void {
    const sig = g.sig;
    const cap = grownCapacity(g.cap, sig.count + 1);
    sig.timeIndex = copyInto(sig.timeIndex, (n) => new Uint32Array(n), cap);
    if (sig.kind === 'logic' || sig.kind === 'event') sig.logic = copyInto(sig.logic, (n) => new Uint8Array(n), cap);
    else if (sig.kind === 'vector') sig.planes = copyInto(sig.planes, (n) => new Uint32Array(n), cap * 2 * g.words);
    else if (sig.kind === 'real') sig.reals = copyInto(sig.reals, (n) => new Float64Array(n), cap);
    g.cap = cap;
  }

  /** Claims the next change slot of a signal at the current time; returns its index. */
  private slot(g: Growing): number {
    const sig = g.sig;
    const i = sig.count;
    if (i === g.cap) this.grow(g);
    if (this.current < 0) this.setTime(0);
    sig.timeIndex[i] = this.current;
    sig.count = i + 1;
    return i;
  }

  /** `counted` is false for values the parser adds itself (x at $dumpoff). */
  pushLogic(index: number, code: number, counted = true): void {
    const g = this.growing[index];
    const i = this.slot(g);
    g.sig.logic[i] = code;
    if (counted) {
      g.sig.written++;
      this.changes++;
    }
  }

  pushReal(index: number, value: number, counted = true): void {
    const g = this.growing[index];
    const i = this.slot(g);
    g.sig.reals[i] = value;
    if (counted) {
      g.sig.written++;
      this.changes++;
    }
  }

  /**
   * Vector change from its planes (each `words` long, bit 0 of word 0 = rightmost bit).
   * `text` is set only for values holding states beyond 0/1/x/z, or for string signals.
   */
  pushVector(index: number, value: Uint32Array, unknown: Uint32Array, text: string | null, counted = true): void {
    const g = this.growing[index];
    const i = this.slot(g);
    const words = g.words;
    const planes = g.sig.planes;
    const base = i * 2 * words;
    for (let w = 0; w < words; w++) {
      planes[base + w] = value[w];
      planes[base + words + w] = unknown[w];
    }
    if (text !== null) g.sig.texts.set(i, text);
    if (counted) {
      g.sig.written++;
      this.changes++;
    }
  }

  /** Vector of at most 32 bits, given as its two plane words. */
  pushVectorWord(index: number, value: number, unknown: number, text: string | null): void {
    const g = this.growing[index];
    const i = this.slot(g);
    g.sig.planes[2 * i] = value;
    g.sig.planes[2 * i + 1] = unknown;
    if (text !== null) g.sig.texts.set(i, text);
    g.sig.written++;
    this.changes++;
  }

  pushText(index: number, text: string, counted = true): void {
    const g = this.growing[index];
    const i = this.slot(g);
    g.sig.texts.set(i, text);
    if (counted) {
      g.sig.written++;
      this.changes++;
    }
  }

  /** Vector of all-x (for $dumpoff). */
  pushVectorX(index: number, counted = false): void {
    const g = this.growing[index];
    const zeros = new Uint32Array(g.words);
    const ones = new Uint32Array(g.words).fill(0xffffffff);
    this.pushVector(index, zeros, ones, null, counted);
  }

  /** Removes every change at the current timestamp and the timestamp itself (used when a dump is cut off mid-step). */
  dropCurrentStep(): void {
    if (this.current < 0) return;
    const t = this.current;
    for (const g of this.growing) {
      const sig = g.sig;
      while (sig.count > 0 && sig.timeIndex[sig.count - 1] === t) {
        sig.count--;
        sig.texts.delete(sig.count);
        sig.written--;
        this.changes--;
      }
    }
  }

  warn(line: number, offset: number, message: string): void {
    if (this.warnings.length < 1000) this.warnings.push({ line, offset, message });
  }

  finish(bytes: number, truncated: boolean): Dump {
    for (const g of this.growing) {
      const s = g.sig;
      const n = s.count;
      // slice() gives each array a buffer of its own, exactly sized, so it can be transferred.
      s.timeIndex = s.timeIndex.slice(0, n);
      if (s.kind === 'logic' || s.kind === 'event') s.logic = s.logic.slice(0, n);
      else if (s.kind === 'vector') s.planes = s.planes.slice(0, n * 2 * g.words);
      else if (s.kind === 'real') s.reals = s.reals.slice(0, n);
      g.cap = n;
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
      signals: this.growing.map((g) => g.sig),
      dumpOff: this.dumpOff,
      changes: this.changes,
      bytes,
      truncated,
      warnings: this.warnings,
    };
  }
}
