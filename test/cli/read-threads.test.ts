// A big plain dump is read by several threads (src/parse/parts.ts, src/cli/readParts.ts). What
// the user sees must not depend on it: the built CLI's JSON, warnings and errors are compared
// between MIDRAIL_READ_THREADS=1 (one piece) and 2 (parts), on a generated dump of about 40 MB
// (parts start at 32 MiB). The dump is invented test data; what it is checked against is the
// same file read in one piece, whose reading the grammar tests check against IEEE 1364-2005 §18.
import { spawnSync } from 'node:child_process';
import { closeSync, mkdtempSync, openSync, rmSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';

const ROOT = resolve(import.meta.dirname, '../..');
const CLI = process.env.MIDRAIL_CLI ?? join(ROOT, 'dist/cli/main.js');

function midrail(threads: number, args: string[], debug = false) {
  const env = { ...process.env, MIDRAIL_READ_THREADS: String(threads), MIDRAIL_DEBUG_READ: debug ? '1' : '' };
  const r = spawnSync(process.execPath, [CLI, ...args], { cwd: ROOT, encoding: 'utf8', env, maxBuffer: 512 << 20 });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

const HEADER = [
  '$timescale 1ps $end',
  '$scope module rig $end',
  ...Array.from({ length: 24 }, (_, k) => `$var wire 1 ${String.fromCharCode(33 + k)} lane${k} $end`),
  '$var wire 12 ~ word [11:0] $end',
  '$var wire 40 }} wide [39:0] $end',
  '$var real 64 ]] level $end',
  '$var wire 1 {{ tap $end',
  '$upscope $end',
  '$enddefinitions $end',
  '',
].join('\n');

/** About `mb` MB of body after HEADER; the same timestamp is written twice now and then. */
function writeDump(path: string, mb: number, tail = ''): void {
  const fd = openSync(path, 'w');
  writeSync(fd, `${HEADER}#0\n$dumpvars\n${Array.from({ length: 24 }, (_, k) => `0${String.fromCharCode(33 + k)}`).join('\n')}\nb0 ~\nb0 }}\nr0 ]]\n0{{\n$end\n`);
  let t = 0;
  let written = 0;
  let seed = 7;
  const rnd = () => (seed = (seed * 1103515245 + 12345) >>> 0) >>> 8;
  while (written < mb * 1e6) {
    let chunk = '';
    for (let s = 0; s < 2000; s++) {
      t += 1 + (rnd() % 900);
      chunk += `#${t}\n`;
      for (let c = 0; c < 6; c++) chunk += `${rnd() & 1}${String.fromCharCode(33 + (rnd() % 24))}\n`;
      if (s % 3 === 0) chunk += `b${(rnd() & 0xfff).toString(2)} ~\n`;
      if (s % 7 === 0) chunk += `b${rnd().toString(2)}${(rnd() & 0xff).toString(2)} }}\n`;
      if (s % 11 === 0) chunk += `r${(rnd() % 3300) / 1000} ]]\n`;
      if (s % 13 === 0) chunk += `1{{\n0{{\n#${t}\n1{{\n`; // a zero-width pulse, and a repeated timestamp
    }
    written += writeSync(fd, chunk);
  }
  writeSync(fd, tail);
  closeSync(fd);
}

let dir = '';
let plain = '';
let cut = '';
let broken = '';

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'midrail-threads-'));
  plain = join(dir, 'plain.vcd');
  writeDump(plain, 40, `#${9e12}\n`);
  cut = join(dir, 'cut.vcd');
  writeDump(cut, 36, '#99999999999\n1!\nb10');
  broken = join(dir, 'broken.vcd');
  writeDump(broken, 36, '#99999999999\n1!\n0?\n#100000000000\n');
}, 120_000);

afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('a dump read by two threads reads as in one piece', () => {
  test('the reader really uses parts on this file', () => {
    const r = midrail(2, ['info', plain], true);
    expect(r.code).toBe(0);
    expect(r.stderr).toContain('read in parts by 2 threads');
  }, 60_000);

  test('info --json', () => {
    const one = midrail(1, ['info', '--json', plain]);
    expect(one.code).toBe(0);
    const two = midrail(2, ['info', '--json', plain]);
    expect(two.stderr).toBe('');
    expect(two.stdout).toBe(one.stdout);
    expect(JSON.parse(one.stdout).changes).toBeGreaterThan(4_000_000);
  }, 60_000);

  test('changes of a 1-bit net, a 40-bit vector and a real', () => {
    for (const net of ['rig.tap', 'rig.wide', 'rig.level']) {
      const one = midrail(1, ['changes', plain, '--net', net, '--json']);
      const two = midrail(2, ['changes', plain, '--net', net, '--json']);
      expect(one.code).toBe(0);
      expect(two.stdout).toBe(one.stdout);
    }
  }, 120_000);

  test('a cut-off dump: the same refusal, naming the same line', () => {
    const one = midrail(1, ['info', '--json', cut]);
    const two = midrail(2, ['info', '--json', cut]);
    expect(one.code).toBe(2);
    expect(one.stderr).toMatch(/cut off at line \d+/);
    expect([two.code, two.stderr]).toEqual([one.code, one.stderr]);
  }, 60_000);

  test('bad input late in the file: the same error, naming the same line and byte', () => {
    const one = midrail(1, ['info', broken]);
    const two = midrail(2, ['info', broken]);
    expect(one.code).toBe(2);
    expect(one.stderr).toMatch(/line \d+, byte \d+: unknown identifier code '\?'/);
    expect([two.code, two.stderr]).toEqual([one.code, one.stderr]);
  }, 60_000);
});

