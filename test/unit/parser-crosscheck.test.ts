// midrail's parser against an independent reader, the npm package vcd-parser 1.0.1, on small dumps
// where that package is correct: scalars and plain binary vectors. Where the two disagree the
// difference is shown below with the reason; in each case midrail follows IEEE 1364-2005 §18.2.

import { createRequire } from 'node:module';
import { afterAll, describe, expect, test } from 'vitest';
import type { Dump } from '../../src/model/dump';
import { valueText } from '../../src/model/lookup';
import { parseVcd } from '../../src/parse/vcd';
import { cleanupSimulations, simulate } from '../sim/iverilog';

afterAll(cleanupSimulations);

/** What vcd-parser resolves to (its README, "ParsedData"): times and values are strings. */
interface TheirSignal {
  name: string;
  refName: string;
  size: number;
  type: string;
  wave: Array<[string, string]>;
}
interface TheirDump {
  endtime: string;
  timescale: string;
  signal: TheirSignal[];
}
const vcdParser = createRequire(import.meta.url)('vcd-parser') as {
  parse(text: string, opts?: { compress?: boolean; expandAmbigousBus?: boolean }): Promise<TheirDump>;
};

/** vcd-parser rejects with a plain object, not an Error; turn either outcome into a value. */
async function theirParse(text: string, opts = {}): Promise<TheirDump | { rejected: unknown }> {
  try {
    return await vcdParser.parse(text, opts);
  } catch (err) {
    return { rejected: err };
  }
}

/**
 * Every signal vcd-parser reports must match midrail's net with the same code: width, every change
 * time and every value. Binary vectors are compared as numbers because vcd-parser keeps short
 * values as written while midrail widens them (Table 18-1); x/z vectors, which vcd-parser folds
 * to a single 'x' or 'z', are compared on that letter.
 */
async function expectSameChanges(text: string): Promise<{ theirs: TheirDump; ours: Dump }> {
  const theirs = (await vcdParser.parse(text)) as TheirDump;
  const ours = parseVcd(text, 'crosscheck.vcd');
  expect(Number(theirs.endtime)).toBe(ours.endTick);
  expect(theirs.signal.length).toBeGreaterThan(0);
  for (const s of theirs.signal) {
    // vcd-parser glues the declared range to the name (`rig.data[7:0]`); midrail's path has none.
    const path = s.name.replace(/\s*\[[^\]]*\]$/, '');
    const net = ours.nets.find((n) => n.path === path && n.code === s.refName);
    expect(net, `midrail has no net ${path} with code ${s.refName}`).toBeDefined();
    expect(net!.width).toBe(s.size);
    const sig = ours.signals[net!.signal];
    const mine = Array.from({ length: sig.count }, (_, i) => [ours.times[sig.timeIndex[i]], valueText(sig, i)] as const);
    expect(mine.map(([t]) => t), `change times of ${path}`).toEqual(s.wave.map(([t]) => Number(t)));
    s.wave.forEach(([, v], i) => {
      const m = mine[i][1];
      if (/^[01]+$/.test(v) && net!.width > 1) expect(BigInt(`0b${m}`), `${path} change ${i}`).toBe(BigInt(`0b${v}`));
      else if (net!.width > 1) expect(m, `${path} change ${i}`).toContain(v);
      else expect(m, `${path} change ${i}`).toBe(v);
    });
  }
  return { theirs, ours };
}

const SCALARS = `$date today $end
$version hand-written for the cross-check $end
$timescale 1ns $end
$scope module rig $end
$var wire 1 ! strobe $end
$var reg 1 " latch $end
$var wire 1 # ready $end
$upscope $end
$enddefinitions $end
#0
$dumpvars
0!
x"
z#
$end
#3
1!
#4
0"
#9
0!
1#
#12
1"
0#
#15
`;

const VECTORS = `$timescale 100ps $end
$scope module rig $end
$var wire 8 % data [7:0] $end
$var reg 4 & nib [3:0] $end
$scope module sub $end
$var wire 16 ' word [15:0] $end
$upscope $end
$upscope $end
$enddefinitions $end
#0
$dumpvars
b00000000 %
b1010 &
b0000000000000000 '
$end
#5
b10100101 %
#7
b0110 &
b1111000011110000 '
#20
b1 %
b11 '
#22
bxxxxxxxx %
#30
`;

