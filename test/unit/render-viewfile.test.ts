// midrail's saved-view format: what it accepts, and that each kind of mistake is refused
// with a message that names the field. The net-drawer filter's globs follow the same rules as
// the CLI's net lists (checked against resolveNetList on one dump).

import { describe, expect, it } from 'vitest';
import { DumpBuilder } from '../../src/model/builder';
import { resolveNetList } from '../../src/model/netref';
import { makeMatcher } from '../../src/view/filter';
import { ViewFileError, checkViewFile, readViewFile, writeViewFile } from '../../src/view/viewfile';

const good = {
  format: 'midrail-view',
  version: 1,
  dump: 'pump.vcd',
  window: { start: 0, end: 2e-7 },
  cursors: [
    { name: 'A', time: 1e-8 },
    { name: 'B', time: 1.5e-7 },
  ],
  activeCursor: 1,
  referenceCursor: 0,
  lanes: [{ net: 'pump.clk' }, { group: 'bus', collapsed: true, lanes: [{ net: 'pump.duty', radix: 'ascii', color: '#123abc', label: 'pwm' }] }, { net: 'pump.state', bit: 2, color: 3 }],
  theme: 'slate',
};

const bad = (patch: object) => () => checkViewFile({ ...good, ...patch });

describe('view files', () => {
  it('read back what they wrote', () => {
    const v = checkViewFile(good);
    expect(readViewFile(writeViewFile(v))).toEqual(v);
  });

  it('are refused with the field named', () => {
    expect(() => readViewFile('{ nope')).toThrow(/not valid JSON/);
    expect(bad({ format: 'something-else' })).toThrow(/format is "something-else"; expected "midrail-view"/);
    expect(bad({ version: 2 })).toThrow(/version 2 is newer than this midrail reads/);
    expect(bad({ window: { start: 5, end: 1 } })).toThrow(/window end 1 must be after start 5/);
    expect(bad({ activeCursor: 2 })).toThrow(/activeCursor is 2; expected a cursor number from 0 to 1/);
    expect(bad({ lanes: [{ net: 'a', radix: 'octal' }] })).toThrow(/lanes\[0\]\.radix is "octal"/);
    expect(bad({ lanes: [{ group: 'g', lanes: [{ net: 'a', color: 'red' }] }] })).toThrow(/lanes\[0\]\.lanes\[0\]\.color/);
    expect(bad({ lanes: [{ net: 'a', bit: 1.5 }] })).toThrow(/lanes\[0\]\.bit must be a whole number/);
    expect(bad({ lanes: [{ net: 'a', lo: 3, hi: 1 }] })).toThrow(/lo 3 not below hi 1/);
    expect(bad({ lanes: [{ net: 'a', colour: 1 }] })).toThrow(/unknown field 'colour'/);
    expect(bad({ cursors: [{ name: 'A', time: 'soon' }] })).toThrow(/cursors\[0\]\.time must be a finite number/);
    expect(bad({ theme: 'neon' })).toThrow(/theme is "neon"/);
    expect(bad({ lanes: 'all' })).toThrow(ViewFileError);
  });
});

describe('net filter', () => {
  const b = new DumpBuilder('f.vcd');
  const top = b.addScope('plant', 'module', -1);
  const zone = b.addScope('zone1', 'module', top);
  const names: Array<[number, string]> = [[top, 'clk'], [top, 'rst_n'], [zone, 'fan_on'], [zone, 'heater_on'], [zone, 'humidity']];
  for (const [scope, name] of names) {
    const sig = b.addSignal('logic', 1);
    const path = `${b.scopes[scope].path}.${name}`;
    b.addNet({ path, name, type: 'wire', width: 1, msb: 0, lsb: 0, ranged: false, scope, signal: sig, code: name });
  }
  const dump = b.finish(0, false);
  const paths = dump.nets.map((n) => n.path);

  it('matches globs exactly as the command line does', () => {
    for (const glob of ['*.h*', 'zone1.*', 'fan_on', 'plant.*_n', '*', 'p?ant.clk']) {
      const cli = resolveNetList(dump, glob).map((r) => r.net.path);
      expect(paths.filter(makeMatcher(glob, 'glob')), glob).toEqual(cli);
    }
  });

  it('matches text in any case, and regular expressions as written', () => {
    expect(paths.filter(makeMatcher('HUM', 'text'))).toEqual(['plant.zone1.humidity']);
    expect(paths.filter(makeMatcher('^plant\\.[a-z]+$', 'regex'))).toEqual(['plant.clk']);
    expect(() => makeMatcher('(', 'regex')).toThrow(/not a regular expression/);
  });
});
