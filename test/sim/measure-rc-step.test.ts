// A real net following a single-pole RC step, v(t) = V·(1 − e^(−t/RC)), sampled finely.
// Handbook values (standard first-order circuit result, e.g. Rabaey, Chandrakasan, Nikolić, Digital
// Integrated Circuits, 2nd ed., 2003, ch. 4 "The Wire": 0→50 % in 0.69·RC, 10→90 % in 2.2·RC; from
// memory; exact forms RC·ln 2 and RC·ln 9 follow from solving the formula): the 50 % instant lies
// RC·ln 2 after the step and the 10–90 % transition duration is RC·ln 9, both checked within 0.5 %.
// The decay after the input steps back is the mirror image and gives the same figures.

import { afterAll, describe, expect, it } from 'vitest';
import { findEdges } from '../../src/measure';
import { resolveNet } from '../../src/model/netref';
import { parseVcd } from '../../src/parse/vcd';
import { IVERILOG_MISSING, cleanupSimulations, iverilogAvailable, simulate } from './iverilog';

afterAll(cleanupSimulations);

const V = 3.3;
const RC = 1000; // ticks of 1 ps → RC = 1 ns
const T_RISE = 2000; // input steps up
const T_FALL = T_RISE + 20 * RC; // input steps down after 20 RC (settled to e^-20)
const T_END = T_FALL + 20 * RC;

function rc(t: number): number {
  if (t < T_RISE) return 0;
  const high = V * (1 - Math.exp(-(t - T_RISE) / RC));
  if (t < T_FALL) return high;
  const start = V * (1 - Math.exp(-(T_FALL - T_RISE) / RC));
  return start * Math.exp(-(t - T_FALL) / RC);
}

/** Deterministic noise in [-1, 1): a 32-bit linear congruential generator (Numerical Recipes constants, from memory). */
function lcg(seed: number): () => number {
  let x = seed >>> 0;
  return () => {
    x = (Math.imul(x, 1664525) + 1013904223) >>> 0;
    return x / 2 ** 31 - 1;
  };
}

/** VCD text (IEEE 1364-2005 §18.2) of a real var sampled every tick; unchanged values are not written, as a simulator does. */
function vcdOf(f: (t: number) => number): string {
  const lines = ['$timescale 1ps $end', '$scope module top $end', '$var real 64 ! v_out $end', '$upscope $end', '$enddefinitions $end'];
  let last = Number.NaN;
  for (let t = 0; t <= T_END; t++) {
    const v = f(t);
    if (v === last) continue;
    lines.push(`#${t}`, `r${v.toPrecision(16)} !`);
    last = v;
  }
  lines.push(`#${T_END}`);
  return lines.join('\n') + '\n';
}

const LN2 = Math.log(2);
const LN9 = Math.log(9);
const ps = (s: number) => s / 1e-12;

function checkRcEdges(vcd: string, source: string) {
  const dump = parseVcd(vcd, source);
  const r = findEdges(dump, resolveNet(dump, 'v_out'));
  expect(r.edges.map((e) => e.edge)).toEqual(['rise', 'fall']);
  const [rise, fall] = r.edges;
  // Within 0.5 % of the handbook values.
  expect(Math.abs(ps(rise.time_s) - T_RISE - RC * LN2) / (RC * LN2)).toBeLessThan(0.005);
  expect(Math.abs(ps(fall.time_s) - T_FALL - RC * LN2) / (RC * LN2)).toBeLessThan(0.005);
  expect(Math.abs(ps(rise.transition_s!) - RC * LN9) / (RC * LN9)).toBeLessThan(0.005);
  expect(Math.abs(ps(fall.transition_s!) - RC * LN9) / (RC * LN9)).toBeLessThan(0.005);
  expect(r.low).toBeCloseTo(0, 2);
  expect(r.high).toBeCloseTo(V, 2);
}

describe('RC step on a real net (VCD written by the test)', () => {
  it('puts the 50 % instant at RC·ln 2 and the 10–90 % transition duration at RC·ln 9', () => {
    checkRcEdges(vcdOf(rc), 'rc_step.vcd');
  });

  it('gives exactly one edge per transition when noise makes the 50 % level be crossed many times', () => {
    const rnd = lcg(2026);
    const noisy = (t: number) => rc(t) + 0.01 * V * rnd(); // ±1 % of the swing
    const vcd = vcdOf(noisy);
    const dump = parseVcd(vcd, 'rc_noisy.vcd');
    // Without hysteresis the raw 50 % level is crossed many times (this is what the state bands must absorb).
    const sig = dump.signals[dump.nets[0].signal];
    let naive = 0;
    for (let i = 1; i < sig.count; i++) if (sig.reals[i - 1] < V / 2 !== sig.reals[i] < V / 2) naive++;
    expect(naive).toBeGreaterThan(4);
    const r = findEdges(dump, resolveNet(dump, 'v_out'));
    expect(r.edges.map((e) => e.edge)).toEqual(['rise', 'fall']);
    expect(r.runts).toEqual([]);
    // The instant stays near RC·ln 2: the noise moves it by at most its own span (±1 % of V ≈ ±20 ps at this slope).
    expect(Math.abs(ps(r.edges[0].time_s) - T_RISE - RC * LN2)).toBeLessThan(40);
    expect(Math.abs(ps(r.edges[1].time_s) - T_FALL - RC * LN2)).toBeLessThan(40);
  });
});

const DESIGN = `\`timescale 1ps/1ps
module top;
  real v_out;
  initial begin
    $dumpfile("dump.vcd");
    $dumpvars(0, top);
    v_out = 0.0;
    #${T_END} $finish;
  end
  // RC step sampled every 1 ps (IEEE 1364-2005 §17.11 real math functions for $exp).
  always #1 v_out = ($realtime < ${T_RISE}) ? 0.0
                  : ($realtime < ${T_FALL}) ? ${V} * (1.0 - $exp(-($realtime - ${T_RISE}) / ${RC}.0))
                  : ${V} * (1.0 - $exp(-${T_FALL - T_RISE}.0 / ${RC}.0)) * $exp(-($realtime - ${T_FALL}) / ${RC}.0);
endmodule
`;

describe.skipIf(!iverilogAvailable)(`RC step on a real net dumped by iverilog${iverilogAvailable ? '' : ` (${IVERILOG_MISSING})`}`, () => {
  it('puts the 50 % instant at RC·ln 2 and the 10–90 % transition duration at RC·ln 9', () => {
    const sim = simulate(DESIGN);
    checkRcEdges(sim.vcd, sim.vcdPath);
  });
});