describe('midrail and vcd-parser read the same changes', () => {
  test('scalars 0, 1, x and z in a hand-written dump', async () => {
    const { ours } = await expectSameChanges(SCALARS);
    expect(ours.nets.map((n) => n.path)).toEqual(['rig.strobe', 'rig.latch', 'rig.ready']);
  });

  test('scalars with CR LF line ends', async () => {
    await expectSameChanges(SCALARS.replace(/\n/g, '\r\n'));
  });

  test('full-width and short binary vectors in nested scopes', async () => {
    const { ours } = await expectSameChanges(VECTORS);
    expect(ours.nets.map((n) => n.path)).toEqual(['rig.data', 'rig.nib', 'rig.sub.word']);
  });

  test('a clocked counter simulated by iverilog', async () => {
    const sim = await simulate(
      `
\`timescale 1ns/100ps
module top;
  reg clk = 0; reg rst = 1; reg [5:0] count; wire carry;
  assign #0.3 carry = &count;
  always #2.5 clk = ~clk;
  always @(posedge clk) count <= #0.4 rst ? 6'd0 : count + 6'd1;
  initial begin #7 rst = 0; #200 $finish; end
endmodule`,
      { dumpTop: 'top' },
    );
    const { theirs, ours } = await expectSameChanges(sim.text);
    // Every net has its own code here, so both readers list the same nets.
    expect(theirs.signal.length).toBe(ours.nets.length);
  });
});

describe('where vcd-parser 1.0.1 differs from IEEE 1364-2005, and what midrail does', () => {
  test('short vectors: it keeps the digits as written, midrail left-extends them (Table 18-1)', async () => {
    const theirs = (await vcdParser.parse(VECTORS)) as TheirDump;
    const ours = parseVcd(VECTORS);
    const data = theirs.signal.find((s) => s.refName === '%')!;
    expect(data.wave[2]).toEqual(['20', '1']);
    const sig = ours.signals[ours.nets[0].signal];
    expect(valueText(sig, 2)).toBe('00000001');
  });

  test('vectors holding x or z: it folds the whole value to one letter, midrail keeps every bit', async () => {
    const text = VECTORS.replace('bxxxxxxxx %', 'bz01x %');
    const theirs = (await vcdParser.parse(text)) as TheirDump;
    expect(theirs.signal.find((s) => s.refName === '%')!.wave[3]).toEqual(['22', 'z']);
    const ours = parseVcd(text);
    // z01x is 4 digits for an 8-bit net; a leading z extends with z (Table 18-1).
    expect(valueText(ours.signals[ours.nets[0].signal], 3)).toBe('zzzzz01x');
  });

  test('shared identifier codes: it keeps only the first $var of a code, midrail keeps every one (§18.2.1)', async () => {
    const text = SCALARS.replace('$upscope $end\n$enddefinitions', '$scope module tap $end\n$var wire 1 ! probe $end\n$upscope $end\n$upscope $end\n$enddefinitions');
    const theirs = (await vcdParser.parse(text)) as TheirDump;
    expect(theirs.signal.map((s) => s.name)).not.toContain('rig.tap.probe');
    const ours = parseVcd(text);
    const probe = ours.nets.find((n) => n.path === 'rig.tap.probe')!;
    expect(probe.signal).toBe(ours.nets[0].signal);
  });

  test('reals with a sign or an exponent: it rejects the dump, midrail reads the number (§18.2.1)', async () => {
    const text = `$timescale 1ps $end\n$scope module rig $end\n$var real 64 ( vref $end\n$upscope $end\n$enddefinitions $end\n#0\nr-1.25e-3 (\n#10\nr2.5E+2 (\n#20\n`;
    expect(await theirParse(text)).toHaveProperty('rejected');
    const ours = parseVcd(text);
    expect(Array.from(ours.signals[0].reals)).toEqual([-1.25e-3, 250]);
  });

  test('upper-case X and Z: it rejects the dump, midrail reads them as x and z (§18.2.1)', async () => {
    const text = SCALARS.replace('x"', 'X"').replace('z#', 'Z#');
    expect(await theirParse(text)).toHaveProperty('rejected');
    const ours = parseVcd(text);
    expect(valueText(ours.signals[1], 0)).toBe('x');
    expect(valueText(ours.signals[2], 0)).toBe('z');
  });

  test('$dumpoff, $dumpon and $dumpall in the body: it rejects the dump, midrail applies them (§18.2.3.9–11)', async () => {
    const text = SCALARS.replace('#9\n', '#9\n$dumpoff\nx!\nx"\nx#\n$end\n#10\n$dumpon\n0!\n0"\n1#\n$end\n#11\n$dumpall\n0!\n0"\n1#\n$end\n');
    expect(await theirParse(text)).toHaveProperty('rejected');
    const ours = parseVcd(text);
    expect(ours.dumpOff).toEqual([[9, 10]]);
  });
});
