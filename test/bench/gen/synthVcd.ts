// Synthetic four-state VCD for the benchmark (IEEE 1364-2005 §18.2 syntax): mostly 1-bit nets,
// some vectors of 4..64 bits written without leading zeros (§18.2.1 left-extension), some reals.
// Values are random but seeded, so the same size and net count give the same file every time.
// Reals are written as plain positive decimals, which is also the form the `vcd-parser`
// baseline can read (it rejects signs and exponents), so a slice of this file suits both.

import { ByteWriter } from './byteWriter';

/** Bump when the file content changes, so cached dumps of an older layout are not reused. */
export const SYNTH_VERSION = 1;

export interface SynthSpec {
  nets: number;
  targetBytes: number;
  seed: number;
}

export interface SynthMeta {
  version: number;
  nets: number;
  scalars: number;
  vectors: number;
  reals: number;
  targetBytes: number;
  bytes: number;
  /** Value changes written, each once ($dumpvars initial values included). */
  changes: number;
  changesByKind: { logic: number; vector: number; real: number };
  timestamps: number;
  /** Extra same-timestamp pulses written on 1-bit nets (zero-width glitches). */
  zeroWidthPulses: number;
  endTick: number;
  generatedMs: number;
}

const VECTOR_WIDTHS = [4, 8, 12, 16, 32, 64];

type Kind = 0 | 1 | 2; // 0 logic, 1 vector, 2 real

/** Short identifier codes as simulators hand them out: base 94 over '!'..'~'. */
export function identifierCode(index: number): string {
  let n = index;
  let s = '';
  do {
    s += String.fromCharCode(33 + (n % 94));
    n = Math.floor(n / 94);
  } while (n > 0);
  return s;
}

function kindOf(i: number): Kind {
  if (i === 0) return 0; // the clock
  const r = i % 20;
  if (r === 19) return 2;
  if (r === 3 || r === 7 || r === 11) return 1;
  return 0;
}

