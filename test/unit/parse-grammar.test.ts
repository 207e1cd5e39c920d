// Grammar of the four-state VCD file, IEEE 1364-2005 clause 18 (sub-clauses named per test).
import { describe, expect, it } from 'vitest';
import type { Dump } from '../../src/model/dump';
import { changeInEffectAt, changeTick, firstChangeAtOrAfter, valueText, valueTextAt } from '../../src/model/lookup';
import { resolveNet } from '../../src/model/netref';
import { VcdParser, parseVcd } from '../../src/parse/vcd';

function header(vars: string, timescale = '1 ns'): string {
  return `$date today $end\n$version hand-written $end\n$timescale ${timescale} $end\n$scope module top $end\n${vars}\n$upscope $end\n$enddefinitions $end\n`;
}

/** Every change of a net as `tick:value`. */
function history(d: Dump, name: string): string[] {
  const net = resolveNet(d, name).net;
  const sig = d.signals[net.signal];
  const out: string[] = [];
  for (let i = 0; i < sig.count; i++) out.push(`${changeTick(d, sig, i)}:${valueText(sig, i)}`);
  return out;
}

describe('$timescale (§18.2.3.5)', () => {
  const cases: Array<[string, number]> = [
    ['1ns', 1e-9],
    ['1 ns', 1e-9],
    ['100ps', 100e-12],
    ['10 us', 10e-6],
    ['1 fs', 1e-15],
    ['1s', 1],
    ['10\nms', 10e-3],
  ];
  for (const [text, seconds] of cases) {
    it(`reads '${text.replace('\n', '\\n')}' as ${seconds} s per tick`, () => {
      const d = parseVcd(header('$var wire 1 ! a $end', text) + '#0\n0!\n');
      expect(d.timescale.seconds).toBeCloseTo(seconds, 20);
      expect(d.warnings).toEqual([]);
    });
  }
  it('accepts a non-standard number with a warning', () => {
    const d = parseVcd(header('$var wire 1 ! a $end', '5 ns') + '#0\n0!\n');
    expect(d.timescale.seconds).toBeCloseTo(5e-9, 20);
    expect(d.warnings[0].message).toMatch(/not 1, 10 or 100/);
  });
  it('rejects a unit it does not know, naming the line', () => {
    expect(() => parseVcd(header('$var wire 1 ! a $end', '1 ks') + '#0\n')).toThrow(/line 3, byte \d+: cannot read \$timescale '1 ks'/);
  });
});

describe('$scope and $upscope (§18.2.3.4, §18.2.3.6)', () => {
  it('builds dotted paths for every scope kind, including ones SystemVerilog tools add', () => {
    const kinds = ['module', 'task', 'function', 'begin', 'fork', 'interface', 'package', 'struct'];
    let vars = '';
    for (const k of kinds) vars += `$scope ${k} s_${k} $end\n$var wire 1 ${k[0]}${k.length} n $end\n$upscope $end\n`;
    const d = parseVcd(header(vars) + '#0\n');
    expect(d.scopes.map((s) => `${s.kind}:${s.path}`)).toEqual(['module:top', ...kinds.map((k) => `${k}:top.s_${k}`)]);
    expect(d.nets.map((n) => n.path)).toEqual(kinds.map((k) => `top.s_${k}.n`));
  });
  it('reports $upscope without an open scope', () => {
    expect(() => parseVcd('$upscope $end\n$enddefinitions $end\n')).toThrow(/line 1, byte 0: \$upscope without an open \$scope/);
  });
});

describe('$var (§18.2.3.7)', () => {
  it('reads every var type with its size, and ranges glued or separate', () => {
    const types = ['event', 'integer', 'parameter', 'real', 'realtime', 'reg', 'supply0', 'supply1', 'time', 'tri', 'triand', 'trior', 'trireg', 'tri0', 'tri1', 'wand', 'wire', 'wor'];
    let vars = '';
    types.forEach((t, i) => {
      const size = t === 'integer' ? 32 : t === 'time' ? 64 : t.startsWith('real') ? 64 : 1;
      vars += `$var ${t} ${size} c${i} v_${t} $end\n`;
    });
    vars += '$var wire 8 B0 bus [7:0] $end\n$var wire 8 B1 gbus[7:0] $end\n$var reg 1 B2 bit [3] $end\n$var reg 4 B3 rev [0:3] $end\n';
    const d = parseVcd(header(vars) + '#0\n');
    expect(d.nets).toHaveLength(types.length + 4);
    const bus = resolveNet(d, 'top.bus').net;
    const gbus = resolveNet(d, 'top.gbus').net;
    expect([bus.width, bus.msb, bus.lsb, bus.ranged]).toEqual([8, 7, 0, true]);
    expect([gbus.path, gbus.width, gbus.msb, gbus.lsb]).toEqual(['top.gbus', 8, 7, 0]);
    expect(resolveNet(d, 'top.bit').net.msb).toBe(3);
    expect(resolveNet(d, 'top.rev').net.msb).toBe(0);
    expect(d.signals[resolveNet(d, 'v_real').net.signal].kind).toBe('real');
    expect(d.signals[resolveNet(d, 'v_event').net.signal].kind).toBe('event');
    expect(d.signals[resolveNet(d, 'v_integer').net.signal].kind).toBe('vector');
  });

  it('shares one signal between aliases declared with the same code (§18.2.1)', () => {
    const d = parseVcd(header('$var wire 1 ! a $end\n$scope module sub $end\n$var wire 1 ! a_in $end\n$upscope $end') + '#0\n0!\n#3\n1!\n');
    expect(history(d, 'top.a')).toEqual(['0:0', '3:1']);
    expect(history(d, 'top.sub.a_in')).toEqual(['0:0', '3:1']);
    expect(d.changes).toBe(2);
  });

  it('accepts identifier codes of any printable characters, __proto__ included', () => {
    const codes = ['!', '~', '$', '#', '%%', '__proto__', 'constructor', 'abc', '{}[]()'];
    const vars = codes.map((c, i) => `$var wire 1 ${c} n${i} $end`).join('\n');
    const body = '#0\n' + codes.map((c, i) => `${i % 2}${c}`).join('\n') + '\n';
    const d = parseVcd(header(vars) + body);
    codes.forEach((_, i) => expect(history(d, `top.n${i}`)).toEqual([`0:${i % 2}`]));
  });
});

