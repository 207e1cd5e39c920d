// Glitches on iverilog dumps.
// - Inertial delay: a pulse shorter than a gate's delay does not reach its output (IEEE 1364-2005
//   §7.14 gate delays are inertial; the pending output event is cancelled, cf. §14.6 pulse filtering).
// - Static hazard: a AND (delayed NOT a). When a rises, the AND sees 1·1 until the inverter output
//   falls, so its output pulses high for exactly the inverter's delay, starting one AND delay after
//   a rises (IEEE 1364-2005 §7.14 delay semantics; the hazard itself is common practice).

import { afterAll, describe, expect, it } from 'vitest';
import { findEdges, findGlitches, measureDelay } from '../../src/measure';
import { resolveNet, resolveNetList } from '../../src/model/netref';
import { parseVcd } from '../../src/parse/vcd';
import { IVERILOG_MISSING, cleanupSimulations, iverilogAvailable, simulate } from './iverilog';

afterAll(cleanupSimulations);

const DESIGN = `\`timescale 1ns/1ps
module top;
  reg a, p;
  wire a_n, hz, q;
  not #3 inv(a_n, a);        // 3 ns inverter
  and #1 gate(hz, a, a_n);    // 1 ns AND: hz pulses high for 3 ns after each rise of a
  buf #4 slow(q, p);          // 4 ns inertial buffer
  initial begin
    $dumpfile("dump.vcd");
    $dumpvars(0, top);
    a = 0; p = 0;
    #20 a = 1;
    #20 a = 0;
    #10 p = 1;                // 2 ns pulse on p: shorter than the buffer delay
    #2  p = 0;
    #10 p = 1;                // 6 ns pulse on p: longer, so it propagates
    #6  p = 0;
    #20 $finish;
  end
endmodule
`;

describe.skipIf(!iverilogAvailable)(`glitches in an iverilog dump${iverilogAvailable ? '' : ` (${IVERILOG_MISSING})`}`, () => {
  const sim = iverilogAvailable ? simulate(DESIGN) : null;
  const dump = sim ? parseVcd(sim.vcd, sim.vcdPath) : null!;

  it('finds the static-hazard glitch with the inverter delay as its width, where the HDL puts it', () => {
    const r = findGlitches(dump, { maxWidthS: 5e-9, nets: resolveNetList(dump, 'top.hz') });
    // a rises at 20: hz rises at 20 + 1 and falls at 20 + 3 + 1 → width 3 ns = the inverter delay.
    expect(r.glitches).toEqual([{ net: 'top.hz', start_s: 21e-9, width_s: 3e-9, polarity: 'high' }]);
  });

  it('drops nothing: with a width limit below the hazard, it is not a glitch', () => {
    expect(findGlitches(dump, { maxWidthS: 3e-9, nets: resolveNetList(dump, 'top.hz') }).count).toBe(0);
  });

  it('shows inertial filtering: the 2 ns pulse is a glitch on the input and absent from the 4 ns buffer output', () => {
    const r = findGlitches(dump, { maxWidthS: 3e-9, nets: resolveNetList(dump, 'top.p,top.q') });
    expect(r.glitches).toEqual([{ net: 'top.p', start_s: 50e-9, width_s: 2e-9, polarity: 'high' }]);
    // The output carries only the 6 ns pulse, 4 ns late.
    const q = findEdges(dump, resolveNet(dump, 'top.q'));
    expect(q.edges.map((e) => [e.edge, e.time_s])).toEqual([
      ['rise', 66e-9],
      ['fall', 72e-9],
    ]);
    const d = measureDelay(dump, { from: resolveNet(dump, 'p'), to: resolveNet(dump, 'q') });
    expect(d.pairs.map((x) => [x.kind, x.from_time_s, x.delay_s])).toEqual([
      ['tPLH', 62e-9, 4e-9],
      ['tPHL', 68e-9, 4e-9],
    ]);
  });

  it('searches every net by default and finds the same glitches', () => {
    const r = findGlitches(dump, { maxWidthS: 5e-9 });
    expect(r.glitches.map((g) => [g.net, g.start_s, g.width_s])).toEqual([
      ['top.hz', 21e-9, 3e-9],
      ['top.p', 50e-9, 2e-9],
    ]);
  });
});