export function generateSynthVcd(path: string, spec: SynthSpec): SynthMeta {
  const started = Date.now();
  const { nets, targetBytes } = spec;
  let rng = spec.seed >>> 0 || 1;
  const next = (): number => {
    rng ^= rng << 13;
    rng >>>= 0;
    rng ^= rng >>> 17;
    rng ^= rng << 5;
    rng >>>= 0;
    return rng;
  };

  const kinds = new Uint8Array(nets);
  const widths = new Uint8Array(nets);
  const codes: Uint8Array[] = [];
  const counts = { logic: 0, vector: 0, real: 0 };
  let scalars = 0;
  let vectors = 0;
  let reals = 0;
  for (let i = 0; i < nets; i++) {
    const k = kindOf(i);
    kinds[i] = k;
    widths[i] = k === 1 ? VECTOR_WIDTHS[vectors % VECTOR_WIDTHS.length] : k === 2 ? 64 : 1;
    if (k === 0) scalars++;
    else if (k === 1) vectors++;
    else reals++;
    codes.push(Uint8Array.from(identifierCode(i), (c) => c.charCodeAt(0)));
  }

  const w = new ByteWriter(path);
  w.ascii('$date\n  synthetic benchmark dump\n$end\n$version\n  midrail bench generator ' + SYNTH_VERSION + '\n$end\n');
  w.ascii('$timescale 1ps $end\n$scope module bench $end\n');
  for (let i = 0; i < nets; i++) {
    if (i % 100 === 0) {
      if (i > 0) w.ascii('$upscope $end\n');
      w.ascii(`$scope module tile${i / 100} $end\n`);
    }
    const code = identifierCode(i);
    if (i === 0) w.ascii(`$var wire 1 ${code} clk $end\n`);
    else if (kinds[i] === 0) w.ascii(`$var ${i % 2 ? 'wire' : 'reg'} 1 ${code} lane${i} $end\n`);
    else if (kinds[i] === 1) w.ascii(`$var wire ${widths[i]} ${code} word${i} [${widths[i] - 1}:0] $end\n`);
    else w.ascii(`$var real 64 ${code} level${i} $end\n`);
  }
  w.ascii('$upscope $end\n$upscope $end\n$enddefinitions $end\n');

  // Current state per net: logic code 0/1/2(x)/3(z); real value in units of 0.1 mV (0..33000).
  const logic = new Uint8Array(nets);
  const level = new Int32Array(nets);

  const writeScalar = (i: number, v: number): void => {
    w.room();
    w.byte(v === 0 ? 48 : v === 1 ? 49 : v === 2 ? 120 : 122);
    w.bytes(codes[i]);
    w.byte(10);
    counts.logic++;
  };
  const writeVector = (i: number, lo: number, hi: number, unknown: boolean): void => {
    w.room();
    w.byte(98); // b
    if (unknown) {
      w.byte(120); // bx: left-extends with x to the full width (§18.2.1)
    } else {
      const width = widths[i];
      let top = width - 1;
      while (top > 0 && ((top >= 32 ? hi >>> (top - 32) : lo >>> top) & 1) === 0) top--;
      for (let b = top; b >= 0; b--) w.byte(48 + ((b >= 32 ? hi >>> (b - 32) : lo >>> b) & 1));
    }
    w.byte(32);
    w.bytes(codes[i]);
    w.byte(10);
    counts.vector++;
  };
  const writeReal = (i: number, units: number): void => {
    w.room();
    w.byte(114); // r
    w.uint(Math.floor(units / 10000));
    w.byte(46);
    const frac = units % 10000;
    w.byte(48 + Math.floor(frac / 1000));
    w.byte(48 + (Math.floor(frac / 100) % 10));
    w.byte(48 + (Math.floor(frac / 10) % 10));
    w.byte(48 + (frac % 10));
    w.byte(32);
    w.bytes(codes[i]);
    w.byte(10);
    counts.real++;
  };
  const randomVector = (i: number): void => {
    const width = widths[i];
    const lo = width >= 32 ? next() : next() & ((1 << width) - 1);
    const hi = width > 32 ? next() & (width >= 64 ? 0xffffffff : (2 ** (width - 32) - 1)) : 0;
    writeVector(i, lo, hi, (next() & 63) === 0);
  };

  let tick = 0;
  let timestamps = 1;
  let zeroWidthPulses = 0;
  w.ascii('#0\n$dumpvars\n');
  for (let i = 0; i < nets; i++) {
    if (kinds[i] === 0) writeScalar(i, (logic[i] = i === 0 ? 0 : 2));
    else if (kinds[i] === 1) writeVector(i, 0, 0, true);
    else writeReal(i, (level[i] = next() % 33001));
  }
  w.ascii('$end\n');

  const perStep = nets >= 1000 ? 40 : 6;
  while (w.size < targetBytes) {
    tick += 100 + (next() % 1000);
    timestamps++;
    w.room();
    w.byte(35); // #
    w.uint(tick);
    w.byte(10);
    writeScalar(0, (logic[0] ^= 1)); // the clock toggles at every timestamp
    const k = 1 + (next() % (2 * perStep));
    for (let c = 0; c < k; c++) {
      const i = 1 + (next() % (nets - 1));
      const kind = kinds[i];
      if (kind === 0) {
        const r = next() & 255;
        const old = logic[i];
        if (r === 0) logic[i] = 3;
        else if (r < 4) logic[i] = 2;
        else logic[i] = old >= 2 ? r & 1 : old ^ 1;
        if (r >= 252 && old < 2) {
          // A pulse that starts and ends at this timestamp: a zero-width glitch.
          writeScalar(i, old ^ 1);
          zeroWidthPulses++;
          logic[i] = old;
        }
        writeScalar(i, logic[i]);
      } else if (kind === 1) {
        randomVector(i);
      } else {
        const step = (next() % 2001) - 1000;
        level[i] = Math.min(33000, Math.max(0, level[i] + step));
        writeReal(i, level[i]);
      }
    }
  }
  // A last timestamp with no change after it: the dump's end time (§18.2.1 simulation time).
  tick += 1000;
  timestamps++;
  w.room();
  w.byte(35);
  w.uint(tick);
  w.byte(10);
  w.close();

  return {
    version: SYNTH_VERSION,
    nets,
    scalars,
    vectors,
    reals,
    targetBytes,
    bytes: w.written,
    changes: counts.logic + counts.vector + counts.real,
    changesByKind: counts,
    timestamps,
    zeroWidthPulses,
    endTick: tick,
    generatedMs: Date.now() - started,
  };
}