describe('value changes (§18.2.1, §18.2.2, Table 18-1)', () => {
  it('reads scalars 0/1/x/z in either case', () => {
    const d = parseVcd(header('$var wire 1 ! a $end') + '#0\n0!\n#1\n1!\n#2\nX!\n#3\nz!\n#4\nZ!\n#5\nx!\n');
    expect(history(d, 'a')).toEqual(['0:0', '1:1', '2:x', '3:z', '4:z', '5:x']);
  });

  it('left-extends short vectors: 0 and 1 with 0, x with x, z with z', () => {
    const d = parseVcd(header('$var wire 4 ! v [3:0] $end') + '#0\nb1 !\n#1\nb10 !\n#2\nbx1 !\n#3\nbz !\n#4\nB1X0Z !\n#5\nb0 !\n');
    expect(history(d, 'v')).toEqual(['0:0001', '1:0010', '2:xxx1', '3:zzzz', '4:1x0z', '5:0000']);
  });

  it('packs wide vectors over several words', () => {
    const v = '1' + '0'.repeat(62) + 'x';
    const d = parseVcd(header('$var wire 64 ! w [63:0] $end\n$var wire 100 " h [99:0] $end') + `#0\nb${v} !\nbz1 "\n`);
    expect(history(d, 'w')).toEqual([`0:${v}`]);
    expect(history(d, 'h')).toEqual([`0:${'z'.repeat(99)}1`]);
  });

  it('reads reals with sign and exponent', () => {
    const d = parseVcd(header('$var real 64 ! r $end') + '#0\nr0 !\n#1\nr-1.25e-3 !\n#2\nR3.5E+2 !\n#3\nr.5 !\n');
    expect(history(d, 'r')).toEqual(['0:0', '1:-0.00125', '2:350', '3:0.5']);
  });

  it('keeps VHDL states U W L H - as written, upper case', () => {
    const d = parseVcd(header('$var wire 1 ! s $end\n$var wire 4 " v [3:0] $end') + '#0\nU!\nbUUUU "\n#1\nh!\nb01LH "\n#2\n-!\nb1W-0 "\n');
    expect(history(d, 's')).toEqual(['0:U', '1:H', '2:-']);
    expect(history(d, 'v')).toEqual(['0:UUUU', '1:01LH', '2:1W-0']);
  });

  it('keeps several changes of one net at one timestamp, in file order', () => {
    const d = parseVcd(header('$var wire 1 ! g $end') + '#0\n0!\n#10\n1!\n0!\n#20\n1!\n');
    expect(history(d, 'g')).toEqual(['0:0', '10:1', '10:0', '20:1']);
    expect(d.changes).toBe(4);
  });

  it('accepts CRLF line ends and tabs', () => {
    const text = header('$var wire 1 ! a $end').replace(/\n/g, '\r\n').replace(/ /g, '\t') + '#0\r\n0!\r\n#7\r\n1!\r\n';
    const d = parseVcd(text);
    expect(history(d, 'a')).toEqual(['0:0', '7:1']);
  });

  it('stores string values as text', () => {
    const d = parseVcd(header('$var string 1 ! msg $end') + '#0\nsidle !\n#4\nsbusy !\n');
    expect(history(d, 'msg')).toEqual(['0:idle', '4:busy']);
  });
});

