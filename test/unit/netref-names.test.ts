// Naming nets as users type them: full path, unique suffix, bits, globs with literal brackets.
import { describe, expect, it } from 'vitest';
import { NetLookupError, bitSignal, resolveNet, resolveNetList } from '../../src/model/netref';
import { valueText } from '../../src/model/lookup';
import { parseVcd } from '../../src/parse/vcd';

const d = parseVcd(`$timescale 1ns $end
$scope module tb $end
$var wire 1 ! clk $end
$scope module dut $end
$var wire 1 ! clk $end
$var wire 8 " data [7:0] $end
$scope module g_bit[5] $end
$var wire 1 # y $end
$upscope $end
$scope module g_bit[6] $end
$var wire 1 $ y $end
$upscope $end
$upscope $end
$upscope $end
$enddefinitions $end
#0
0!
b10100101 "
0#
1$
`);

describe('resolveNet', () => {
  it('takes a full path or a unique suffix', () => {
    expect(resolveNet(d, 'tb.dut.data').label).toBe('tb.dut.data');
    expect(resolveNet(d, 'data').label).toBe('tb.dut.data');
  });
  it('treats a port and the wire it connects (one identifier code) as one net, not an ambiguity', () => {
    expect(resolveNet(d, 'clk').label).toBe('tb.clk');
  });
  it('refuses a suffix that names two different nets, listing them', () => {
    expect(() => resolveNet(d, 'y')).toThrow(NetLookupError);
    expect(() => resolveNet(d, 'y')).toThrow(/ambiguous: it matches 2 nets \(tb\.dut\.g_bit\[5\]\.y, tb\.dut\.g_bit\[6\]\.y\)/);
  });
  it('addresses bit 0 as the rightmost character of a [7:0] value (IEEE 1364 §18.2.3.7 ranges are msb first)', () => {
    const ref = resolveNet(d, 'data[0]');
    expect(ref.label).toBe('tb.dut.data[0]');
    const bit = bitSignal(d, ref);
    expect(valueText(bit, 0)).toBe('1');
    expect(valueText(bitSignal(d, resolveNet(d, 'data[1]')), 0)).toBe('0');
    expect(() => resolveNet(d, 'data[8]')).toThrow(/bit 8 is outside net 'tb.dut.data' \(declared \[7:0\]\)/);
  });
});

describe('resolveNetList', () => {
  it('keeps brackets literal in globs, so g_bit[5].y names exactly that net', () => {
    expect(resolveNetList(d, 'g_bit[5].y').map((r) => r.label)).toEqual(['tb.dut.g_bit[5].y']);
    expect(resolveNetList(d, 'tb.dut.g_bit[?].y').map((r) => r.label)).toEqual(['tb.dut.g_bit[5].y', 'tb.dut.g_bit[6].y']);
  });
  it('says when a pattern matches nothing', () => {
    expect(() => resolveNetList(d, 'nope*')).toThrow(/the pattern 'nope\*' matches no net/);
  });
});
