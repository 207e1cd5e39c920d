// Where every change of a finished dump goes. A dump read in one piece is one part; a dump read
// by several threads, each from its own byte range, has one part per range. Each kind of array
// is one flat buffer carved per signal (a finished dump owns four buffers: cheap to allocate
// and to transfer), and within a signal's region the parts follow one another in file order, so
// every part can place its changes at once, in parallel, without copying anyone else's.

/** Signal kinds as the change log stores them. */
export const KIND_LOGIC = 0;
export const KIND_VECTOR = 1;
export const KIND_REAL = 2;
export const KIND_TEXT = 3;

/** What a part holds once all its input is read. */
export interface PartTotals {
  /** Changes per signal. */
  counts: Int32Array;
  /** Changes per signal that the file did not write (x added at $dumpoff). */
  uncounted: Int32Array;
  /** Timestamps, and the first and last of them (no timestamps: timeCount 0). */
  timeCount: number;
  firstTick: number;
  lastTick: number;
}

/** The four flat arrays of a finished dump. */
export interface DumpArrays {
  timeIndex: Uint32Array;
  logic: Uint8Array;
  planes: Uint32Array;
  reals: Float64Array;
}

/** Where one part's changes of each signal begin in each flat array, and its first timestamp's index. */
export interface PartPlacement {
  startT: Int32Array;
  startL: Int32Array;
  startP: Int32Array;
  startR: Int32Array;
  /** Index in the merged timestamp table of the part's first timestamp. */
  stepBase: number;
  /** 1 when the part's first timestamp equals the previous part's last and is not stored again. */
  timeFrom: number;
}

export interface DumpLayout {
  /** Elements of each flat array. */
  sizes: { timeIndex: number; logic: number; planes: number; reals: number };
  /** Where each signal's region begins in each flat array, and its total count. */
  regions: { startT: Int32Array; startL: Int32Array; startP: Int32Array; startR: Int32Array; counts: Int32Array; written: Int32Array };
  timeCount: number;
  parts: PartPlacement[];
}

/** `kinds` and `words` per signal (words = 32-bit words per plane of a vector). */
export function planLayout(kinds: Uint8Array, words: Int32Array, signals: number, parts: PartTotals[]): DumpLayout {
  const counts = new Int32Array(signals);
  const written = new Int32Array(signals);
  for (const part of parts) {
    for (let k = 0; k < signals; k++) {
      counts[k] += part.counts[k];
      written[k] += part.counts[k] - part.uncounted[k];
    }
  }
  const startT = new Int32Array(signals);
  const startL = new Int32Array(signals);
  const startP = new Int32Array(signals);
  const startR = new Int32Array(signals);
  let aT = 0;
  let aL = 0;
  let aP = 0;
  let aR = 0;
  for (let k = 0; k < signals; k++) {
    const c = counts[k];
    startT[k] = aT;
    startL[k] = aL;
    startP[k] = aP;
    startR[k] = aR;
    aT += c;
    if (kinds[k] === KIND_LOGIC) aL += c;
    else if (kinds[k] === KIND_VECTOR) aP += c * 2 * words[k];
    else if (kinds[k] === KIND_REAL) aR += c;
  }
  const placements: PartPlacement[] = [];
  const cursorT = startT.slice();
  const cursorL = startL.slice();
  const cursorP = startP.slice();
  const cursorR = startR.slice();
  let timeCount = 0;
  let lastTick = Number.NaN;
  for (const part of parts) {
    // A part that starts at the tick the previous one ended on continues that time step.
    const timeFrom = part.timeCount > 0 && part.firstTick === lastTick ? 1 : 0;
    placements.push({
      startT: cursorT.slice(),
      startL: cursorL.slice(),
      startP: cursorP.slice(),
      startR: cursorR.slice(),
      stepBase: timeCount - timeFrom,
      timeFrom,
    });
    for (let k = 0; k < signals; k++) {
      const c = part.counts[k];
      cursorT[k] += c;
      if (kinds[k] === KIND_LOGIC) cursorL[k] += c;
      else if (kinds[k] === KIND_VECTOR) cursorP[k] += c * 2 * words[k];
      else if (kinds[k] === KIND_REAL) cursorR[k] += c;
    }
    timeCount += part.timeCount - timeFrom;
    if (part.timeCount > 0) lastTick = part.lastTick;
  }
  return {
    sizes: { timeIndex: aT, logic: aL, planes: aP, reals: aR },
    regions: { startT, startL, startP, startR, counts, written },
    timeCount,
    parts: placements,
  };
}

/** A buffer for finished arrays: on a SharedArrayBuffer when asked and available. */
export function allocateBuffer(bytes: number, shared: boolean): ArrayBuffer {
  return shared && typeof SharedArrayBuffer === 'function' ? (new SharedArrayBuffer(bytes) as unknown as ArrayBuffer) : new ArrayBuffer(bytes);
}

/** The four flat arrays for a layout. */
export function allocateArrays(layout: DumpLayout, shared: boolean): DumpArrays {
  const alloc = (bytes: number): ArrayBuffer => allocateBuffer(bytes, shared);
  const { sizes } = layout;
  return {
    timeIndex: new Uint32Array(alloc(sizes.timeIndex * 4)),
    logic: new Uint8Array(alloc(sizes.logic)),
    planes: new Uint32Array(alloc(sizes.planes * 4)),
    reals: new Float64Array(alloc(sizes.reals * 8)),
  };
}
