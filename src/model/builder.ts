// Grows a Dump change by change. The parser feeds it; tests use it to build small dumps by hand.
//
// While parsing, every change is appended to one change log in file order: the signal index
// (16 bits while there are fewer than 65,536 signals, else 32) and, for 1-bit signals, the state
// code; vector planes and reals go to logs of their own. Appending is sequential, so it costs
// about what reading the bytes costs, whatever the number of signals. At finish() the counts are
// known, so each signal's arrays are allocated at their exact size and the log is scattered into
// them in one pass. The peak is the log (3 bytes per 1-bit change) plus the final arrays (5 bytes).

import type { Dump, DumpWarning, Net, Scope, Signal, SignalKind, Timescale } from './dump';
import { wordsFor } from './dump';

const SLAB = 1 << 20;
const FIRST_SLAB = 1 << 12;
const TIME_SHIFT = 14;
const TIME_SLAB = 1 << TIME_SHIFT;
const TIME_MASK = TIME_SLAB - 1;
const EMPTY_U8 = new Uint8Array(0);
const EMPTY_U16 = new Uint16Array(0);
const EMPTY_U32 = new Uint32Array(0);
const EMPTY_F64 = new Float64Array(0);

const KIND_LOGIC = 0;
const KIND_VECTOR = 1;
const KIND_REAL = 2;
const KIND_TEXT = 3;

function kindCode(kind: SignalKind): number {
  if (kind === 'vector') return KIND_VECTOR;
  if (kind === 'real') return KIND_REAL;
  if (kind === 'string') return KIND_TEXT;
  return KIND_LOGIC;
}

function grown<T extends Int32Array | Uint8Array | Float64Array | Uint32Array>(a: T, need: number, make: (n: number) => T): T {
  if (need <= a.length) return a;
  const b = make(Math.max(need, a.length * 2));
  b.set(a);
  return b;
}

export class DumpBuilder {
  readonly scopes: Scope[] = [];
  readonly nets: Net[] = [];
  readonly warnings: DumpWarning[] = [];
  readonly dumpOff: Array<[number, number]> = [];
  private sigs: Signal[] = [];
  private kinds = new Uint8Array(64);
  private words = new Int32Array(64);
  private counts = new Int32Array(64);
  private uncounted = new Int32Array(64);

  // Change log: current slab (hot) and the full ones. A slab is 16-bit when it was started while
  // fewer than 65,536 signals existed, so every index it holds fits.
  private logFill = 0;
  private logLen = 0;
  private wideSlab = false;
  private sig16: Uint16Array = EMPTY_U16;
  private sig32: Uint32Array = EMPTY_U32;
  private codes: Uint8Array = EMPTY_U8;
  private fullSigs: Array<Uint16Array | Uint32Array> = [];
  private fullCodes: Uint8Array[] = [];
  // Vector planes and reals, in log order.
  private planeFill = 0;
  private planeSlab: Uint32Array = EMPTY_U32;
  private planeFull: Uint32Array[] = [];
  private planeUsed: number[] = [];
  private realFill = 0;
  private realSlab: Float64Array = EMPTY_F64;
  private realFull: Float64Array[] = [];
  /** Texts (strings, vectors with states beyond 0/1/x/z) by log position. */
  private texts = new Map<number, string>();

  // Timestamps in slabs too (no copies while growing): the tick of each, and the log position
  // where its changes begin.
  private timeSlabs: Float64Array[] = [];
  private stepSlabs: Uint32Array[] = [];
  private lastTick = 0;
  private timeCount = 0;
  /** Index of the current timestamp in `times`, -1 before the first `#`. */
  private current = -1;
  endTick = 0;
  date = '';
  version = '';
  timescale: Timescale = { magnitude: 1, unit: 's', seconds: 1 };

  /**
   * `shared`: put the finished arrays on SharedArrayBuffers (where the page is cross-origin
   * isolated), so the page and a measuring worker read one copy.
   */
  constructor(
    readonly source: string,
    private readonly options: { shared?: boolean } = {},
  ) {}

  get signalCount(): number {
    return this.sigs.length;
  }

  get currentTick(): number {
    return this.current < 0 ? 0 : this.lastTick;
  }

  /** Changes written in the file so far (each once, whatever the aliases). */
  get changes(): number {
    let off = 0;
    for (let k = 0; k < this.sigs.length; k++) off += this.uncounted[k];
    return this.logLen - off;
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
    this.kinds = grown(this.kinds, k + 1, (n) => new Uint8Array(n));
    this.words = grown(this.words, k + 1, (n) => new Int32Array(n));
    this.counts = grown(this.counts, k + 1, (n) => new Int32Array(n));
    this.uncounted = grown(this.uncounted, k + 1, (n) => new Int32Array(n));
    this.kinds[k] = kindCode(kind);
    this.words[k] = kind === 'vector' ? wordsFor(width) : 0;
    return k;
  }

