// Every class of bad input gets a clear error naming line, byte offset and what was expected;
// a cut-off dump loads up to its last complete timestamp with a warning.
import { describe, expect, it } from 'vitest';
import { VcdError, VcdParser, parseVcd } from '../../src/parse/vcd';

const HEAD = '$timescale 1ns $end\n$scope module top $end\n$var wire 1 ! a $end\n$var wire 4 " v [3:0] $end\n$upscope $end\n$enddefinitions $end\n';

function errorOf(text: string | Uint8Array, limits = {}): VcdError {
  try {
    parseVcd(text, 'bad.vcd', limits);
  } catch (err) {
    expect(err).toBeInstanceOf(VcdError);
    return err as VcdError;
  }
  throw new Error('expected a VcdError');
}

describe('bad input is reported with its place and what was expected', () => {
  it('unknown identifier code', () => {
    const e = errorOf(HEAD + '#0\n0!\n1?\n');
    expect([e.line, e.offset]).toEqual([9, HEAD.length + 6]);
    expect(e.message).toBe(`bad.vcd: line 9, byte ${HEAD.length + 6}: unknown identifier code '?'; expected a code declared by a $var line`);
  });

  it('time going backwards', () => {
    const e = errorOf(HEAD + '#10\n1!\n#5\n0!\n');
    expect(e.line).toBe(9);
    expect(e.message).toMatch(/time goes backwards from #10 to #5; expected timestamps in increasing order/);
  });

  it('a value wider than its net', () => {
    const e = errorOf(HEAD + '#0\nb10101 "\n');
    expect(e.line).toBe(8);
    expect(e.message).toMatch(/value of 5 bits for net 'top.v' of 4 bit\(s\)/);
  });

  it('leading zeros beyond the width are not an error', () => {
    expect(() => parseVcd(HEAD + '#0\nb000101 "\n')).not.toThrow();
  });

  it('a missing $enddefinitions', () => {
    const e = errorOf('$timescale 1ns $end\n$var wire 1 ! a $end\n#0\n0!\n');
    expect(e.line).toBe(3);
    expect(e.message).toMatch(/timestamp '#0' before \$enddefinitions; expected \$enddefinitions \$end/);
    expect(errorOf('$timescale 1ns $end\n$var wire 1 ! a $end\n').message).toMatch(/file ends before \$enddefinitions/);
  });

  it('binary junk', () => {
    const junk = new Uint8Array([...new TextEncoder().encode(HEAD + '#0\n'), 0x00, 0xff, 0x13, 0x37]);
    const e = errorOf(junk);
    expect(e.offset).toBe(HEAD.length + 3);
    expect(e.message).toMatch(/unexpected byte 0x00 \(binary data\?\)/);
    const png = errorOf(new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]));
    expect(png.message).toMatch(/line 1, byte 0: .*outside a declaration command|unexpected byte/);
  });

  it('a scalar value on a real net, and a real value on a logic net', () => {
    expect(errorOf('$var real 64 ! r $end\n$enddefinitions $end\n#0\n1!\n').message).toMatch(/scalar value for real net 'r'/);
    expect(errorOf(HEAD + '#0\nr1.5 !\n').message).toMatch(/real value for logic net 'top.a'/);
  });

  it('a bad value digit and a bad real', () => {
    expect(errorOf(HEAD + '#0\nb10q1 "\n').message).toMatch(/'q' is not a value digit/);
    expect(errorOf('$var real 64 ! r $end\n$enddefinitions $end\n#0\nr1.2.3 !\n').message).toMatch(/real value '1.2.3' is not a number/);
  });

  it('a declaration after $enddefinitions', () => {
    expect(errorOf(HEAD + '#0\n$var wire 1 # b $end\n').message).toMatch(/declaration command \$var after \$enddefinitions/);
  });

  it('extended VCD ports are refused with a reason', () => {
    expect(errorOf('$var port [3:0] <0 p $end\n$enddefinitions $end\n').message).toMatch(/extended VCD/);
  });

  it('each cap has its own error', () => {
    expect(errorOf(HEAD + '#0\n' + 'x'.repeat(200) + '\n', { maxLineBytes: 100 }).message).toMatch(/line is longer than 100 bytes/);
    expect(errorOf('$var wire 1 ' + 'c'.repeat(20) + ' a $end\n$enddefinitions $end\n', { maxCodeBytes: 10 }).message).toMatch(/identifier code is 20 characters long, over the limit of 10/);
    expect(errorOf('$var wire 4096 ! a $end\n$enddefinitions $end\n', { maxVectorWidth: 1024 }).message).toMatch(/4096 bits wide, over the limit of 1024/);
    expect(errorOf('$var wire 1 ! a $end\n$var wire 1 " b $end\n$var wire 1 # c $end\n$enddefinitions $end\n', { maxNets: 2 }).message).toMatch(/more than 2 \$var declarations/);
  });

  it('a code redeclared with another width', () => {
    expect(errorOf('$var wire 1 ! a $end\n$var wire 8 ! b $end\n$enddefinitions $end\n').message).toMatch(/declared again as vector of 8 bit\(s\), first as logic of 1/);
  });
});

describe('a cut-off dump (simulation still running or killed)', () => {
  it('loads up to the last complete timestamp and warns with the line', () => {
    const d = parseVcd(HEAD + '#0\n0!\nb0000 "\n#10\n1!\nb1111 "\n#20\n0!\nb01');
    expect(d.truncated).toBe(true);
    const a = d.signals[0];
    expect(a.count).toBe(2); // the changes at #20 are dropped as possibly incomplete
    expect(d.warnings.at(-1)!.message).toMatch(/dump is cut off at line 15: the file ends in the middle of a line; loaded up to #20 \(line 13\)/);
  });

  it('keeps the last step when the cut falls inside the next timestamp', () => {
    const d = parseVcd(HEAD + '#0\n0!\n#10\n1!\n#2');
    expect(d.truncated).toBe(true);
    expect(d.signals[0].count).toBe(2);
    expect(d.endTick).toBe(10);
  });

  it('treats an unclosed $dumpvars as cut off', () => {
    const d = parseVcd(HEAD + '#0\n$dumpvars\n0!\n');
    expect(d.truncated).toBe(true);
    expect(d.warnings.at(-1)!.message).toMatch(/inside the \$dumpvars section opened at line 8/);
  });

  it('a complete dump is not flagged', () => {
    expect(parseVcd(HEAD + '#0\n0!\n#10\n').truncated).toBe(false);
  });

  it('an error leaves an earlier parse untouched (each parser owns its data)', () => {
    const good = parseVcd(HEAD + '#0\n1!\n');
    expect(() => new VcdParser('b.vcd').push(new TextEncoder().encode(HEAD + '#0\n1?\n'))).toThrow(VcdError);
    expect(good.signals[0].count).toBe(1);
  });
});
