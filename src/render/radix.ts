// Value text in a chosen radix. Input is the MSB-first bit text that model/lookup.valueText
// gives ('0', '1', 'x', 'z', or a VHDL state letter per bit).

import type { Signal } from '../model/dump';
import { valueText } from '../model/lookup';

export type Radix = 'hex' | 'bin' | 'unsigned' | 'signed' | 'ascii';
export const RADIXES: readonly Radix[] = ['hex', 'bin', 'unsigned', 'signed', 'ascii'];
export const RADIX_LABEL: Record<Radix, string> = {
  hex: 'hex',
  bin: 'binary',
  unsigned: 'unsigned',
  signed: 'signed',
  ascii: 'ASCII',
};

/** ASCII needs whole bytes. */
export function radixAllowed(radix: Radix, width: number): boolean {
  return radix !== 'ascii' || (width >= 8 && width % 8 === 0);
}

const isKnown = (c: string) => c === '0' || c === '1';
const bitOf = (c: string) => (c === '1' || c === 'H' ? '1' : c === '0' || c === 'L' ? '0' : c);

/**
 * One hex digit for up to four bits: the digit when all are 0/1, 'x' when all are x, 'z' when
 * all are z, and 'X' / 'Z' when only some are (so a partly unknown bus never reads as a number).
 */
function hexDigit(bits: string): string {
  let known = 0;
  let z = 0;
  let x = 0;
  for (const c of bits) {
    if (isKnown(c)) known++;
    else if (c === 'z') z++;
    else x++;
  }
  if (known === bits.length) return parseInt(bits, 2).toString(16);
  if (z === bits.length) return 'z';
  if (x === bits.length) return 'x';
  return z > 0 && x === 0 ? 'Z' : 'X';
}

/** Formats MSB-first bit text. Non-binary states make decimal radixes read 'x' or 'z'. */
export function formatBits(raw: string, radix: Radix): string {
  const bits = Array.from(raw, bitOf).join('');
  const width = bits.length;
  if (width === 0) return '';
  if (radix === 'bin') return bits;
  const allKnown = /^[01]+$/.test(bits);
  if (radix === 'hex') {
    let out = '';
    const lead = width % 4;
    if (lead) out += hexDigit(bits.slice(0, lead));
    for (let k = lead; k < width; k += 4) out += hexDigit(bits.slice(k, k + 4));
    return out;
  }
  if (!allKnown) return /^z+$/.test(bits) ? 'z' : 'x';
  const n = BigInt('0b' + bits);
  if (radix === 'unsigned') return n.toString(10);
  if (radix === 'signed') {
    const neg = bits[0] === '1';
    return (neg ? n - (1n << BigInt(width)) : n).toString(10);
  }
  // ascii: one character per byte, MSB byte first; non-printable bytes shown as a middle dot.
  if (width % 8 !== 0) return formatBits(raw, 'hex');
  let out = '';
  for (let k = 0; k < width; k += 8) {
    const code = parseInt(bits.slice(k, k + 8), 2);
    out += code >= 0x20 && code < 0x7f ? String.fromCharCode(code) : '·';
  }
  return out;
}

/** Display text of change i of a signal in a radix (reals and strings as written). */
export function formatChange(sig: Signal, i: number, radix: Radix): string {
  if (sig.kind === 'real') return formatReal(sig.reals[i]);
  if (sig.kind === 'string') return sig.texts.get(i) ?? '';
  if (sig.kind === 'event') return 'event';
  return formatBits(valueText(sig, i), radix);
}

/** Reals with up to 6 significant digits, engineering-friendly. */
export function formatReal(v: number): string {
  if (Number.isNaN(v)) return 'NaN';
  if (!Number.isFinite(v)) return v > 0 ? '+inf' : '-inf';
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e-3 && a < 1e6) return String(Number(v.toPrecision(6)));
  return v.toExponential(4);
}

/**
 * Reads a value typed for a search ("next time count = 0x1f"). Accepts 0x/0b/0d prefixes,
 * Verilog-style 'h/'b/'d, a bare number in the net's radix, or bit text with x/z.
 * Returns MSB-first bit text of the net's width, or null when the text is not a value.
 */
export function parseTypedValue(text: string, width: number, radix: Radix): string | null {
  let t = text.trim().replace(/_/g, '');
  if (t === '') return null;
  let base: 'hex' | 'bin' | 'dec' | 'ascii';
  let negative = false;
  const m = /^(?:\d+)?'([sS])?([hHbBdD])(.*)$/.exec(t);
  if (m) {
    base = m[2].toLowerCase() === 'h' ? 'hex' : m[2].toLowerCase() === 'b' ? 'bin' : 'dec';
    t = m[3];
  } else if (/^0[xX]/.test(t)) {
    base = 'hex';
    t = t.slice(2);
  } else if (/^0[bB]/.test(t)) {
    base = 'bin';
    t = t.slice(2);
  } else if (/^0[dD]/.test(t)) {
    base = 'dec';
    t = t.slice(2);
  } else if (radix === 'ascii') base = 'ascii';
  else base = radix === 'hex' ? 'hex' : radix === 'bin' ? 'bin' : 'dec';
  if (base === 'dec' && t.startsWith('-')) {
    negative = true;
    t = t.slice(1);
  }
  t = t.toLowerCase();
  let bits: string;
  if (base === 'ascii') {
    if (t.length === 0) return null;
    bits = Array.from(text.trim(), (ch) => (ch.charCodeAt(0) & 0xff).toString(2).padStart(8, '0')).join('');
  } else if (base === 'bin') {
    if (!/^[01xz]+$/.test(t)) return null;
    bits = t;
  } else if (base === 'hex') {
    if (!/^[0-9a-fxz]+$/.test(t)) return null;
    bits = Array.from(t, (c) => (c === 'x' || c === 'z' ? c.repeat(4) : parseInt(c, 16).toString(2).padStart(4, '0'))).join('');
  } else {
    if (!/^\d+$/.test(t)) return null;
    let n = BigInt(t);
    if (negative) n = (1n << BigInt(width)) - n;
    if (n < 0n || n >= 1n << BigInt(width)) return null;
    bits = n.toString(2);
  }
  if (bits.length > width) {
    // Extra leading zeros are fine; anything else does not fit.
    const extra = bits.slice(0, bits.length - width);
    if (/[^0]/.test(extra)) return null;
    bits = bits.slice(bits.length - width);
  }
  const fill = bits[0] === 'x' || bits[0] === 'z' ? bits[0] : '0';
  return bits.padStart(width, fill);
}
