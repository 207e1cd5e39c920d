// The parser against dumps Icarus Verilog writes from small designs. Every expected time and value
// below is worked out from the HDL in the same test (delays per IEEE 1364-2005 §7.14, dump format
// per §18.2), never copied from parser output. Icarus output is deterministic, so exact ticks hold.

import { afterAll, describe, expect, test } from 'vitest';
import type { Dump, Net } from '../../src/model/dump';
import { valueText, valueTextAt } from '../../src/model/lookup';
import { bitSignal, resolveNet } from '../../src/model/netref';
import { ticksToSeconds } from '../../src/measure/ticks';
import { VcdParser, parseVcd } from '../../src/parse/vcd';
import { bodyLines, cleanupSimulations, type DelayCorner, simulate } from './iverilog';

afterAll(cleanupSimulations);

async function dumpOf(verilog: string, corner: DelayCorner = 'typ'): Promise<{ dump: Dump; text: string }> {
  const sim = await simulate(verilog, { dumpTop: 'top', corner });
  return { dump: parseVcd(sim.bytes, 'iverilog.vcd'), text: sim.text };
}

function netAt(dump: Dump, path: string): Net {
  const found = dump.nets.find((n) => n.path === path);
  if (!found) throw new Error(`no net ${path}; have ${dump.nets.map((n) => n.path).join(', ')}`);
  return found;
}

/** [tick, value text] for every change of a net or bit, in file order. */
function changesOf(dump: Dump, name: string): Array<[number, string]> {
  const sig = bitSignal(dump, resolveNet(dump, name));
  const out: Array<[number, string]> = [];
  for (let i = 0; i < sig.count; i++) out.push([dump.times[sig.timeIndex[i]], valueText(sig, i)]);
  return out;
}

function realsOf(dump: Dump, name: string): Array<[number, number]> {
  const sig = dump.signals[resolveNet(dump, name).net.signal];
  expect(sig.kind).toBe('real');
  const out: Array<[number, number]> = [];
  for (let i = 0; i < sig.count; i++) out.push([dump.times[sig.timeIndex[i]], sig.reals[i]]);
  return out;
}

/** Value changes written in the file, counted from the text (Icarus writes one per line, §18.2.1). */
function writtenChangeLines(text: string): string[] {
  return bodyLines(text).filter((l) => !l.startsWith('#') && !l.startsWith('$'));
}

/** The last `#` line of the file (§18.2.1 simulation time). */
function lastTimestamp(text: string): number {
  const times = bodyLines(text).filter((l) => l.startsWith('#'));
  return Number(times[times.length - 1].slice(1));
}