  /** Kind and width of a signal (its arrays are filled only by finish()). */
  signal(index: number): Signal {
    return this.sigs[index];
  }

  /** Changes stored so far for a signal. */
  countOf(index: number): number {
    return this.counts[index];
  }

  addNet(net: Net): void {
    this.nets.push(net);
  }

  /** Moves to a timestamp; equal ticks reuse the current slot, earlier ones are the caller's error to report. */
  setTime(tick: number): void {
    if (this.current >= 0 && this.lastTick === tick) return;
    const slot = this.timeCount & TIME_MASK;
    if (slot === 0) {
      this.timeSlabs.push(new Float64Array(TIME_SLAB));
      this.stepSlabs.push(new Uint32Array(TIME_SLAB));
    }
    if (this.logLen > 0xffffffff) throw new RangeError('more than 4,294,967,295 changes in one dump');
    this.timeSlabs[this.timeSlabs.length - 1][slot] = tick;
    this.stepSlabs[this.stepSlabs.length - 1][slot] = this.logLen;
    this.lastTick = tick;
    this.current = this.timeCount++;
    this.endTick = tick;
  }

  private nextSlab(): number {
    const len = this.codes.length;
    if (len > 0 && len < SLAB) {
      // The first slab starts small (small dumps stay small) and doubles until full size.
      const size = Math.min(SLAB, len * 4);
      const codes = new Uint8Array(size);
      codes.set(this.codes);
      this.codes = codes;
      if (this.wideSlab) this.sig32 = grown(this.sig32, size, (n) => new Uint32Array(n));
      else {
        const sigs = new Uint16Array(size);
        sigs.set(this.sig16);
        this.sig16 = sigs;
      }
      return len;
    }
    if (len > 0) {
      this.fullSigs.push(this.wideSlab ? this.sig32 : this.sig16);
      this.fullCodes.push(this.codes);
    }
    const size = len === 0 ? FIRST_SLAB : SLAB;
    this.wideSlab = this.sigs.length > 0xffff;
    if (this.wideSlab) this.sig32 = new Uint32Array(size);
    else this.sig16 = new Uint16Array(size);
    this.codes = new Uint8Array(size);
    this.logFill = 0;
    return 0;
  }

  /** Appends a log entry for signal k; returns its place in the current slab. */
  private append(k: number, counted: boolean): number {
    if (this.current < 0) this.setTime(0);
    let f = this.logFill;
    if (f === this.codes.length) f = this.nextSlab();
    if (this.wideSlab) this.sig32[f] = k;
    else this.sig16[f] = k;
    this.logFill = f + 1;
    this.logLen++;
    this.counts[k]++;
    if (!counted) this.uncounted[k]++;
    return f;
  }

  /** `counted` is false for values the parser adds itself (x at $dumpoff). */
  pushLogic(index: number, code: number, counted = true): void {
    const f = this.append(index, counted);
    this.codes[f] = code;
  }

  pushReal(index: number, value: number, counted = true): void {
    this.append(index, counted);
    if (this.realFill === this.realSlab.length) {
      const len = this.realSlab.length;
      if (len > 0 && len < SLAB >> 2 && this.realFull.length === 0) {
        this.realSlab = grown(this.realSlab, Math.min(SLAB >> 2, len * 4), (n) => new Float64Array(n));
      } else {
        if (len > 0) this.realFull.push(this.realSlab);
        this.realSlab = new Float64Array(len === 0 ? FIRST_SLAB : SLAB >> 2);
        this.realFill = 0;
      }
    }
    this.realSlab[this.realFill++] = value;
  }

  /** Room for n plane words in the current plane slab (a change never straddles two slabs). */
  private planeRoom(n: number): Uint32Array {
    if (this.planeFill + n > this.planeSlab.length) {
      const len = this.planeSlab.length;
      if (len > 0 && len < SLAB && this.planeFull.length === 0) {
        this.planeSlab = grown(this.planeSlab, Math.max(this.planeFill + n, Math.min(SLAB, len * 4)), (m) => new Uint32Array(m));
        return this.planeSlab;
      }
      if (this.planeSlab.length > 0) {
        this.planeFull.push(this.planeSlab);
        this.planeUsed.push(this.planeFill);
      }
      this.planeSlab = new Uint32Array(Math.max(len === 0 ? FIRST_SLAB : SLAB, n));
      this.planeFill = 0;
    }
    return this.planeSlab;
  }

