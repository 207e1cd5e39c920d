// The indexed dump: what a parser produces and every other part reads.
// Plain data only (objects, arrays, typed arrays), so it crosses a worker boundary by
// structured clone with all typed-array buffers transferred, never as JSON.

/** Logic state codes stored per change of a 1-bit signal. Index into LOGIC_CHARS. */
export const Logic = {
  L0: 0,
  L1: 1,
  X: 2,
  Z: 3,
  /** VHDL std_logic states some simulators write; kept as written. */
  U: 4,
  W: 5,
  WeakL: 6,
  WeakH: 7,
  DontCare: 8,
} as const;
export type LogicCode = (typeof Logic)[keyof typeof Logic];

/** Characters for Logic codes, lower case for 0/1/x/z and upper case for the others (as written by VHDL tools). */
export const LOGIC_CHARS = '01xzUWLH-';

export type TimeUnit = 's' | 'ms' | 'us' | 'ns' | 'ps' | 'fs';

export interface Timescale {
  /** 1, 10 or 100 in standard files; other numbers are accepted with a warning. */
  magnitude: number;
  unit: TimeUnit;
  /** Length of one tick in seconds (magnitude × unit). */
  seconds: number;
}

export type SignalKind = 'logic' | 'vector' | 'real' | 'string' | 'event';

/**
 * Storage for one identifier code. Several nets (aliases) may share a signal.
 * Change i happened at tick `dump.times[timeIndex[i]]`. Changes stay in file order, so one
 * timestamp may hold several changes of the same signal (a zero-width glitch).
 */
export interface Signal {
  kind: SignalKind;
  width: number;
  /** Number of changes stored (arrays below may be exactly this long after finishing). */
  count: number;
  /** Index into Dump.times per change. */
  timeIndex: Uint32Array;
  /**
   * kind 'logic' and 'event': one Logic code per change.
   * kind 'vector': 2·words Uint32 per change, where words = ceil(width/32):
   *   first `words` words are the value plane (bit 0 of word 0 = rightmost bit),
   *   next `words` words are the unknown plane (1 = x or z; value plane 1 = z, 0 = x).
   * kind 'real': unused (length 0).
   */
  logic: Uint8Array;
  planes: Uint32Array;
  /** kind 'real': one Float64 per change. */
  reals: Float64Array;
  /**
   * Vector changes holding states beyond 0/1/x/z (U, W, L, H, -), and string values:
   * change index → full-width text as written (left-extended). Planes hold x for those bits.
   */
  texts: Map<number, string>;
  /** Changes written in the file for this code (excludes x values the parser adds at $dumpoff). */
  written: number;
}

export interface Scope {
  name: string;
  /** module, task, function, begin, fork, or any kind a simulator writes. */
  kind: string;
  /** Index into Dump.scopes, -1 for a top-level scope. */
  parent: number;
  /** Dot-joined path from the top. */
  path: string;
}

export interface Net {
  /** Full dot-separated path: scope path plus reference name, without the bit range. */
  path: string;
  name: string;
  /** $var type as written (wire, reg, real, integer, logic, ...). */
  type: string;
  width: number;
  /** Declared range: msb and lsb index; for a scalar both are 0 and `ranged` is false. */
  msb: number;
  lsb: number;
  ranged: boolean;
  scope: number;
  /** Index into Dump.signals. */
  signal: number;
  /** The identifier code as written. */
  code: string;
}

export interface DumpWarning {
  line: number;
  offset: number;
  message: string;
}

export interface Dump {
  /** File name as given by the caller (for messages and provenance). */
  source: string;
  date: string;
  version: string;
  timescale: Timescale;
  /** Ticks of each distinct timestamp line in file order (strictly increasing), exact integers to 2^53. */
  times: Float64Array;
  /** Last timestamp written (`#` line), even if no change follows it. */
  endTick: number;
  scopes: Scope[];
  nets: Net[];
  signals: Signal[];
  /** Intervals [start, end) in ticks during which dumping was off ($dumpoff … $dumpon). */
  dumpOff: Array<[number, number]>;
  /** Total changes written in the file (each once, whatever the aliases). */
  changes: number;
  bytes: number;
  truncated: boolean;
  warnings: DumpWarning[];
}

/** Every ArrayBuffer a dump owns, for transfer lists. */
export function dumpBuffers(dump: Dump): ArrayBuffer[] {
  const seen = new Set<ArrayBuffer>();
  const add = (a: ArrayBufferView) => {
    if (a.buffer instanceof ArrayBuffer && a.buffer.byteLength > 0) seen.add(a.buffer);
  };
  add(dump.times);
  for (const s of dump.signals) {
    add(s.timeIndex);
    add(s.logic);
    add(s.planes);
    add(s.reals);
  }
  return [...seen];
}

export function wordsFor(width: number): number {
  return Math.max(1, Math.ceil(width / 32));
}
