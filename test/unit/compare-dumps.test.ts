// Comparing two dumps of one stimulus: per-net edge shifts and the first value difference that
// outlasts the tolerance. The "new" run below is the base run with every change of y delayed by
// 2 ns, plus one functional difference on z; figures follow from that by hand.
import { describe, expect, it } from 'vitest';
import { compareDumps } from '../../src/compare/index';
import { parseVcd } from '../../src/parse/vcd';

const HEAD = (extra = '') => `$timescale 1ns $end
$scope module top $end
$var wire 1 ! a $end
$var wire 1 " y $end
$var wire 1 # z $end
$var wire 4 $ bus [3:0] $end
${extra}$upscope $end
$enddefinitions $end
`;

const base = parseVcd(
  `${HEAD()}#0
0! 0" 0# b0000 $
#10 1! 1" b0001 $
#20 0! 0" b0011 $
#30 1! 1" 1#
#40 0! 0" 0#
#60
`,
  'rtl.vcd',
);

const next = parseVcd(
  `${HEAD('$var wire 1 % extra $end\n')}#0
0! 0" 0# b0000 $ 0%
#10 1! b0001 $
#12 1"
#20 0! b0011 $
#22 0"
#30 1! 1#
#32 1"
#40 0!
#42 0"
#45 0#
#60
`,
  'gate.vcd',
);

describe('comparing two runs', () => {
  it('reports each net in both dumps with its shift', () => {
    const r = compareDumps(base, next);
    const y = r.nets.find((n) => n.net === 'top.y')!;
    expect([y.matched, y.added, y.missing]).toEqual([4, 0, 0]);
    expect(y.mean_shift_s).toBeCloseTo(2e-9, 18);
    expect(y.min_shift_s).toBeCloseTo(2e-9, 18);
    expect(y.max_shift_s).toBeCloseTo(2e-9, 18);
    const a = r.nets.find((n) => n.net === 'top.a')!;
    expect(a.mean_shift_s).toBe(0);
    expect(a.first_difference_s).toBeNull();
    const bus = r.nets.find((n) => n.net === 'top.bus')!;
    expect(bus.matched).toBe(2);
    expect(r.only_in_new).toEqual(['top.extra']);
  });

  it('finds the first difference at y when there is no tolerance', () => {
    const r = compareDumps(base, next);
    expect(r.first_difference).toEqual({ net: 'top.y', time_s: 10e-9, duration_s: 2e-9, base_value: '1', new_value: '0' });
  });

  it('ignores differences no longer than the tolerance and finds the lasting one', () => {
    const r = compareDumps(base, next, { toleranceS: 2e-9 });
    const y = r.nets.find((n) => n.net === 'top.y')!;
    expect(y.first_difference_s).toBeNull();
    // z falls at 40 in the base run and at 45 in the new one: a 5 ns difference.
    expect(r.first_difference).toEqual({ net: 'top.z', time_s: 40e-9, duration_s: 5e-9, base_value: '0', new_value: '1' });
    expect(compareDumps(base, next, { toleranceS: 5e-9 }).first_difference).toBeNull();
  });

  it('compares only the nets asked for, bits included', () => {
    const r = compareDumps(base, next, { nets: 'y,bus[1]' });
    expect(r.nets.map((n) => n.net)).toEqual(['top.y', 'top.bus[1]']);
    expect(r.nets[1].matched).toBe(1);
    expect(r.only_in_new).toEqual([]);
  });

  it('refuses to compare a net whose width changed', () => {
    const wide = parseVcd(`$timescale 1ns $end\n$var wire 8 $ bus [7:0] $end\n$enddefinitions $end\n#0\nb0 $\n`, 'w.vcd');
    const narrow = parseVcd(`$timescale 1ns $end\n$var wire 4 $ bus [3:0] $end\n$var wire 1 ! a $end\n$enddefinitions $end\n#0\nb0 $\n0!\n`, 'n.vcd');
    expect(() => compareDumps(wide, narrow)).toThrow(/no net is present in both/);
    const both = parseVcd(`$timescale 1ns $end\n$var wire 4 $ bus [3:0] $end\n$var wire 1 ! a $end\n$enddefinitions $end\n#0\nb0 $\n0!\n`, 'b.vcd');
    const wider = parseVcd(`$timescale 1ns $end\n$var wire 8 $ bus [7:0] $end\n$var wire 1 ! a $end\n$enddefinitions $end\n#0\nb0 $\n0!\n`, 'c.vcd');
    expect(compareDumps(both, wider).incomparable).toEqual([{ net: 'bus', reason: '4 bits wide in the base dump but 8 in the new one' }]);
  });

  it('compares each bit of a vector on its own when asked', () => {
    const r = compareDumps(base, next, { nets: 'bus', bits: true });
    expect(r.nets.map((n) => n.net)).toEqual(['top.bus[3]', 'top.bus[2]', 'top.bus[1]', 'top.bus[0]']);
    // bus goes 0000 → 0001 at 10 ns → 0011 at 20 ns in both runs: bit 0 rises once, bit 1 once.
    expect(r.nets.map((n) => n.matched)).toEqual([0, 0, 1, 1]);
  });
});
