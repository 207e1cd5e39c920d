// A dump body that uses every kind of value change (IEEE 1364-2005 §18.2.1, Table 18-1), and a
// plain-data view of a Dump, for tests that compare two ways of reading one file.
import type { Dump } from '../../src/model/dump';

/** Everything a dump holds, as plain data (NaN stays NaN: toEqual treats NaN as equal). */
export function contents(d: Dump): unknown {
  return {
    times: Array.from(d.times),
    endTick: d.endTick,
    changes: d.changes,
    truncated: d.truncated,
    dumpOff: d.dumpOff,
    warnings: d.warnings,
    signals: d.signals.map((s) => ({
      kind: s.kind,
      width: s.width,
      count: s.count,
      written: s.written,
      timeIndex: Array.from(s.timeIndex),
      logic: Array.from(s.logic),
      planes: Array.from(s.planes),
      reals: Array.from(s.reals),
      texts: [...s.texts],
    })),
  };
}

export const CODES = ['!', '"', '#', 'ab', '%%', 'x1z', 'long_code_9', '__proto__'];
export const REALS = ['1.5', '-1.25e-3', '+3', '.5', '5.', '1e10', '2.5E+2', '-0', '0.1', '123456789012345678', '1.0000000000000002', '1e-300', '4.9e-324', '1.7976931348623157e308', '9007199254740993', '0.12345678901234567', '2.2250738585072011e-308', '8.98846567431158e307', '3.0000000000000004e-5', '370.66169185358340', '453.03800874580750', 'nan', 'inf', '-inf'];

/** A header plus a body that uses every kind of value change, several hundred lines long. */
/** `dumpSwitch`: include a $dumpoff … $dumpon stretch. */
export function variedDump(lineEnd = '\n', dumpSwitch = true): string {
  const vars = [
    ...CODES.map((c, i) => `$var wire 1 ${c} s${i} $end`),
    '$var wire 8 ( b8 [7:0] $end',
    '$var wire 32 ) b32 [31:0] $end',
    '$var wire 70 * b70 [69:0] $end',
    '$var real 64 + r $end',
    '$var string 1 , txt $end',
    '$var event 1 - ev $end',
  ].join('\n');
  const head = `$timescale 10 ps $end\n$scope module top $end\n${vars}\n$upscope $end\n$enddefinitions $end\n`;
  const lines: string[] = ['$comment body comment $end', '#0', '$dumpvars'];
  for (const c of CODES) lines.push(`x${c}`);
  lines.push('b0 (', 'bx )', 'bz *', 'r0 +', 's-- ,', '$end');
  const states = ['0', '1', 'x', 'z', 'X', 'Z'];
  let t = 0;
  for (let k = 0; k < 120; k++) {
    t += 1 + (k % 7);
    lines.push(`#${t}`);
    lines.push(`${states[k % 6]}${CODES[k % CODES.length]}`);
    lines.push(`${states[(k + 1) % 2]}${CODES[(k * 3) % CODES.length]}`);
    if (k % 3 === 0) lines.push(`b${((k * 37) % 256).toString(2)} (`);
    if (k % 4 === 1) lines.push(`b${k % 8 === 1 ? 'x' : ''}${(k * 2654435761).toString(2).slice(0, 31)} )`);
    if (k % 5 === 2) lines.push(`B${'10'.repeat(35)} *`, `b${k % 10 === 2 ? 'z1' : '1x0'} *`);
    if (k % 6 === 3) lines.push(`r${REALS[k % REALS.length]} +`, `R${REALS[(k + 5) % REALS.length]} +`);
    if (k % 9 === 4) lines.push(`b1U0 (`, `sstate_${k} ,`, `1-`, `H${CODES[0]}`, `l${CODES[1]}`, `W${CODES[2]}`);
    if (k % 11 === 5) lines.push(`0${CODES[3]}`, `1${CODES[3]}`, `0${CODES[3]}`); // zero-width glitch
    if (k === 60 && dumpSwitch) lines.push('$dumpoff', `x${CODES[0]}`, '$end', `#${(t += 3)}`, '$dumpon', `1${CODES[0]}`, 'b1 (', '$end');
    if (k % 13 === 7) lines.push(`#${t}`); // the same timestamp written twice
    if (k === 90) lines.push('$fancy_keyword 1 2 $end'); // an unknown command: a warning with a line number
    if (k % 17 === 8) lines.push(`1${CODES[4]}\t0${CODES[5]}  1${CODES[6]}`); // several changes on one line
  }
  lines.push(`#${t + 5}`);
  return head + lines.join(lineEnd) + lineEnd;
}