describe('simulation keywords (§18.2.3.9–12)', () => {
  it('counts $dumpvars and $dumpall values as changes', () => {
    const d = parseVcd(header('$var wire 1 ! a $end\n$var wire 2 " b [1:0] $end') + '$dumpvars\n0!\nb00 "\n$end\n#5\n1!\n#9\n$dumpall\n1!\nb00 "\n$end\n');
    expect(history(d, 'a')).toEqual(['0:0', '5:1', '9:1']);
    expect(d.changes).toBe(5);
  });

  it('makes every net read x from $dumpoff until $dumpon, even those the writer did not list', () => {
    const d = parseVcd(header('$var wire 1 ! a $end\n$var wire 1 " b $end\n$var real 64 # r $end') + '#0\n$dumpvars\n1!\n0"\nr2.5 #\n$end\n#10\n$dumpoff\nx!\n$end\n#20\n$dumpon\n1!\n1"\nr1 #\n$end\n');
    const b = resolveNet(d, 'b').net;
    expect(valueTextAt(d, d.signals[b.signal], 15)).toBe('x');
    expect(valueTextAt(d, d.signals[resolveNet(d, 'a').net.signal], 15)).toBe('x');
    expect(valueTextAt(d, d.signals[resolveNet(d, 'r').net.signal], 15)).toBe('NaN');
    expect(valueTextAt(d, d.signals[b.signal], 20)).toBe('1');
    expect(d.dumpOff).toEqual([[10, 20]]);
    // Only what the file wrote counts: 3 + 1 + 3.
    expect(d.changes).toBe(7);
  });

  it('skips $comment anywhere', () => {
    const d = parseVcd(`$comment a #1 1! comment $end\n` + header('$comment inside $end\n$var wire 1 ! a $end') + '#0\n$comment 1! not a change $end\n0!\n');
    expect(history(d, 'a')).toEqual(['0:0']);
  });

  it('takes the end time from the last # line, even without a change after it', () => {
    const d = parseVcd(header('$var wire 1 ! a $end') + '#0\n0!\n#42\n');
    expect(d.endTick).toBe(42);
  });
});

describe('chunked input', () => {
  it('gives the same dump whatever byte the chunks are split at', () => {
    const text = header('$var wire 1 ! a $end\n$var wire 12 "# bus [11:0] $end\n$var real 64 __proto__ r $end') + '#0\n$dumpvars\n0!\nb0 "#\nr0 __proto__\n$end\n#1250\n1!\nb101011110000 "#\nr-1.25e-3 __proto__\n#2500\n0!\n';
    const bytes = new TextEncoder().encode(text);
    const whole = parseVcd(bytes);
    for (let cut = 1; cut < bytes.length; cut++) {
      const p = new VcdParser('split.vcd');
      p.push(bytes.subarray(0, cut));
      p.push(bytes.subarray(cut));
      const d = p.finish();
      expect([history(d, 'a'), history(d, 'bus'), history(d, 'r'), d.endTick, d.changes]).toEqual([
        history(whole, 'a'),
        history(whole, 'bus'),
        history(whole, 'r'),
        whole.endTick,
        whole.changes,
      ]);
    }
  });

  it('gives the same dump when fed one byte at a time', () => {
    const text = header('$var wire 3 ! v [2:0] $end') + '#0\nb000 !\n#3\nb1x1 !\n#4\n';
    const bytes = new TextEncoder().encode(text);
    const p = new VcdParser('bytes.vcd');
    for (let i = 0; i < bytes.length; i++) p.push(bytes.subarray(i, i + 1));
    expect(history(p.finish(), 'v')).toEqual(['0:000', '3:1x1']);
  });
});

describe('lookups run on the indexed arrays', () => {
  const d = parseVcd(header('$var wire 1 ! a $end') + '#0\n0!\n#10\n1!\n#20\n0!\n1!\n#30\n0!\n');
  const sig = d.signals[0];
  it('finds the value in effect at a time', () => {
    expect([5, 10, 19, 20, 25, 99].map((t) => valueTextAt(d, sig, t))).toEqual(['0', '1', '1', '1', '1', '0']);
    expect(changeInEffectAt(d, sig, -1)).toBe(-1);
  });
  it('finds the first change at or after a time', () => {
    expect([0, 1, 10, 11, 20, 31].map((t) => firstChangeAtOrAfter(d, sig, t))).toEqual([0, 1, 1, 2, 2, 5]);
  });
});

describe('storage of the finished dump', () => {
  const text = header('$var wire 1 ! a $end\n$var wire 4 " v [3:0] $end\n$var real 64 # r $end') + '#0\n0!\nb0 "\nr1 #\n#5\n1!\nb1x "\nr2 #\n';
  it('carves every signal array from a few buffers that a transfer list can name', async () => {
    const { dumpBuffers } = await import('../../src/model/dump');
    const d = parseVcd(text);
    const buffers = dumpBuffers(d);
    expect(buffers.length).toBeLessThanOrEqual(5);
    for (const s of d.signals) expect(buffers).toContain(s.timeIndex.buffer);
  });
  it('puts them on SharedArrayBuffers when asked, with the same values', () => {
    const p = new VcdParser('shared.vcd', {}, { shared: true });
    p.push(new TextEncoder().encode(text));
    const d = p.finish();
    expect(d.signals[0].timeIndex.buffer).toBeInstanceOf(SharedArrayBuffer);
    expect(history(d, 'v')).toEqual(history(parseVcd(text), 'v'));
    expect(history(d, 'r')).toEqual(['0:1', '5:2']);
  });
});
