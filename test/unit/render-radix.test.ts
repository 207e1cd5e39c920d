// Value text in each radix, and reading typed values. Sources: two's complement for signed
// values (IEEE 1364-2005 §4.1.5, integers and signed vectors are two's complement, from
// memory); Verilog number literals 'h / 'b / 'd (IEEE 1364-2005 §3.5.1); ASCII codes
// (ANSI X3.4). Hex digits of partly unknown groups are a choice of midrail's own.

import { describe, expect, it } from 'vitest';
import { formatBits, parseTypedValue, radixAllowed } from '../../src/render/radix';

describe('formatBits', () => {
  it('writes known buses in every radix', () => {
    expect(formatBits('11110110', 'hex')).toBe('f6');
    expect(formatBits('11110110', 'bin')).toBe('11110110');
    expect(formatBits('11110110', 'unsigned')).toBe('246');
    expect(formatBits('11110110', 'signed')).toBe('-10'); // 246 − 256
    expect(formatBits('01000001', 'ascii')).toBe('A'); // 0x41
    expect(formatBits('0100100001101001', 'ascii')).toBe('Hi');
    expect(formatBits('00000111', 'ascii')).toBe('·'); // BEL is not printable
  });

  it('pads the leading hex digit of widths that are not a multiple of four', () => {
    expect(formatBits('101', 'hex')).toBe('5');
    expect(formatBits('100000', 'hex')).toBe('20');
  });

  it('keeps wide buses exact (beyond 2^53)', () => {
    const bits = '1' + '0'.repeat(63) + '1'; // 2^64 + 1
    expect(formatBits(bits, 'unsigned')).toBe('18446744073709551617');
    expect(formatBits('1'.repeat(70), 'signed')).toBe('-1');
  });

  it('never shows a number for a bus with x or z bits', () => {
    expect(formatBits('xxxx0101', 'hex')).toBe('x5');
    expect(formatBits('zzzz0101', 'hex')).toBe('z5');
    expect(formatBits('x1010101', 'hex')).toBe('X5');
    expect(formatBits('0z000000', 'hex')).toBe('Z0');
    expect(formatBits('0x01', 'unsigned')).toBe('x');
    expect(formatBits('zzzz', 'signed')).toBe('z');
  });

  it('reads VHDL weak levels as their values', () => {
    expect(formatBits('HL', 'bin')).toBe('10');
    expect(formatBits('HHLL', 'hex')).toBe('c');
  });
});

describe('radixAllowed', () => {
  it('offers ASCII only for whole bytes', () => {
    expect(radixAllowed('ascii', 8)).toBe(true);
    expect(radixAllowed('ascii', 16)).toBe(true);
    expect(radixAllowed('ascii', 12)).toBe(false);
    expect(radixAllowed('hex', 3)).toBe(true);
  });
});

describe('parseTypedValue', () => {
  it('reads prefixes and Verilog literals', () => {
    expect(parseTypedValue('0x41', 8, 'bin')).toBe('01000001');
    expect(parseTypedValue("8'h41", 8, 'bin')).toBe('01000001');
    expect(parseTypedValue("'b101", 8, 'hex')).toBe('00000101');
    expect(parseTypedValue("'d65", 8, 'hex')).toBe('01000001');
    expect(parseTypedValue('0b1_0000_0001', 9, 'hex')).toBe('100000001');
  });

  it('reads a bare number in the lane radix', () => {
    expect(parseTypedValue('41', 8, 'hex')).toBe('01000001');
    expect(parseTypedValue('41', 8, 'unsigned')).toBe('00101001');
    expect(parseTypedValue('-1', 8, 'signed')).toBe('11111111');
    expect(parseTypedValue('A', 8, 'ascii')).toBe('01000001');
  });

  it('keeps x and z, extending a leading x or z to the left (IEEE 1364 §3.5.1)', () => {
    expect(parseTypedValue('x', 4, 'bin')).toBe('xxxx');
    expect(parseTypedValue("'hz", 8, 'hex')).toBe('zzzzzzzz');
    expect(parseTypedValue('1x', 4, 'bin')).toBe('001x');
  });

  it('refuses values that do not fit or are not numbers', () => {
    expect(parseTypedValue('0x1ff', 8, 'hex')).toBeNull();
    expect(parseTypedValue('256', 8, 'unsigned')).toBeNull();
    expect(parseTypedValue('0xg', 8, 'hex')).toBeNull();
    expect(parseTypedValue('', 8, 'hex')).toBeNull();
    expect(parseTypedValue('0x001', 8, 'hex')).toBe('00000001');
  });
});
