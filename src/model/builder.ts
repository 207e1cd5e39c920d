// Grows a Dump change by change. The parser feeds it; tests use it to build small dumps by hand.
//
// While parsing, every change is appended to one change log in file order: one entry holding the
// signal index and, for 1-bit signals, the state (16 bits while there are fewer than 16,384
// signals, else 32); vector planes and reals go to logs of their own. Appending is sequential, so
// it costs about what reading the bytes costs, whatever the number of signals. At finish() the
// counts are known, so each signal's arrays are allocated at their exact size (layout.ts) and the
// log is scattered into them (values first, then the time index; see scatterInto). Full log slabs
// are parked (see parkedSlabs.ts) and handed back to the system one by one as the scatter reads
// them, so the peak is about the final arrays (5 bytes per 1-bit change), not the log (2 bytes)
// plus them. Where every signal's share of the arrays is smaller than a memory page (many nets,
// few changes each), the scatter touches every page early and the two do coexist.

import type { Dump, DumpWarning, Net, Scope, Signal, SignalKind, Timescale } from './dump';
import { wordsFor } from './dump';
import {
  type DumpArrays,
  type DumpLayout,
  KIND_LOGIC,
  KIND_REAL,
  KIND_TEXT,
  KIND_VECTOR,
  type PartPlacement,
  type PartTotals,
  allocateArrays,
  allocateBuffer,
  planLayout,
} from './layout';
import { ParkedSlabs } from './parkedSlabs';

/** Log slabs hold 2^18 changes (small enough that the hot ones left for the collector cost little); tests pick tiny slabs so that every slab boundary is reached. */
const SLAB_SHIFT = 18;
/** Log entries are 16-bit while there are fewer signals than this (14 bits of index, 2 of state). */
const NARROW_SIGNALS = 1 << 14;
/** Entry state for a Logic code kept in the rare log (z and the VHDL states). */
const RARE = 3;
/** Entry state for a vector value of 0s and 1s only: the log holds its value plane alone. */
const KNOWN = 1;
const EMPTY_U8 = new Uint8Array(0);
const EMPTY_U16 = new Uint16Array(0);
const EMPTY_U32 = new Uint32Array(0);
const EMPTY_F64 = new Float64Array(0);
/** Shared by every signal without text values until assemble() gives it its own; never written. */
const NO_TEXTS: Map<number, string> = new Map();

/** A text value (string, or vector with states beyond 0/1/x/z) and its place in the time index. */
export interface PlacedText {
  signal: number;
  at: number;
  text: string;
}

