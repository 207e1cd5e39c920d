// tPLH/tPHL measured on iverilog dumps of gates whose delays the test sets.
// Source of truth: IEEE 1364-2005 §7.14 — with #(rise, fall) the rise delay applies to transitions
// to 1 and the fall delay to transitions to 0; a gate output starts at x until its first evaluation.

import { afterAll, describe, expect, it } from 'vitest';
import { findEdges, measureDelay } from '../../src/measure';
import { resolveNet } from '../../src/model/netref';
import { parseVcd } from '../../src/parse/vcd';
import { IVERILOG_MISSING, cleanupSimulations, iverilogAvailable, simulate } from './iverilog';

afterAll(cleanupSimulations);

const DESIGN = `\`timescale 1ns/1ps
module top;
  reg a;
  wire an, y;
  not #(3,5) g1(an, a);   // an: rise 3 ns, fall 5 ns
  not #(3,5) g2(y, an);   // y follows a after 5 + 3 (a rises) or 3 + 5 (a falls)
  initial begin
    $dumpfile("dump.vcd");
    $dumpvars(0, top);
    a = 0;
    #20 a = 1;
    #20 a = 0;
    #20 a = 1;
    #20 $finish;
  end
endmodule
`;

describe.skipIf(!iverilogAvailable)(`gate delays from an iverilog dump${iverilogAvailable ? '' : ` (${IVERILOG_MISSING})`}`, () => {
  const sim = iverilogAvailable ? simulate(DESIGN) : null;
  const dump = sim ? parseVcd(sim.vcd, sim.vcdPath) : null!;

  it('measures tPLH = rise delay and tPHL = fall delay of a not #(3,5) (IEEE 1364-2005 §7.14)', () => {
    const r = measureDelay(dump, { from: resolveNet(dump, 'top.a'), to: resolveNet(dump, 'top.an') });
    expect(r.tPLH).toMatchObject({ count: 1, min_s: 3e-9, max_s: 3e-9, worst_time_s: 43e-9 });
    expect(r.tPHL).toMatchObject({ count: 2, min_s: 5e-9, max_s: 5e-9 });
    expect(r.pairs[0]).toEqual({ kind: 'tPHL', from_edge: 'rise', from_time_s: 20e-9, to_edge: 'fall', to_time_s: 25e-9, delay_s: 5e-9 });
    expect(r.tpd_s).toBe(5e-9);
    expect(r.tskp_s).toBe(2e-9);
  });

  it('adds the delays of two inverters in series: rise after 5 + 3 = 8 ns, fall after 3 + 5 = 8 ns', () => {
    const r = measureDelay(dump, { from: resolveNet(dump, 'a'), to: resolveNet(dump, 'y') });
    expect(r.pairs.map((p) => [p.kind, p.delay_s])).toEqual([
      ['tPLH', 8e-9],
      ['tPHL', 8e-9],
      ['tPLH', 8e-9],
    ]);
    // fmax = 1/tpd (common practice: minimum clock period Tc ≥ tpd of the critical path, Harris & Harris,
    // Digital Design and Computer Architecture, 2nd ed., §3.5.2, from memory): 1/8 ns = 125 MHz.
    expect(r.tpd_s).toBe(8e-9);
    expect(r.fmax_hz).toBeCloseTo(125e6, 3);
    expect(r.caution).toMatch(/static timing analysis/);
  });

  it('reports the power-up x of a gate output as an unknown span, not as an edge (x→1 is no tPLH)', () => {
    // an is x from 0 until g1 first evaluates: a = 0 at 0, so an goes to 1 after the rise delay, 3 ns.
    const r = findEdges(dump, resolveNet(dump, 'top.an'));
    expect(r.unknown_spans).toEqual([{ net: 'top.an', start_s: 0, end_s: 3e-9, state: 'x' }]);
    expect(r.edges.map((e) => [e.edge, e.time_s])).toEqual([
      ['fall', 25e-9],
      ['rise', 43e-9],
      ['fall', 65e-9],
    ]);
    const d = measureDelay(dump, { from: resolveNet(dump, 'a'), to: resolveNet(dump, 'an') });
    expect(d.unknown_spans).toContainEqual({ net: 'top.an', start_s: 0, end_s: 3e-9, state: 'x' });
  });
});