describe('scalar value changes (IEEE 1364-2005 §18.2.1, §18.2.2)', () => {
  test('a reg and a buf #1.5 copy of it change at the ticks the HDL schedules', async () => {
    const { dump, text } = await dumpOf(`
\`timescale 1ns/1ps
module top;
  reg a; wire y;
  buf #(1.5) b1 (y, a);
  initial begin a = 0; #5 a = 1; #2.25 a = 0; #4 $finish; end
endmodule`);
    // 1 ns units with 1 ps precision: the dump counts picoseconds (§18.2.3.5).
    expect(dump.timescale).toMatchObject({ magnitude: 1, unit: 'ps' });
    expect(changesOf(dump, 'top.a')).toEqual([[0, '0'], [5000, '1'], [7250, '0']]);
    // §7.14: one delay applies to every transition; the wire is x until the buffer's first output.
    expect(changesOf(dump, 'top.y')).toEqual([[0, 'x'], [1500, '0'], [6500, '1'], [8750, '0']]);
    expect(netAt(dump, 'top.a')).toMatchObject({ type: 'reg', width: 1, ranged: false });
    expect(netAt(dump, 'top.y')).toMatchObject({ type: 'wire', width: 1 });
    // $finish at 5 + 2.25 + 4 = 11.25 ns is the last `#` line, with no change after it.
    expect(lastTimestamp(text)).toBe(11250);
    expect(dump.endTick).toBe(11250);
    expect(ticksToSeconds(dump.timescale, dump.endTick)).toBe(11.25e-9);
    expect(dump.truncated).toBe(false);
  });

  test('not #(0.3, 0.7) rises 0.3 ns and falls 0.7 ns after its input, and x→1 takes the rise delay', async () => {
    const { dump } = await dumpOf(`
\`timescale 1ns/1ps
module top;
  reg a; wire yn;
  not #(0.3, 0.7) n1 (yn, a);
  initial begin a = 0; #2 a = 1; #2 a = 0; #2 $finish; end
endmodule`);
    // §7.14: (rise, fall); a change from x to 1 uses the rise delay.
    expect(changesOf(dump, 'top.yn')).toEqual([[0, 'x'], [300, '1'], [2700, '0'], [4300, '1']]);
  });

  test.each<[DelayCorner, number, number]>([
    ['min', 300, 600],
    ['typ', 400, 700],
    ['max', 500, 800],
  ])('min:typ:max delays at the %s corner give rise %i ps and fall %i ps', async (corner, rise, fall) => {
    const { dump } = await dumpOf(
      `
\`timescale 1ns/1ps
module top;
  reg a; wire yn;
  not #(0.3:0.4:0.5, 0.6:0.7:0.8) n1 (yn, a);
  initial begin a = 0; #2 a = 1; #2 a = 0; #2 $finish; end
endmodule`,
      corner,
    );
    // §7.14.1: the simulator picks one value of each min:typ:max triple.
    expect(changesOf(dump, 'top.yn')).toEqual([[0, 'x'], [rise, '1'], [2000 + fall, '0'], [4000 + rise, '1']]);
  });

  test('an event is dumped as a change of its code when it is triggered (§18.2.2)', async () => {
    const { dump } = await dumpOf(`
\`timescale 1ns/1ps
module top;
  event ev;
  initial begin #2 -> ev; #3 -> ev; #1 $finish; end
endmodule`);
    const net = netAt(dump, 'top.ev');
    expect(net.type).toBe('event');
    const ticks = changesOf(dump, 'top.ev').map(([t]) => t);
    expect(ticks).toContain(2000);
    expect(ticks).toContain(5000);
  });

  test('a value written again at a later step is kept as a change even when it equals the old one', async () => {
    const { dump } = await dumpOf(`
\`timescale 1ns/1ps
module top;
  reg b;
  initial begin b = 0; #2.5 b = 1; #0 b = 0; #1 $finish; end
endmodule`);
    // Icarus writes the step's final value (0) at 2.5 ns although b read 0 before: §18.2.1 lists
    // changes as written, and the parser keeps them in file order.
    expect(changesOf(dump, 'top.b')).toEqual([[0, '0'], [2500, '0']]);
  });
});

