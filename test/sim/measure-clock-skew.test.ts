// Clock-tree skew on an iverilog dump: one clock fanned out through buffers of known delays
// (1, 3, 2 ns, IEEE 1364-2005 §7.14 gate delays). Skew per event = latest − earliest = 3 − 1 = 2 ns;
// offsets from the earliest leaf = the differences of the buffer delays (JESD65B output-skew idea).

import { afterAll, describe, expect, it } from 'vitest';
import { measureSkew } from '../../src/measure';
import { resolveNet, resolveNetList } from '../../src/model/netref';
import { parseVcd } from '../../src/parse/vcd';
import { IVERILOG_MISSING, cleanupSimulations, iverilogAvailable, simulate } from './iverilog';

afterAll(cleanupSimulations);

const DESIGN = `\`timescale 1ns/100ps
module top;
  reg clk_root;
  wire clk_leaf0, clk_leaf1, clk_leaf2;
  buf #1 b0(clk_leaf0, clk_root);
  buf #3 b1(clk_leaf1, clk_root);
  buf #2 b2(clk_leaf2, clk_root);
  initial begin
    $dumpfile("dump.vcd");
    $dumpvars(0, top);
    clk_root = 0;
    #50 $finish;
  end
  always #5 clk_root = ~clk_root;   // 10 ns period
endmodule
`;

describe.skipIf(!iverilogAvailable)(`clock skew in an iverilog dump${iverilogAvailable ? '' : ` (${IVERILOG_MISSING})`}`, () => {
  const sim = iverilogAvailable ? simulate(DESIGN) : null;
  const dump = sim ? parseVcd(sim.vcd, sim.vcdPath) : null!;

  it('gives skew = largest − smallest buffer delay on every rising edge', () => {
    const r = measureSkew(dump, { nets: resolveNetList(dump, 'top.clk_leaf*'), edge: 'rise' });
    expect(r.events.length).toBeGreaterThan(0);
    for (const e of r.events) {
      if (e.edges < 3) continue; // the last edge of the run may be cut off by $finish
      expect(e).toMatchObject({ edge: 'rise', edges: 3, earliest: 'top.clk_leaf0', latest: 'top.clk_leaf1' });
      expect(e.skew_s).toBeCloseTo(2e-9, 21);
    }
    expect(r.max_skew_s).toBeCloseTo(2e-9, 21);
    expect(r.window_s).toBeCloseTo(5e-9, 21); // half the 10 ns rise-to-rise interval
    expect(r.ref).toBe('top.clk_leaf0');
    expect(r.offsets.map((o) => [o.net, Number(o.mean_offset_s!.toPrecision(12))])).toEqual([
      ['top.clk_leaf1', 2e-9],
      ['top.clk_leaf2', 1e-9],
    ]);
  });

  it('measures offsets from a given reference leaf, both edge directions together', () => {
    const r = measureSkew(dump, { nets: resolveNetList(dump, 'clk_leaf0,clk_leaf1,clk_leaf2'), ref: resolveNet(dump, 'clk_leaf2') });
    expect(r.events.map((e) => e.edge).slice(0, 4)).toEqual(['rise', 'fall', 'rise', 'fall']);
    expect(r.offsets.map((o) => [o.net, Number(o.mean_offset_s!.toPrecision(12))])).toEqual([
      ['top.clk_leaf0', -1e-9],
      ['top.clk_leaf1', 1e-9],
    ]);
  });
});