/** What a Dump takes from the whole read rather than from one part. */
export interface AssembledRest {
  changes: number;
  bytes: number;
  truncated: boolean;
  endTick: number;
  warnings: DumpWarning[];
  dumpOff: Array<[number, number]>;
}

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

  // Change log: the hot slab being written, and the full ones parked. An entry is
  // `signal << 2 | state`, state 0, 1, 2 for the Logic codes 0, 1, x and 3 for any other (its code
  // then waits in `rare`, in log order); vector entries have state KNOWN when the value has no x
  // or z, other entries state 0. A slab is 16-bit
  // while every signal index fits 14 bits; adding signal 16,384 turns the hot slab 32-bit.
  // Every parked slab holds exactly `slab` entries, so log position p lies in parked slab
  // floor(p / slab).
  private logFill = 0;
  private logLen = 0;
  private capacity = 0;
  private wideSlab = false;
  private entries16: Uint16Array = EMPTY_U16;
  private entries32: Uint32Array = EMPTY_U32;
  private parkedEntries = new ParkedSlabs();
  private parkedWide: boolean[] = [];
  private rare: Uint8Array = EMPTY_U8;
  private rareLen = 0;
  // Vector planes and reals, in log order (a change's plane words never straddle two slabs).
  private planeFill = 0;
  private planeSlab: Uint32Array = EMPTY_U32;
  private parkedPlanes = new ParkedSlabs();
  private realFill = 0;
  private realSlab: Float64Array = EMPTY_F64;
  private parkedReals = new ParkedSlabs();
  /** Texts (strings, vectors with states beyond 0/1/x/z) by log position. */
  private texts = new Map<number, string>();

  // Timestamps in slabs too (no copies while growing): the tick of each, and the log position
  // where its changes begin.
  private timeHot: Float64Array = EMPTY_F64;
  private stepHot: Uint32Array = EMPTY_U32;
  private parkedTimes = new ParkedSlabs();
  private parkedSteps = new ParkedSlabs();
  private lastTick = 0;
  private firstTick = 0;
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
    private readonly options: { shared?: boolean; slabShift?: number } = {},
  ) {
    const shift = options.slabShift ?? SLAB_SHIFT;
    this.slab = 2 ** shift;
    this.firstSlab = Math.max(1, Math.min(1 << 12, this.slab >> 2));
    // Plane and real slabs are a quarter and an eighth of a log slab in words, so the hot ones the
    // collector is left with after finish() stay small (each 256 KiB at full size).
    this.planeSlabSize = Math.max(1, this.slab >> 2);
    this.realSlabSize = Math.max(1, this.slab >> 3);
    this.timeShift = Math.max(1, shift - 6);
    this.timeSlab = 2 ** this.timeShift;
    this.timeMask = this.timeSlab - 1;
  }

  // Slab sizes (entries): the change log, its first slab (small dumps stay small), reals, timestamps.
  private readonly slab: number;
  private readonly firstSlab: number;
  private readonly planeSlabSize: number;
  private readonly realSlabSize: number;
  private readonly timeShift: number;
  private readonly timeSlab: number;
  private readonly timeMask: number;

  get signalCount(): number {
    return this.sigs.length;
  }

  /** Per signal, its kind as the change log stores it (layout.ts KIND_*). */
  get kindCodes(): Uint8Array {
    return this.kinds;
  }

  /** Per signal, 32-bit words per plane of a vector (0 for other kinds). */
  get planeWords(): Int32Array {
    return this.words;
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
      texts: NO_TEXTS,
      written: 0,
    });
    this.kinds = grown(this.kinds, k + 1, (n) => new Uint8Array(n));
    this.words = grown(this.words, k + 1, (n) => new Int32Array(n));
    this.counts = grown(this.counts, k + 1, (n) => new Int32Array(n));
    this.uncounted = grown(this.uncounted, k + 1, (n) => new Int32Array(n));
    this.kinds[k] = kindCode(kind);
    this.words[k] = kind === 'vector' ? wordsFor(width) : 0;
    if (k >= NARROW_SIGNALS && !this.wideSlab && this.capacity > 0) {
      // Its index does not fit a 16-bit entry: the hot slab turns 32-bit where it stands.
      this.entries32 = Uint32Array.from(this.entries16);
      this.entries16 = EMPTY_U16;
      this.wideSlab = true;
    }
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
    const slot = this.timeCount & this.timeMask;
    if (slot === 0) {
      if (this.timeCount === 0) {
        this.timeHot = new Float64Array(this.timeSlab);
        this.stepHot = new Uint32Array(this.timeSlab);
      } else {
        this.parkedTimes.park(this.timeHot, this.timeSlab * 8);
        this.parkedSteps.park(this.stepHot, this.timeSlab * 4);
      }
    }
    if (this.logLen > 0xffffffff) throw new RangeError('more than 4,294,967,295 changes in one dump');
    this.timeHot[slot] = tick;
    this.stepHot[slot] = this.logLen;
    if (this.timeCount === 0) this.firstTick = tick;
    this.lastTick = tick;
    this.current = this.timeCount++;
    this.endTick = tick;
  }

  private nextSlab(): number {
    const len = this.capacity;
    if (len > 0 && len < this.slab) {
      // The first slab starts small (small dumps stay small) and grows until full size.
      const size = Math.min(this.slab, len * 4);
      if (this.wideSlab) this.entries32 = grown(this.entries32, size, (n) => new Uint32Array(n));
      else {
        const entries = new Uint16Array(size);
        entries.set(this.entries16);
        this.entries16 = entries;
      }
      this.capacity = size;
      return len;
    }
    const wide = this.sigs.length > NARROW_SIGNALS;
    if (len === 0) {
      if (wide) this.entries32 = new Uint32Array(this.firstSlab);
      else this.entries16 = new Uint16Array(this.firstSlab);
      this.capacity = this.firstSlab;
    } else {
      // Park the full slab and write the next one into the same (already resident) array.
      this.parkedEntries.park(this.wideSlab ? this.entries32 : this.entries16, this.slab * (this.wideSlab ? 4 : 2));
      this.parkedWide.push(this.wideSlab);
      if (wide && this.entries32.length < this.slab) this.entries32 = new Uint32Array(this.slab);
      if (!wide && this.entries16.length < this.slab) this.entries16 = new Uint16Array(this.slab);
      this.capacity = this.slab;
    }
    this.wideSlab = wide;
    this.logFill = 0;
    return 0;
  }

  /** Appends the log entry `k << 2 | state` for signal k. */
  private append(k: number, state: number, counted: boolean): void {
    if (this.current < 0) this.setTime(0);
    let f = this.logFill;
    if (f === this.capacity) f = this.nextSlab();
    if (this.wideSlab) this.entries32[f] = (k << 2) | state;
    else this.entries16[f] = (k << 2) | state;
    this.logFill = f + 1;
    this.logLen++;
    this.counts[k]++;
    if (!counted) this.uncounted[k]++;
  }

  /** `counted` is false for values the parser adds itself (x at $dumpoff). */
  pushLogic(index: number, code: number, counted = true): void {
    if (code < RARE) {
      this.append(index, code, counted);
      return;
    }
    this.append(index, RARE, counted);
    if (this.rareLen === this.rare.length) this.rare = grown(this.rare, Math.max(64, this.rareLen * 2), (n) => new Uint8Array(n));
    this.rare[this.rareLen++] = code;
  }

  pushReal(index: number, value: number, counted = true): void {
    this.append(index, 0, counted);
    if (this.realFill === this.realSlab.length) {
      const len = this.realSlab.length;
      if (len > 0 && len < this.realSlabSize) this.realSlab = grown(this.realSlab, Math.min(this.realSlabSize, len * 4), (n) => new Float64Array(n));
      else {
        if (len > 0) this.parkedReals.park(this.realSlab, this.realFill * 8);
        else this.realSlab = new Float64Array(Math.min(this.firstSlab, this.realSlabSize));
        this.realFill = 0;
      }
    }
    this.realSlab[this.realFill++] = value;
  }

  /** Room for n plane words in the hot plane slab (a change never straddles two slabs). */
  private planeRoom(n: number): Uint32Array {
    if (this.planeFill + n > this.planeSlab.length) {
      const len = this.planeSlab.length;
      if (len > 0 && len < this.planeSlabSize && this.parkedPlanes.count === 0) {
        this.planeSlab = grown(this.planeSlab, Math.max(this.planeFill + n, Math.min(this.planeSlabSize, len * 4)), (m) => new Uint32Array(m));
        return this.planeSlab;
      }
      if (len > 0) this.parkedPlanes.park(this.planeSlab, this.planeFill * 4);
      if (len < n || len === 0) this.planeSlab = new Uint32Array(Math.max(len === 0 ? Math.min(this.firstSlab, this.planeSlabSize) : this.planeSlabSize, n));
      this.planeFill = 0;
    }
    return this.planeSlab;
  }

  /**
   * Vector change from its planes (each `words` long, bit 0 of word 0 = rightmost bit).
   * `text` is set only for values holding states beyond 0/1/x/z.
   */
  pushVector(index: number, value: Uint32Array, unknown: Uint32Array, text: string | null, counted = true): void {
    const words = this.words[index];
    let known = true;
    for (let w = 0; w < words && known; w++) known = unknown[w] === 0;
    // A value of 0s and 1s only logs its value plane (entry state KNOWN); the finished arrays
    // start zeroed, so its unknown plane needs no writing.
    this.append(index, known ? KNOWN : 0, counted);
    const n = known ? words : 2 * words;
    const slab = this.planeRoom(n);
    const at = this.planeFill;
    for (let w = 0; w < words; w++) slab[at + w] = value[w];
    if (!known) for (let w = 0; w < words; w++) slab[at + words + w] = unknown[w];
    this.planeFill = at + n;
    if (text !== null) this.texts.set(this.logLen - 1, text);
  }

  /** Vector of at most 32 bits, given as its two plane words. */
  pushVectorWord(index: number, value: number, unknown: number, text: string | null): void {
    const known = unknown === 0;
    this.append(index, known ? KNOWN : 0, true);
    const slab = this.planeRoom(known ? 1 : 2);
    const at = this.planeFill;
    slab[at] = value;
    if (!known) slab[at + 1] = unknown;
    this.planeFill = at + (known ? 1 : 2);
    if (text !== null) this.texts.set(this.logLen - 1, text);
  }

  /** String value (kind 'string'), kept as written. */
  pushText(index: number, text: string, counted = true): void {
    this.append(index, 0, counted);
    this.texts.set(this.logLen - 1, text);
  }

  /** Vector of all-x (for $dumpoff). */
  pushVectorX(index: number, counted = false): void {
    const words = this.words[index];
    this.pushVector(index, new Uint32Array(words), new Uint32Array(words).fill(0xffffffff), null, counted);
  }

  /** Log position of the hot slab's first entry. */
  private get hotStart(): number {
    return this.parkedEntries.count * this.slab;
  }

  /** Log position where the current timestamp's changes begin (it is always in the hot slab). */
  private get currentStepStart(): number {
    return this.stepHot[this.current & this.timeMask];
  }

  /** Removes every change at the current timestamp (used when a dump is cut off mid-step). */
  dropCurrentStep(): void {
    if (this.current < 0) return;
    const from = this.currentStepStart;
    for (let pos = this.logLen - 1; pos >= from; pos--) {
      if (pos < this.hotStart) {
        // Step back into the previous slab.
        const wide = this.parkedWide.pop()!;
        if (wide && this.entries32.length < this.slab) this.entries32 = new Uint32Array(this.slab);
        if (!wide && this.entries16.length < this.slab) this.entries16 = new Uint16Array(this.slab);
        this.parkedEntries.popInto(wide ? this.entries32 : this.entries16);
        this.wideSlab = wide;
        this.capacity = this.slab;
      }
      const at = pos - this.hotStart;
      const entry = this.wideSlab ? this.entries32[at] : this.entries16[at];
      const k = entry >>> 2;
      if ((entry & 3) === RARE && this.kinds[k] === KIND_LOGIC) this.rareLen--;
      this.counts[k]--;
      this.texts.delete(pos);
      const kind = this.kinds[k];
      if (kind === KIND_REAL) this.realFill--;
      else if (kind === KIND_VECTOR) this.planeFill -= ((entry & 3) === KNOWN ? 1 : 2) * this.words[k];
    }
    // Reals and planes dropped here all lie in their hot slabs unless a step spans slabs,
    // which needs more than a million changes in one time step; clamp rather than misplace.
    if (this.realFill < 0) this.realFill = 0;
    if (this.planeFill < 0) this.planeFill = 0;
    this.logLen = from;
    this.logFill = from - this.hotStart;
  }

  warn(line: number, offset: number, message: string): void {
    if (this.warnings.length < 1000) this.warnings.push({ line, offset, message });
  }

  /** Totals of everything pushed so far (see layout.ts). */
  partTotals(): PartTotals {
    const n = this.sigs.length;
    return {
      counts: this.counts.slice(0, n),
      uncounted: this.uncounted.slice(0, n),
      timeCount: this.timeCount,
      firstTick: this.firstTick,
      lastTick: this.timeCount > 0 ? this.lastTick : 0,
    };
  }

  /** Scatters the change log into exact-size per-signal arrays: the dump read in one piece. */
  finish(bytes: number, truncated: boolean): Dump {
    const n = this.sigs.length;
    const layout = planLayout(this.kinds, this.words, n, [this.partTotals()]);
    // Timestamps first: their log goes before the scatter touches the arrays' pages.
    const times = new Float64Array(allocateBuffer(layout.timeCount * 8, this.options.shared === true));
    this.timesInto(times, 0, 0);
    const arrays = allocateArrays(layout, this.options.shared === true);
    const texts = this.scatterInto(arrays, layout.parts[0]);
    return this.assemble(layout, arrays, texts, times, {
      changes: layout.regions.written.reduce((a, b) => a + b, 0),
      bytes,
      truncated,
      endTick: this.endTick,
      warnings: this.warnings,
      dumpOff: this.dumpOff,
    });
  }

  /**
   * Places this part's changes (see layout.ts) and lets the change log go. Returns the text
   * values with their places in `arrays.timeIndex`.
   *
   * Two sweeps over the entries: the first writes values (1-bit codes, vector planes, reals) and
   * lets the plane and real logs go as it reads them; the second writes the time index and lets
   * the entries go slab by slab. Each loop stays small (measured a little faster than one loop
   * doing both); the peak is the same, since the arrays and whatever is still logged coexist.
   */
  scatterInto(arrays: DumpArrays, place: PartPlacement): PlacedText[] {
    // The hot slabs are parked too, so that every slab is read the same way: copied into the hot
    // arrays (already resident, and as long as any parked slab).
    if (this.logFill > 0) {
      this.parkedEntries.park(this.wideSlab ? this.entries32 : this.entries16, this.logFill * (this.wideSlab ? 4 : 2));
      this.parkedWide.push(this.wideSlab);
    }
    if (this.planeFill > 0) this.parkedPlanes.park(this.planeSlab, this.planeFill * 4);
    if (this.realFill > 0) this.parkedReals.park(this.realSlab, this.realFill * 8);
    const longest = Math.max(this.entries16.length, this.entries32.length);
    const scratch16 = this.entries16.length >= longest || !this.parkedWide.includes(false) ? this.entries16 : new Uint16Array(longest);
    const scratch32 = this.entries32.length >= longest || !this.parkedWide.includes(true) ? this.entries32 : new Uint32Array(longest);
    const placed = this.scatterValues(arrays, place, scratch16, scratch32);
    this.scatterTimes(arrays.timeIndex, place, scratch16, scratch32);
    this.parkedEntries.clear();
    this.parkedPlanes.clear();
    this.parkedReals.clear();
    this.parkedWide = [];
    this.parkedSteps.clear();
    this.stepHot = EMPTY_U32;
    this.entries16 = EMPTY_U16;
    this.entries32 = EMPTY_U32;
    this.rare = EMPTY_U8;
    this.rareLen = 0;
    this.planeSlab = EMPTY_U32;
    this.realSlab = EMPTY_F64;
    this.texts = new Map();
    return placed;
  }

  /** First sweep: every change's value into its signal's arrays; the entries stay parked. */
  private scatterValues(arrays: DumpArrays, place: PartPlacement, scratch16: Uint16Array, scratch32: Uint32Array): PlacedText[] {
    const n = this.sigs.length;
    const kinds = this.kinds;
    const allL = arrays.logic;
    const allP = arrays.planes;
    const allR = arrays.reals;
    const { startT, startL, startP, startR } = place;
    const stride = new Int32Array(n);
    for (let k = 0; k < n; k++) stride[k] = 2 * this.words[k];
    // The j-th change of signal k: its place in every array follows from j.
    const seen = new Int32Array(n);
    const rare = this.rare;
    let rareAt = 0;
    // No closures below: variables a closure writes live on the heap, not in registers, and
    // this loop runs once per change.
    const planes = this.planeSlab;
    let planeSource = 0;
    let planeUsed = 0;
    let planeAt = 0;
    const reals = this.realSlab;
    let realSource = 0;
    let realUsed = 0;
    let realAt = 0;
    const texts = this.texts;
    const hasTexts = texts.size > 0;
    const placed: PlacedText[] = [];
    const logLen = this.logLen;
    const slabs = this.parkedEntries.count;
    for (let s = 0, pos = 0; s < slabs && pos < logLen; s++) {
      const sl = this.parkedWide[s] ? scratch32 : scratch16;
      this.parkedEntries.copyInto(s, sl);
      const len = Math.min(this.slab, logLen - pos);
      for (let i = 0; i < len; i++) {
        const entry = sl[i];
        const k = entry >>> 2;
        const j = seen[k]++;
        const kind = kinds[k];
        if (kind === KIND_LOGIC) {
          const state = entry & 3;
          allL[startL[k] + j] = state === RARE ? rare[rareAt++] : state;
        } else if (kind === KIND_VECTOR) {
          const w = stride[k];
          const logged = (entry & 3) === KNOWN ? w >> 1 : w;
          if (planeAt + logged > planeUsed) {
            planeUsed = this.parkedPlanes.takeInto(planeSource++, planes) >> 2;
            planeAt = 0;
          }
          const at = startP[k] + j * w;
          for (let q = 0; q < logged; q++) allP[at + q] = planes[planeAt + q];
          planeAt += logged;
        } else if (kind === KIND_REAL) {
          if (realAt === realUsed) {
            realUsed = this.parkedReals.takeInto(realSource++, reals) >> 3;
            realAt = 0;
          }
          allR[startR[k] + j] = reals[realAt++];
        }
        if (hasTexts) {
          const text = texts.get(pos + i);
          if (text !== undefined) placed.push({ signal: k, at: startT[k] + j, text });
        }
      }
      pos += len;
    }
    return placed;
  }

  /** Second sweep: every change's timestamp into the time index; the entries go slab by slab. */
  private scatterTimes(allT: Uint32Array, place: PartPlacement, scratch16: Uint16Array, scratch32: Uint32Array): void {
    const curT = place.startT.slice();
    const timeCount = this.timeCount;
    const logLen = this.logLen;
    const slabs = this.parkedEntries.count;
    // Where each timestamp's changes begin, read in order from the parked step slabs.
    const parkedSteps = this.parkedSteps.count;
    const stepScratch = parkedSteps > 0 ? new Uint32Array(this.timeSlab) : EMPTY_U32;
    const timeMask = this.timeMask;
    let stepSlab = 0;
    let steps = parkedSteps > 0 ? stepScratch : this.stepHot;
    if (parkedSteps > 0) this.parkedSteps.takeInto(0, stepScratch);
    let local = 0;
    let nextStep = timeCount > 1 ? steps[1] : logLen;
    for (let s = 0, pos = 0; s < slabs && pos < logLen; s++) {
      const sl = this.parkedWide[s] ? scratch32 : scratch16;
      this.parkedEntries.takeInto(s, sl);
      const slabEnd = pos + Math.min(this.slab, logLen - pos);
      const slabStart = pos;
      while (pos < slabEnd) {
        // One time step (or the part of it in this slab) at a time.
        while (pos >= nextStep) {
          local++;
          const next = local + 1;
          if (next >= timeCount) nextStep = logLen;
          else {
            if ((next & timeMask) === 0) {
              stepSlab++;
              if (stepSlab < parkedSteps) this.parkedSteps.takeInto(stepSlab, stepScratch);
              else steps = this.stepHot;
            }
            nextStep = steps[next & timeMask];
          }
        }
        const step = place.stepBase + local;
        const runEnd = nextStep < slabEnd ? nextStep : slabEnd;
        for (let i = pos - slabStart, end = runEnd - slabStart; i < end; i++) allT[curT[sl[i] >>> 2]++] = step;
        pos = runEnd;
      }
    }
  }

  /** Copies this part's timestamps from its `from`-th on into `times` at `at`, and lets them go. */
  timesInto(times: Float64Array, at: number, from: number): void {
    const size = this.timeSlab;
    const parked = this.parkedTimes.count;
    const scratch = parked > 0 ? new Float64Array(size) : EMPTY_F64;
    for (let j = 0; j <= parked; j++) {
      const first = j * size;
      const len = Math.min(size, this.timeCount - first);
      if (len <= 0) break;
      let slab: Float64Array;
      if (j < parked) {
        this.parkedTimes.takeInto(j, scratch);
        slab = scratch;
      } else slab = this.timeHot;
      const skip = Math.max(0, from - first);
      if (skip < len) times.set(slab.subarray(skip, len), at + first + skip - from);
    }
    this.parkedTimes.clear();
    this.timeHot = EMPTY_F64;
  }

  /** The Dump: this builder's scopes, nets and signals over the placed arrays. */
  assemble(layout: DumpLayout, arrays: DumpArrays, texts: PlacedText[], times: Float64Array, rest: AssembledRest): Dump {
    const { startT, startL, startP, startR, counts, written } = layout.regions;
    for (let k = 0; k < this.sigs.length; k++) {
      const sig = this.sigs[k];
      const c = counts[k];
      const kind = this.kinds[k];
      sig.count = c;
      sig.written = written[k];
      sig.timeIndex = arrays.timeIndex.subarray(startT[k], startT[k] + c);
      sig.logic = kind === KIND_LOGIC ? arrays.logic.subarray(startL[k], startL[k] + c) : EMPTY_U8;
      sig.planes = kind === KIND_VECTOR ? arrays.planes.subarray(startP[k], startP[k] + c * 2 * this.words[k]) : EMPTY_U32;
      sig.reals = kind === KIND_REAL ? arrays.reals.subarray(startR[k], startR[k] + c) : EMPTY_F64;
    }
    for (const { signal, at, text } of texts) {
      const sig = this.sigs[signal];
      if (sig.texts === NO_TEXTS) sig.texts = new Map();
      sig.texts.set(at - startT[signal], text);
    }
    return {
      source: this.source,
      date: this.date,
      version: this.version,
      timescale: this.timescale,
      times,
      endTick: rest.endTick,
      scopes: this.scopes,
      nets: this.nets,
      signals: this.sigs,
      dumpOff: rest.dumpOff,
      changes: rest.changes,
      bytes: rest.bytes,
      truncated: rest.truncated,
      warnings: rest.warnings,
    };
  }
}
