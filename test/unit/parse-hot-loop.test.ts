// The parser reads most of a dump in a tight loop (VcdParser.bodyRun) and falls back to a
// token-at-a-time path near chunk ends and for anything unusual. Fed one byte at a time, only the
// fallback runs; fed whole, the loop does. These tests pin the two to the same result, for values
// (IEEE 1364-2005 §18.2.1, Table 18-1) and for errors (same line, byte offset and message), and
// pin the change log's slab machinery (tiny slabs: every boundary is crossed) to one big slab.
import { describe, expect, it } from 'vitest';
import { DumpBuilder } from '../../src/model/builder';
import type { Dump } from '../../src/model/dump';
import { VcdError, VcdParser } from '../../src/parse/vcd';
import { REALS, contents, variedDump } from './varied-dump';

const encoder = new TextEncoder();

function parse(text: string, feed: 'whole' | 'bytes' | number, storage: { slabShift?: number } = {}): Dump {
  const bytes = encoder.encode(text);
  const p = new VcdParser('hot.vcd', {}, storage);
  const step = feed === 'whole' ? bytes.length : feed === 'bytes' ? 1 : feed;
  for (let i = 0; i < bytes.length; i += step) p.push(bytes.subarray(i, i + step));
  return p.finish();
}

describe('the hot loop reads a dump exactly as the token-at-a-time path does', () => {
  const text = variedDump();

  it('has a body long enough that the loop runs', () => {
    expect(text.length).toBeGreaterThan(4000);
  });

  it('gives the same dump fed whole, one byte at a time, and in odd-sized chunks', () => {
    const whole = contents(parse(text, 'whole'));
    expect(contents(parse(text, 'bytes'))).toEqual(whole);
    for (const size of [63, 64, 65, 97, 1000]) expect(contents(parse(text, size))).toEqual(whole);
  });

  it('gives the same dump with CRLF line ends', () => {
    const crlf = variedDump('\r\n');
    expect(contents(parse(crlf, 'whole'))).toEqual(contents(parse(crlf, 'bytes')));
  });

  it('reads every real exactly as Number() reads its text', () => {
    const vars = REALS.map((_, i) => `$var real 64 r${i} v${i} $end`).join('\n');
    const body = ['#0', ...REALS.map((r, i) => `r${r} r${i}`), '#1', ...REALS.map((r, i) => `r${r} r${i}`)].join('\n');
    const filler = '$comment ' + 'pad '.repeat(40) + '$end\n';
    const d = parse(`${vars}\n$enddefinitions $end\n${filler}${body}\n#2\n`, 'whole');
    const expected = REALS.map((r) => (r === 'nan' ? Number.NaN : r === 'inf' ? Infinity : r === '-inf' ? -Infinity : Number(r)));
    expect(d.signals.map((s) => s.reals[1])).toEqual(expected);
    for (let i = 0; i < REALS.length; i++) expect(Object.is(d.signals[i].reals[0], expected[i])).toBe(true);
  });
});

describe('errors found by the hot loop name the same line, byte and expectation', () => {
  const head = '$timescale 1ns $end\n$scope module top $end\n$var wire 1 ! a $end\n$var wire 4 " v [3:0] $end\n$var real 64 # r $end\n$upscope $end\n$enddefinitions $end\n';
  const lead = Array.from({ length: 40 }, (_, k) => `#${k}\n${k % 2}!\nb${(k % 16).toString(2)} "\nr${k}.5 #`).join('\n') + '\n';
  const cases: Array<[string, string]> = [
    ['unknown code', '#100\n1?\n'],
    ['unknown two-character code', '#100\n1?? \n'],
    ['time going backwards', '#100\n1!\n#99\n'],
    ['a value wider than its net', '#100\nb10101 "\n'],
    ['a bad vector digit', '#100\nb10q1 "\n'],
    ['a real on a logic net', '#100\nr1.5 !\n'],
    ['a vector on a real net', '#100\nb101 #\n'],
    ['a malformed real', '#100\nr1.5.5 #\n'],
    ['a scalar on a real net', '#100\n1#\n'],
    ['a value without its code', '#100\n1 !\n'],
    ['a timestamp that is not a number', '#100\n#12a\n'],
    ['a timestamp inside $dumpvars', '#100\n$dumpvars\n1!\n#101\n'],
    ['binary junk', '#100\n1!\n\u0001\u0002'],
    ['a stray word', '#100\nhello\n'],
  ];
  for (const [what, tail] of cases) {
    it(what, () => {
      const text = head + lead + tail;
      const failure = (feed: 'whole' | 'bytes'): string => {
        try {
          parse(text, feed);
        } catch (err) {
          expect(err).toBeInstanceOf(VcdError);
          const e = err as VcdError;
          return `${e.line}@${e.offset}: ${e.message}`;
        }
        return 'no error';
      };
      const whole = failure('whole');
      expect(whole).not.toBe('no error');
      expect(whole).toBe(failure('bytes'));
    });
  }
});

describe('change-log slabs (tiny slabs reach every boundary)', () => {
  it('give the same dump as one big slab, for every kind of change', () => {
    const text = variedDump();
    const big = contents(parse(text, 'whole'));
    for (const slabShift of [2, 3, 5]) expect(contents(parse(text, 'whole', { slabShift }))).toEqual(big);
  });

  it('drop a cut-off last step that spans several slabs', () => {
    const head = '$timescale 1ns $end\n$var wire 1 ! a $end\n$var wire 40 " v [39:0] $end\n$var real 64 # r $end\n$enddefinitions $end\n';
    let body = '#0\n0!\nb0 "\nr0 #\n#5\n';
    for (let k = 0; k < 30; k++) body += `${"01z"[k % 3]}!\nb${k % 4 === 3 ? 'x' : ''}${k.toString(2)} "\nr${k} #\n`;
    const cut = head + body + '1!\nb1'; // ends mid-value
    const big = parse(cut, 'whole');
    expect(big.truncated).toBe(true);
    expect(big.signals[0].count).toBe(1);
    for (const slabShift of [2, 3, 4]) expect(contents(parse(cut, 'whole', { slabShift }))).toEqual(contents(big));
  });

  it('keep signal indexes beyond 16,383, also when signals are added in the middle of a 16-bit slab', () => {
    const b = new DumpBuilder('many.vcd', { slabShift: 3 });
    b.addSignal('logic', 1);
    b.setTime(0);
    for (let k = 0; k < 20; k++) b.pushLogic(0, k % 2);
    for (let k = 1; k <= 70_000; k++) b.addSignal('logic', 1);
    b.setTime(10);
    for (let k = 0; k < 20; k++) {
      b.pushLogic(70_000 - k, 1);
      b.pushLogic(0, k % 2);
    }
    const d = b.finish(0, false);
    expect(d.signals[0].count).toBe(40);
    expect(Array.from(d.signals[0].logic)).toEqual(Array.from({ length: 40 }, (_, k) => k % 2));
    expect(Array.from(d.signals[0].timeIndex)).toEqual(Array.from({ length: 40 }, (_, k) => (k < 20 ? 0 : 1)));
    for (let k = 0; k < 20; k++) {
      const s = d.signals[70_000 - k];
      expect([s.count, s.timeIndex[0], s.logic[0]]).toEqual([1, 1, 1]);
    }
    expect(d.signals[69_980].count).toBe(0);
    expect(d.signals.reduce((n, s) => n + s.count, 0)).toBe(60);
  });
});
