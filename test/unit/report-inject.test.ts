// Formula-injection guard, checked against OWASP "CSV Injection" (www-community attacks page):
// cells beginning with = + - @, tab, CR or LF must be neutralised; OWASP's recipe prefixes a single
// quote, wraps the field in double quotes and doubles embedded quotes.

import { describe, expect, it } from 'vitest';
import { csvField, neutralizeText } from '../../src/report';

describe('neutralizeText', () => {
  it('prefixes an apostrophe to text starting with any OWASP trigger character', () => {
    for (const t of ['=HYPERLINK("x")', '+1', '-2+3', '@SUM(A1)', '\tx', '\rx', '\nx']) {
      expect(neutralizeText(t), JSON.stringify(t)).toBe(`'${t}`);
    }
  });

  it('catches a trigger hidden behind leading spaces', () => {
    expect(neutralizeText('  =1+2')).toBe("'  =1+2");
  });

  it('leaves ordinary net names alone', () => {
    for (const t of ['top.clk', 'top.bus[3]', 'g_bit[5].y', 'a=b', 'x-1', '']) expect(neutralizeText(t)).toBe(t);
  });
});

describe('csvField', () => {
  it('turns the OWASP example =1+2";=1+2 into "\'=1+2"";=1+2"', () => {
    expect(csvField('=1+2";=1+2')).toBe(`"'=1+2"";=1+2"`);
  });

  it('writes numbers bare, negative ones included, and null as an empty field', () => {
    expect(csvField(-1.2e-10)).toBe('-1.2e-10');
    expect(csvField(2e-9)).toBe('2e-9');
    expect(csvField(null)).toBe('');
    expect(csvField(Number.NaN)).toBe('');
  });
});