describe('vector value changes and left-extension (IEEE 1364-2005 §18.2.2, Table 18-1)', () => {
  const design = `
\`timescale 1ns/1ps
module top;
  reg [7:0] bus; wire [0:3] rev; reg [3:-4] f; reg [99:0] wide;
  assign rev = bus[3:0];
  initial begin
    bus = 8'h0x; f = 8'h81; wide = {100{1'b1}};
    #1 bus = 8'bzzzz1010;
    #1 bus = 8'b1; wide = 100'h1;
    #1 bus = 8'ha5;
    #1 bus = 8'bx;
    #1 $finish;
  end
endmodule`;

  test('short vector values are extended on the left with 0, x or z as Table 18-1 says', async () => {
    const { dump, text } = await dumpOf(design);
    // Icarus writes the short forms b0xxxx, bz1010 and b1; the parser must widen them.
    expect(text).toMatch(/^b0xxxx /m);
    expect(text).toMatch(/^bz1010 /m);
    expect(changesOf(dump, 'top.bus')).toEqual([
      [0, '0000xxxx'],
      [1000, 'zzzz1010'],
      [2000, '00000001'],
      [3000, '10100101'],
      [4000, 'xxxxxxxx'],
    ]);
  });

  test('vector nets have their path without the range, their width and declared range', async () => {
    const { dump, text } = await dumpOf(design);
    expect(text).toMatch(/\$var reg 8 \S+ bus \[7:0\] \$end/);
    expect(netAt(dump, 'top.bus')).toMatchObject({ width: 8, msb: 7, lsb: 0, ranged: true, type: 'reg' });
    expect(netAt(dump, 'top.rev')).toMatchObject({ width: 4, msb: 0, lsb: 3, type: 'wire' });
    expect(netAt(dump, 'top.f')).toMatchObject({ width: 8, msb: 3, lsb: -4 });
    expect(netAt(dump, 'top.wide')).toMatchObject({ width: 100, msb: 99, lsb: 0 });
  });

  test('a vector wider than 64 bits keeps every bit', async () => {
    const { dump } = await dumpOf(design);
    expect(changesOf(dump, 'top.wide')).toEqual([
      [0, '1'.repeat(100)],
      [2000, `${'0'.repeat(99)}1`],
    ]);
  });

  test('top.bus[3] follows bit 3 of the declared range, counted from the right in [7:0]', async () => {
    const { dump } = await dumpOf(design);
    // Bit 3 of 0000xxxx, zzzz1010, 00000001, 10100101, xxxxxxxx: x, 1, 0, 0 (no change), x.
    expect(changesOf(dump, 'top.bus[3]')).toEqual([[0, 'x'], [1000, '1'], [2000, '0'], [4000, 'x']]);
  });

  test('in an ascending range [0:3] bit 0 is the leftmost digit', async () => {
    const { dump } = await dumpOf(design);
    // rev = bus[3:0], so rev[0] = bus[3] and rev[3] = bus[0] (§4.2.1 MSB-to-MSB assignment).
    expect(changesOf(dump, 'top.rev')).toEqual([
      [0, 'xxxx'],
      [1000, '1010'],
      [2000, '0001'],
      [3000, '0101'],
      [4000, 'xxxx'],
    ]);
    expect(changesOf(dump, 'top.rev[0]')).toEqual([[0, 'x'], [1000, '1'], [2000, '0'], [4000, 'x']]);
    expect(changesOf(dump, 'top.rev[3]')).toEqual([[0, 'x'], [1000, '0'], [2000, '1'], [4000, 'x']]);
  });

  test('negative bit indices address a range such as [3:-4]', async () => {
    const { dump } = await dumpOf(design);
    // f = 8'h81 = 1000_0001: f[3] is the leftmost 1, f[-4] the rightmost 1, f[0] a 0.
    expect(changesOf(dump, 'top.f[3]')).toEqual([[0, '1']]);
    expect(changesOf(dump, 'top.f[-4]')).toEqual([[0, '1']]);
    expect(changesOf(dump, 'top.f[0]')).toEqual([[0, '0']]);
  });
});

describe('real and integer variables (IEEE 1364-2005 §18.2.2, §18.2.3.7)', () => {
  test('real values come back as the exact doubles the HDL assigned', async () => {
    const { dump } = await dumpOf(`
\`timescale 1ns/1ps
module top;
  real r;
  initial begin r = -1.25e-3; #1 r = 3.5; #1 r = 1.0 / 3.0; #1 r = -2.5e10; #1 r = 0.0; #1 $finish; end
endmodule`);
    expect(netAt(dump, 'top.r').type).toBe('real');
    expect(realsOf(dump, 'top.r')).toEqual([
      [0, -1.25e-3],
      [1000, 3.5],
      [2000, 1 / 3],
      [3000, -2.5e10],
      [4000, 0],
    ]);
  });

  test('an integer is a 32-bit two\'s-complement vector of type integer', async () => {
    const { dump } = await dumpOf(`
\`timescale 1ns/1ps
module top;
  integer i;
  initial begin i = -7; #1 i = 100; #1 $finish; end
endmodule`);
    expect(netAt(dump, 'top.i')).toMatchObject({ type: 'integer', width: 32 });
    expect(changesOf(dump, 'top.i')).toEqual([
      [0, `${'1'.repeat(28)}1001`],
      [1000, `${'0'.repeat(25)}1100100`],
    ]);
  });
});

