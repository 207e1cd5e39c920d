// The measurement commands' --json contract (issue: CLI contract), run on dumps iverilog writes from
// designs with known delays. Expected numbers come from the HDL: gate delays per IEEE 1364-2005
// §7.14 (#(rise, fall): rise delay for transitions to 1, fall delay for transitions to 0).

import { existsSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { IVERILOG_MISSING, cleanupSimulations, iverilogAvailable, type Simulation, simulate } from '../sim/iverilog';
import { CLI, json, midrail } from './measure-cli';

const DESIGN = `\`timescale 1ns/1ps
module top;
  reg a, clk;
  wire a_n, y, hz;
  wire [3:0] taps;
  not #(2, 3) inv (a_n, a);           // tPLH 2 ns, tPHL 3 ns
  not #(2, 3) inv2 (y, a_n);          // a → y: rise after 3 + 2, fall after 2 + 3
  and #1 gate (hz, a, a_n);           // static hazard: 3 ns wide after each rise of a (inverter fall delay)
  genvar i;
  generate for (i = 0; i < 4; i = i + 1) begin : g_bit
    wire q;
    buf #(1 + i * 0.25) b (q, clk);   // clock leaves 1, 1.25, 1.5, 1.75 ns late
    assign taps[i] = q;
  end endgenerate
  real v_out;
  always #0.1 v_out = 3.3 * (1.0 - $exp(-$realtime / 2.0));   // RC step, RC = 2 ns
  initial begin
    a = 0; clk = 0;
    #20 a = 1;
    #20 a = 0;
    #20 $finish;
  end
  always #5 clk = ~clk;
endmodule
`;

let sim: Simulation;
beforeAll(() => {
  expect(existsSync(CLI), `${CLI} is missing: run 'npm run prepare' first`).toBe(true);
  if (iverilogAvailable) sim = simulate(DESIGN, { dumpTop: 'top' });
});
afterAll(cleanupSimulations);

describe.skipIf(!iverilogAvailable)(`measurement commands on an iverilog dump${iverilogAvailable ? '' : ` (${IVERILOG_MISSING})`}`, () => {
  test('delay --json: pairs, per-kind statistics, tpd, tsk(p) and fmax as the contract says', () => {
    const r = json(midrail('delay', sim.vcdPath, '--from', 'top.a', '--to', 'a_n', '--json'));
    expect(Object.keys(r)).toEqual(expect.arrayContaining(['from', 'to', 'level', 'pairs', 'unpaired', 'tPLH', 'tPHL', 'tPD', 'tpd_s', 'tskp_s', 'fmax_hz']));
    expect(r.from).toBe('top.a');
    expect(r.to).toBe('top.a_n');
    expect(r.level).toBe('50%');
    expect(r.pairs).toEqual([
      { kind: 'tPHL', from_edge: 'rise', from_time_s: 2e-8, to_edge: 'fall', to_time_s: 2.3e-8, delay_s: 3e-9 },
      { kind: 'tPLH', from_edge: 'fall', from_time_s: 4e-8, to_edge: 'rise', to_time_s: 4.2e-8, delay_s: 2e-9 },
    ]);
    expect(r.unpaired).toBe(0);
    expect(r.tPLH).toEqual({ count: 1, min_s: 2e-9, max_s: 2e-9, mean_s: 2e-9, std_s: 0, worst_time_s: 4.2e-8 });
    expect(r.tPHL).toEqual({ count: 1, min_s: 3e-9, max_s: 3e-9, mean_s: 3e-9, std_s: 0, worst_time_s: 2.3e-8 });
    expect(r.tPD).toEqual({ count: 0, min_s: null, max_s: null, mean_s: null, std_s: null, worst_time_s: null });
    expect(r.tpd_s).toBe(3e-9);
    expect(r.tskp_s).toBe(1e-9);
    // fmax = 1/tpd (common practice; Harris & Harris, Digital Design and Computer Architecture, 2nd ed., §3.5.2, from memory).
    expect(r.fmax_hz).toBe(1 / 3e-9);
    expect(r.caution).toMatch(/do not replace static timing analysis/);
    // The inverter output is x until its first evaluation: reported, not an edge.
    expect(r.unknown_spans).toEqual([{ net: 'top.a_n', start_s: 0, end_s: 2e-9, state: 'x' }]);
  });

  test('delay through two inverters adds their delays, and a window drops longer pairs as unpaired', () => {
    const r = json(midrail('delay', sim.vcdPath, '--from', 'a', '--to', 'top.y', '--json'));
    expect(r.pairs.map((p: any) => [p.kind, p.delay_s])).toEqual([
      ['tPLH', 5e-9],
      ['tPHL', 5e-9],
    ]);
    const w = json(midrail('delay', sim.vcdPath, '--from', 'a', '--to', 'top.y', '--window', '4ns', '--json'));
    expect(w.pairs).toEqual([]);
    expect(w.unpaired).toBe(2);
    expect(w.window_s).toBe(4e-9);
  });

  test('delay prints a readable report with the caution beside fmax', () => {
    const r = midrail('delay', sim.vcdPath, '--from', 'a', '--to', 'a_n');
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/tpd\s+3 ns/);
    expect(r.stdout).toMatch(/fmax\s+333\.3 MHz/);
    expect(r.stdout).toMatch(/static timing analysis/);
  });

  test('skew --json over a glob with literal brackets gives the buffer-delay differences', () => {
    const r = json(midrail('skew', sim.vcdPath, '--nets', 'top.g_bit[?].q', '--edge', 'rise', '--json'));
    expect(r.nets).toEqual(['top.g_bit[0].q', 'top.g_bit[1].q', 'top.g_bit[2].q', 'top.g_bit[3].q']);
    expect(r.edge).toBe('rise');
    expect(r.window_s).toBe(5e-9); // half the 10 ns clock period
    const full = r.events.filter((e: any) => e.edges === 4);
    expect(full.length).toBeGreaterThanOrEqual(5);
    for (const e of full) expect(e).toMatchObject({ edge: 'rise', skew_s: 7.5e-10, earliest: 'top.g_bit[0].q', latest: 'top.g_bit[3].q' });
    expect(r.max_skew_s).toBe(7.5e-10);
    expect(r.offsets).toEqual([
      { net: 'top.g_bit[1].q', mean_offset_s: 2.5e-10, events: expect.any(Number) },
      { net: 'top.g_bit[2].q', mean_offset_s: 5e-10, events: expect.any(Number) },
      { net: 'top.g_bit[3].q', mean_offset_s: 7.5e-10, events: expect.any(Number) },
    ]);
  });

  test('skew across the bits of a bus with --ref and the default edge any', () => {
    const r = json(midrail('skew', sim.vcdPath, '--nets', 'top.taps[0],top.taps[2]', '--ref', 'top.taps[2]', '--json'));
    expect(r.edge).toBe('any');
    expect(r.ref).toBe('top.taps[2]');
    expect(r.events.slice(0, 2).map((e: any) => e.edge)).toEqual(['rise', 'fall']);
    expect(r.offsets).toEqual([{ net: 'top.taps[0]', mean_offset_s: -5e-10, events: expect.any(Number) }]);
  });

  test('glitches --json finds the static hazard where the HDL puts it, sorted by time then net', () => {
    const r = json(midrail('glitches', sim.vcdPath, '--max-width', '4ns', '--json'));
    expect(r.max_width_s).toBe(4e-9);
    // a rises at 20 → hz rises at 21 (AND delay) and falls at 20 + 3 + 1 = 24.
    expect(r.glitches).toEqual([{ net: 'top.hz', start_s: 2.1e-8, width_s: 3e-9, polarity: 'high' }]);
    expect(r.count).toBe(1);
    const none = json(midrail('glitches', sim.vcdPath, '--max-width', '3ns', '--nets', 'hz', '--json'));
    expect(none.count).toBe(0);
  });

  test('edges --json on a real net gives state levels, the 50 % edge and its 10–90 % duration', () => {
    const r = json(midrail('edges', sim.vcdPath, '--net', 'v_out', '--json'));
    expect(r.net).toBe('top.v_out');
    expect(r.level).toBe('50%');
    expect(r.low).toBe(0);
    expect(r.high).toBeCloseTo(3.3, 1);
    expect(r.edges).toHaveLength(1);
    expect(r.edges[0].edge).toBe('rise');
    // RC = 2 ns: 50 % at RC·ln 2, 10–90 % in RC·ln 9 (first-order RC step, standard circuit result).
    // The run ends at 60 ns = 30 RC, so the histogram's high level is the settled value.
    expect(r.edges[0].time_s / (2e-9 * Math.log(2))).toBeCloseTo(1, 2);
    expect(r.edges[0].transition_s / (2e-9 * Math.log(9))).toBeCloseTo(1, 2);
  });

  test('edges --json on a 1-bit net and a bit of a vector lists rises and falls without levels', () => {
    const r = json(midrail('edges', sim.vcdPath, '--net', 'top.a', '--json'));
    expect(r).toEqual({
      net: 'top.a',
      level: '50%',
      edges: [
        { time_s: 2e-8, edge: 'rise' },
        { time_s: 4e-8, edge: 'fall' },
      ],
      zero_width_s: [],
      unknown_spans: [],
    });
    const bit = json(midrail('edges', sim.vcdPath, '--net', 'top.taps[3]', '--json'));
    expect(bit.edges[0]).toEqual({ time_s: 6.75e-9, edge: 'rise' });
    const vec = json(midrail('edges', sim.vcdPath, '--net', 'top.taps', '--json'));
    expect(new Set(vec.edges.map((e: any) => e.edge))).toEqual(new Set(['change']));
  });
});