  /**
   * Vector change from its planes (each `words` long, bit 0 of word 0 = rightmost bit).
   * `text` is set only for values holding states beyond 0/1/x/z.
   */
  pushVector(index: number, value: Uint32Array, unknown: Uint32Array, text: string | null, counted = true): void {
    this.append(index, counted);
    const words = this.words[index];
    const slab = this.planeRoom(2 * words);
    const at = this.planeFill;
    for (let w = 0; w < words; w++) {
      slab[at + w] = value[w];
      slab[at + words + w] = unknown[w];
    }
    this.planeFill = at + 2 * words;
    if (text !== null) this.texts.set(this.logLen - 1, text);
  }

  /** Vector of at most 32 bits, given as its two plane words. */
  pushVectorWord(index: number, value: number, unknown: number, text: string | null): void {
    this.append(index, true);
    const slab = this.planeRoom(2);
    const at = this.planeFill;
    slab[at] = value;
    slab[at + 1] = unknown;
    this.planeFill = at + 2;
    if (text !== null) this.texts.set(this.logLen - 1, text);
  }

  /** String value (kind 'string'), kept as written. */
  pushText(index: number, text: string, counted = true): void {
    this.append(index, counted);
    this.texts.set(this.logLen - 1, text);
  }

  /** Vector of all-x (for $dumpoff). */
  pushVectorX(index: number, counted = false): void {
    const words = this.words[index];
    this.pushVector(index, new Uint32Array(words), new Uint32Array(words).fill(0xffffffff), null, counted);
  }

  /** Signal index of log entry `pos`. */
  private logSignal(pos: number): number {
    const k = Math.floor(pos / SLAB);
    const slab = k < this.fullSigs.length ? this.fullSigs[k] : this.wideSlab ? this.sig32 : this.sig16;
    return slab[pos % SLAB];
  }

  /** Log position where timestamp j's changes begin. */
  private stepStartOf(j: number): number {
    return this.stepSlabs[j >>> TIME_SHIFT][j & TIME_MASK];
  }

  /** Removes every change at the current timestamp (used when a dump is cut off mid-step). */
  dropCurrentStep(): void {
    if (this.current < 0) return;
    const from = this.stepStartOf(this.current);
    for (let pos = this.logLen - 1; pos >= from; pos--) {
      const k = this.logSignal(pos);
      this.counts[k]--;
      this.texts.delete(pos);
      const kind = this.kinds[k];
      if (kind === KIND_REAL) this.realFill--;
      else if (kind === KIND_VECTOR) this.planeFill -= 2 * this.words[k];
      if (pos % SLAB === 0 && pos > 0) {
        // Step back into the previous slab.
        this.codes = this.fullCodes.pop()!;
        const prev = this.fullSigs.pop()!;
        this.wideSlab = prev instanceof Uint32Array;
        if (this.wideSlab) this.sig32 = prev as Uint32Array;
        else this.sig16 = prev as Uint16Array;
      }
    }
    // Reals and planes dropped here all lie in their current slabs unless a step spans slabs,
    // which needs more than a million changes in one time step; clamp rather than misplace.
    if (this.realFill < 0) this.realFill = 0;
    if (this.planeFill < 0) this.planeFill = 0;
    this.logLen = from;
    this.logFill = from % SLAB === 0 && from > 0 ? SLAB : from % SLAB;
  }

  warn(line: number, offset: number, message: string): void {
    if (this.warnings.length < 1000) this.warnings.push({ line, offset, message });
  }