describe('scopes and shared identifier codes (IEEE 1364-2005 §18.2.3.4, §18.2.1)', () => {
  const design = `
\`timescale 1ns/1ps
module leaf (input d, output q);
  assign q = ~d;
endmodule
module top;
  reg a; wire qa; reg [3:0] r;
  leaf u1 (.d(a), .q(qa));
  task pulse; input [3:0] n; reg [3:0] cnt; begin cnt = n; #1; end endtask
  function [3:0] inc; input [3:0] v; begin inc = v + 4'd1; end endfunction
  initial begin : stim
    reg [3:0] mark;
    a = 0; mark = 4'd9;
    pulse(4'd3);
    r = inc(4'd6); a = 1;
    #1 $finish;
  end
endmodule`;

  test('module instances, tasks, functions and named blocks become scopes of their kind', async () => {
    const { dump } = await dumpOf(design);
    const kinds = Object.fromEntries(dump.scopes.map((s) => [s.path, s.kind]));
    expect(kinds).toMatchObject({ top: 'module', 'top.u1': 'module', 'top.pulse': 'task', 'top.inc': 'function', 'top.stim': 'begin' });
    // Variables declared inside a task or a named block live in that scope.
    // Icarus writes the $dumpvars section at the end of time step 0, so it holds the values set then.
    expect(changesOf(dump, 'top.pulse.cnt')).toEqual([[0, '0011']]);
    expect(changesOf(dump, 'top.stim.mark')).toEqual([[0, '1001']]);
    // inc is called with 6 after the 1 ns inside pulse and returns 7.
    expect(changesOf(dump, 'top.inc.v')).toEqual([[0, 'xxxx'], [1000, '0110']]);
    expect(changesOf(dump, 'top.r')).toEqual([[0, 'xxxx'], [1000, '0111']]);
  });

  test('a port and the net it connects share one code, and both show the same changes', async () => {
    const { dump, text } = await dumpOf(design);
    const a = netAt(dump, 'top.a');
    const d = netAt(dump, 'top.u1.d');
    // Icarus declares both with one identifier code (§18.2.1 allows several $var per code).
    expect(a.code).toBe(d.code);
    expect(text.match(new RegExp(`\\$var \\w+ 1 ${a.code.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')} `, 'g'))?.length).toBe(2);
    expect(d.signal).toBe(a.signal);
    expect(changesOf(dump, 'top.u1.d')).toEqual([[0, '0'], [1000, '1']]);
    expect(changesOf(dump, 'top.u1.q')).toEqual([[0, '1'], [1000, '0']]);
  });

  test('the change count is the number of value changes written in the file, once per code', async () => {
    const { dump, text } = await dumpOf(design);
    const lines = writtenChangeLines(text);
    expect(dump.changes).toBe(lines.length);
    // Per code: a scalar line is value+code, a vector line is `b<digits> <code>`.
    const codeOf = (l: string) => (/^[bBrR]/.test(l) ? l.split(/\s+/)[1] : l.slice(1));
    const a = netAt(dump, 'top.a');
    const written = lines.filter((l) => codeOf(l) === a.code).length;
    expect(dump.signals[a.signal].written).toBe(written);
    expect(dump.nets.filter((n) => n.signal === a.signal).length).toBe(2);
  });
});

describe('$dumpoff, $dumpon and $dumpall (IEEE 1364-2005 §18.1.3, §18.1.4, §18.2.3.9–11)', () => {
  const design = `
\`timescale 1ns/1ps
module top;
  reg a; reg [3:0] v; real r;
  initial begin
    a = 0; v = 4'h5; r = 1.5;
    #2 a = 1;
    #2 $dumpoff;
    #1 a = 0; v = 4'ha;
    #2 $dumpon;
    #1 a = 1;
    #1 $dumpall;
    #1 $finish;
  end
endmodule`;

  test('between $dumpoff and $dumpon every variable reads x, and $dumpon shows the current values', async () => {
    const { dump } = await dumpOf(design);
    // $dumpoff at 4 ns; the changes at 5 ns are not dumped; $dumpon at 7 ns shows a = 0, v = 1010.
    expect(changesOf(dump, 'top.a').slice(0, 5)).toEqual([[0, '0'], [2000, '1'], [4000, 'x'], [7000, '0'], [8000, '1']]);
    expect(changesOf(dump, 'top.v').slice(0, 3)).toEqual([[0, '0101'], [4000, 'xxxx'], [7000, '1010']]);
    const r = realsOf(dump, 'top.r');
    expect(r[0]).toEqual([0, 1.5]);
    expect(r[1][0]).toBe(4000);
    expect(Number.isNaN(r[1][1])).toBe(true);
    expect(r[2]).toEqual([7000, 1.5]);
    expect(dump.dumpOff).toEqual([[4000, 7000]]);
    const v = dump.signals[resolveNet(dump, 'top.v').net.signal];
    expect(valueTextAt(dump, v, 5000)).toBe('xxxx');
  });

  test('$dumpall writes every current value again at its time, and those lines count as changes', async () => {
    const { dump, text } = await dumpOf(design);
    // $dumpall at 9 ns: a = 1 and v = 1010 are written again without having changed.
    expect(changesOf(dump, 'top.a').slice(4)).toEqual([[8000, '1'], [9000, '1']]);
    expect(changesOf(dump, 'top.v').slice(3)).toEqual([[9000, '1010']]);
    expect(dump.changes).toBe(writtenChangeLines(text).length);
    expect(dump.endTick).toBe(10000);
  });
});

