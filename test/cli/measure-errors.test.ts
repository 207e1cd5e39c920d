// Bad arguments and unreadable dumps exit 2 with a clear message on stderr and nothing on stdout
// (issue: CLI contract). Times need a unit; nets must resolve to exactly one net.

import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, test } from 'vitest';
import { midrail } from './measure-cli';

const dir = mkdtempSync(join(tmpdir(), 'midrail-measure-errors-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

// Hand-written VCD text (IEEE 1364-2005 §18.2 syntax): two nets whose names share the suffix `y`.
const VCD = join(dir, 'small.vcd');
writeFileSync(
  VCD,
  `$timescale 1ns $end
$scope module top $end
$scope module u1 $end
$var wire 1 ! y $end
$upscope $end
$scope module u2 $end
$var wire 1 " y $end
$upscope $end
$var wire 1 # a $end
$var real 64 $ v $end
$upscope $end
$enddefinitions $end
#0
0!
0"
0#
r0 $
#10
1#
r1 $
#12
1!
#13
1"
`,
);

function fails(args: string[], message: RegExp): void {
  const r = midrail(...args);
  expect(r.code, r.stderr).toBe(2);
  expect(r.stdout).toBe('');
  expect(r.stderr).toMatch(/^midrail: /);
  expect(r.stderr).toMatch(message);
}

describe('measurement commands reject bad input with exit 2', () => {
  test('a time without a unit', () => {
    fails(['delay', VCD, '--from', 'a', '--to', 'u1.y', '--window', '5'], /time '5' has no unit/);
    fails(['glitches', VCD, '--max-width', '2'], /no unit/);
    fails(['skew', VCD, '--nets', 'u1.y,u2.y', '--window', 'soon'], /cannot read 'soon' as a time/);
  });

  test('a zero or negative time', () => {
    fails(['glitches', VCD, '--max-width', '0ns'], /positive time/);
    fails(['delay', VCD, '--from', 'a', '--to', 'u1.y', '--window=-1ns'], /positive time/);
  });

  test('a missing required option or dump', () => {
    fails(['delay', VCD, '--from', 'a'], /needs --to/);
    fails(['glitches', VCD], /needs --max-width/);
    fails(['skew', VCD], /needs --nets/);
    fails(['edges', VCD], /needs --net/);
    fails(['edges', '--net', 'a'], /exactly one dump file/);
  });

  test('an unknown, ambiguous or out-of-range net', () => {
    fails(['edges', VCD, '--net', 'nope'], /no net named 'nope'/);
    fails(['delay', VCD, '--from', 'a', '--to', 'y'], /ambiguous.*top\.u1\.y.*top\.u2\.y/);
    fails(['edges', VCD, '--net', 'a[3]'], /no net named|outside/);
    fails(['skew', VCD, '--nets', 'top.zz*'], /matches no net/);
  });

  test('a bad level, edge, option or output combination', () => {
    fails(['edges', VCD, '--net', 'v', '--level', '50'], /reference level/);
    fails(['edges', VCD, '--net', 'v', '--level', '7V'], /outside its transition region/);
    fails(['skew', VCD, '--nets', 'u1.y,u2.y', '--edge', 'up'], /--edge must be rise, fall or any/);
    fails(['skew', VCD, '--nets', 'u1.y', '--ref', 'a'], /reference net 'top\.a' is not one of the nets/);
    fails(['delay', VCD, '--from', 'a', '--to', 'u1.y', '--json', '--csv'], /one of --json and --csv/);
    fails(['delay', VCD, '--from', 'a', '--to', 'u1.y', '--speed'], /Unknown option '--speed'/);
  });

  test('an unreadable dump', () => {
    fails(['edges', join(dir, 'missing.vcd'), '--net', 'a'], /cannot read dump .*no such file/);
    const bad = join(dir, 'bad.vcd');
    writeFileSync(bad, '$timescale 1ns $end\n$enddefinitions $end\n#5\n#3\n');
    fails(['glitches', bad, '--max-width', '1ns'], /bad\.vcd/);
  });

  test('--help exits 0 and describes the options', () => {
    for (const cmd of ['delay', 'skew', 'glitches', 'edges']) {
      const r = midrail(cmd, '--help');
      expect(r.code).toBe(0);
      expect(r.stdout).toMatch(new RegExp(`^usage: midrail ${cmd} <dump>`));
    }
  });
});