  /** Scatters the change log into exact-size per-signal arrays. */
  finish(bytes: number, truncated: boolean): Dump {
    const n = this.sigs.length;
    const kinds = this.kinds;
    const words = this.words;
    // Each kind of array is carved from one buffer, so a finished dump owns four buffers in all
    // (cheap to allocate and to transfer) and each signal's array is an exact-size view.
    let nT = 0;
    let nL = 0;
    let nP = 0;
    let nR = 0;
    for (let k = 0; k < n; k++) {
      const c = this.counts[k];
      nT += c;
      if (kinds[k] === KIND_LOGIC) nL += c;
      else if (kinds[k] === KIND_VECTOR) nP += c * 2 * words[k];
      else if (kinds[k] === KIND_REAL) nR += c;
    }
    const alloc = (bytes: number): ArrayBuffer =>
      this.options.shared && typeof SharedArrayBuffer === 'function' ? (new SharedArrayBuffer(bytes) as unknown as ArrayBuffer) : new ArrayBuffer(bytes);
    const allT = new Uint32Array(alloc(nT * 4));
    const allL = new Uint8Array(alloc(nL));
    const allP = new Uint32Array(alloc(nP * 4));
    const allR = new Float64Array(alloc(nR * 8));
    // Per signal, where its part of each buffer starts; the scatter writes through cursors into
    // the four flat arrays, so no per-signal array object is touched per change.
    const startT = new Int32Array(n);
    const curT = new Int32Array(n);
    const curL = new Int32Array(n);
    const curP = new Int32Array(n);
    const curR = new Int32Array(n);
    const stride = new Int32Array(n);
    for (let k = 0, aT = 0, aL = 0, aP = 0, aR = 0; k < n; k++) {
      const c = this.counts[k];
      startT[k] = curT[k] = aT;
      curL[k] = aL;
      curP[k] = aP;
      curR[k] = aR;
      stride[k] = 2 * words[k];
      aT += c;
      if (kinds[k] === KIND_LOGIC) aL += c;
      else if (kinds[k] === KIND_VECTOR) aP += c * 2 * words[k];
      else if (kinds[k] === KIND_REAL) aR += c;
    }
    const sigSlabs = [...this.fullSigs, this.wideSlab ? this.sig32 : this.sig16];
    const codeSlabs = [...this.fullCodes, this.codes];
    const planeSlabs = [...this.planeFull, this.planeSlab];
    const planeUsed = [...this.planeUsed, this.planeFill];
    const realSlabs = [...this.realFull, this.realSlab];
    this.fullSigs = [];
    this.fullCodes = [];
    let planeSlab = 0;
    let planeAt = 0;
    let realSlab = 0;
    let realAt = 0;
    let step = 0;
    const timeCount = this.timeCount;
    let nextStep = timeCount > 1 ? this.stepStartOf(1) : Number.POSITIVE_INFINITY;
    const texts = this.texts;
    const hasTexts = texts.size > 0;
    const logLen = this.logLen;
    for (let s = 0, pos = 0; s < sigSlabs.length && pos < logLen; s++) {
      const sl = sigSlabs[s];
      const cl = codeSlabs[s];
      const end = Math.min(SLAB, logLen - pos);
      for (let i = 0; i < end; i++, pos++) {
        while (pos >= nextStep) {
          step++;
          nextStep = step + 1 < timeCount ? this.stepStartOf(step + 1) : Number.POSITIVE_INFINITY;
        }
        const k = sl[i];
        const t = curT[k]++;
        allT[t] = step;
        const kind = kinds[k];
        if (kind === KIND_LOGIC) allL[curL[k]++] = cl[i];
        else if (kind === KIND_VECTOR) {
          const w = stride[k];
          if (planeAt + w > planeUsed[planeSlab]) {
            planeSlab++;
            planeAt = 0;
          }
          const src = planeSlabs[planeSlab];
          const at = curP[k];
          for (let q = 0; q < w; q++) allP[at + q] = src[planeAt + q];
          curP[k] = at + w;
          planeAt += w;
        } else if (kind === KIND_REAL) {
          if (realAt === realSlabs[realSlab].length) {
            realSlab++;
            realAt = 0;
          }
          allR[curR[k]++] = realSlabs[realSlab][realAt++];
        }
        if (hasTexts) {
          const text = texts.get(pos);
          if (text !== undefined) this.sigs[k].texts.set(t - startT[k], text);
        }
      }
      // Let the slab go as soon as it is read.
      sigSlabs[s] = EMPTY_U16;
      codeSlabs[s] = EMPTY_U8;
    }
    for (let k = 0, aT = 0, aL = 0, aP = 0, aR = 0; k < n; k++) {
      const sig = this.sigs[k];
      const c = this.counts[k];
      const kind = kinds[k];
      sig.count = c;
      sig.written = c - this.uncounted[k];
      sig.timeIndex = allT.subarray(aT, (aT += c));
      sig.logic = kind === KIND_LOGIC ? allL.subarray(aL, (aL += c)) : EMPTY_U8;
      sig.planes = kind === KIND_VECTOR ? allP.subarray(aP, (aP += c * stride[k])) : EMPTY_U32;
      sig.reals = kind === KIND_REAL ? allR.subarray(aR, (aR += c)) : EMPTY_F64;
    }
    const changes = this.changes;
    const times = new Float64Array(alloc(this.timeCount * 8));
    for (let j = 0, at = 0; at < this.timeCount; j++, at += TIME_SLAB) {
      times.set(this.timeSlabs[j].subarray(0, Math.min(TIME_SLAB, this.timeCount - at)), at);
    }
    this.timeSlabs = [];
    this.stepSlabs = [];
    this.sig16 = EMPTY_U16;
    this.sig32 = EMPTY_U32;
    this.codes = EMPTY_U8;
    this.planeSlab = EMPTY_U32;
    this.realSlab = EMPTY_F64;
    this.planeFull = [];
    this.planeUsed = [];
    this.realFull = [];
    this.texts = new Map();
    return {
      source: this.source,
      date: this.date,
      version: this.version,
      timescale: this.timescale,
      times,
      endTick: this.endTick,
      scopes: this.scopes,
      nets: this.nets,
      signals: this.sigs,
      dumpOff: this.dumpOff,
      changes,
      bytes,
      truncated,
      warnings: this.warnings,
    };
  }
}