describe('$timescale as Icarus writes it for each `timescale (IEEE 1364-2005 §18.2.3.5, §19.8)', () => {
  // [`timescale, delay before a rises, VCD magnitude, VCD unit, tick of the rise]
  test.each<[string, string, number, string, number]>([
    ['1ns/1ps', '2.5', 1, 'ps', 2500],
    ['1ns/10ps', '2.5', 10, 'ps', 250],
    ['1ns/100ps', '2.5', 100, 'ps', 25],
    ['1ns/1ns', '3', 1, 'ns', 3],
    ['100ns/10ns', '1.5', 10, 'ns', 15],
    ['1us/1us', '4', 1, 'us', 4],
    ['10ms/10ms', '2', 10, 'ms', 2],
    ['1s/1ms', '2', 1, 'ms', 2000],
    ['1s/1s', '2', 1, 's', 2],
    ['1ps/1fs', '2.5', 1, 'fs', 2500],
    ['1ps/100fs', '2.5', 100, 'fs', 25],
  ])('`timescale %s with #%s gives a %i %s tick and the rise at tick %i', async (directive, delay, magnitude, unit, tick) => {
    const { dump } = await dumpOf(`
\`timescale ${directive}
module top;
  reg a;
  initial begin a = 0; #${delay} a = 1; #1 $finish; end
endmodule`);
    expect(dump.timescale).toMatchObject({ magnitude, unit });
    expect(changesOf(dump, 'top.a')).toEqual([[0, '0'], [tick, '1']]);
    // The rise happens at `delay` time units of the module (the part before the slash).
    const m = /^(\d+)(\w+)\//.exec(directive)!;
    const unitSeconds: Record<string, number> = { s: 1, ms: 1e-3, us: 1e-6, ns: 1e-9, ps: 1e-12, fs: 1e-15 };
    const expected = Number(delay) * Number(m[1]) * unitSeconds[m[2]];
    expect(ticksToSeconds(dump.timescale, tick) / expected).toBeCloseTo(1, 12);
  });
});

describe('chunked input (IEEE 1364-2005 §18.2.1: tokens are whitespace-separated, wherever bytes arrive)', () => {
  test('an iverilog dump split in two at every byte parses exactly like the whole file', async () => {
    const sim = await simulate(
      `
\`timescale 1ns/10ps
module top;
  reg [11:0] sample; reg ready; real level; integer k;
  initial begin
    ready = 0; sample = 12'h80z; level = -0.75;
    for (k = 0; k < 6; k = k + 1) begin
      #1.25 sample = sample + 12'd37 * k; ready = ~ready; level = level * -1.5;
    end
    #1 $finish;
  end
endmodule`,
      { dumpTop: 'top' },
    );
    const whole = parseVcd(sim.bytes, 'split.vcd');
    const flat = (d: Dump) => d.nets.map((n) => [n.path, n.width, changesOf(d, n.path)]);
    const expected = flat(whole);
    for (let cut = 1; cut < sim.bytes.length; cut++) {
      const p = new VcdParser('split.vcd');
      p.push(sim.bytes.subarray(0, cut));
      p.push(sim.bytes.subarray(cut));
      const d = p.finish();
      expect(flat(d), `split at byte ${cut}`).toEqual(expected);
      expect(d.changes).toBe(whole.changes);
      expect(d.endTick).toBe(whole.endTick);
    }
    // ready toggles every 1.25 ns, which is 125 ticks of the 10 ps precision.
    expect(changesOf(whole, 'top.ready').map(([t]) => t)).toEqual([0, 125, 250, 375, 500, 625, 750]);
  });
});
