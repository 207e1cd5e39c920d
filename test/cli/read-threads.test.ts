// A big plain dump is read by several threads (src/parse/parts.ts, src/cli/readParts.ts). What
// the user sees must not depend on it: the built CLI's JSON, warnings and errors are compared
// between MIDRAIL_READ_THREADS=1 (one piece) and 2 (parts), on a generated dump of about 40 MB
// (parts start at 32 MiB). The dump is invented test data; what it is checked against is the
// same file read in one piece, whose reading the grammar tests check against IEEE 1364-2005 §18.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { writeBigDump as writeDump } from '../bigDump';

const ROOT = resolve(import.meta.dirname, '../..');
const CLI = process.env.MIDRAIL_CLI ?? join(ROOT, 'dist/cli/main.js');

function midrail(threads: number, args: string[], debug = false) {
  const env = { ...process.env, MIDRAIL_READ_THREADS: String(threads), MIDRAIL_DEBUG_READ: debug ? '1' : '' };
  const r = spawnSync(process.execPath, [CLI, ...args], { cwd: ROOT, encoding: 'utf8', env, maxBuffer: 512 << 20 });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
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

