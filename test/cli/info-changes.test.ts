// `midrail info` and `midrail changes` as a user runs them: the built CLI (`npm run prepare`) is
// spawned on dumps iverilog writes from small designs and on the committed samples, and its JSON is
// checked against what the HDL says (delays per IEEE 1364-2005 §7.14, dump format per §18.2) and
// against samples/README.md, which lists the gate delays of the sample design.

import { spawnSync } from 'node:child_process';
import { existsSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { bodyLines, cleanupSimulations, type Simulation, simulate } from '../sim/iverilog';

const ROOT = resolve(import.meta.dirname, '../..');
/** The built CLI; MIDRAIL_CLI points the test at another build of it. */
const CLI = process.env.MIDRAIL_CLI ?? join(ROOT, 'dist/cli/main.js');

interface Ran {
  code: number | null;
  stdout: string;
  stderr: string;
}

function midrail(...args: string[]): Ran {
  const r = spawnSync(process.execPath, [CLI, ...args], { cwd: ROOT, encoding: 'utf8', maxBuffer: 256 << 20 });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

function json<T = any>(r: Ran): T {
  expect(r.stderr).toBe('');
  expect(r.code).toBe(0);
  return JSON.parse(r.stdout) as T;
}

interface InfoJson {
  timescale_s: number;
  end_time_s: number;
  scopes: number;
  changes: number;
  nets: Array<{ path: string; width: number; type: string; changes: number }>;
  warnings: string[];
}
interface ChangesJson {
  net: string;
  width: number;
  type: string;
  changes: Array<{ time_s: number; value: string | number | null }>;
}

// A leaf instance (its port shares the code of the net it connects), a task scope, an 8-bit bus,
// a real, an integer and a buffered wire with unequal rise and fall delays.
const DESIGN = `
\`timescale 1ns/1ps
module leaf (input d, output q);
  not #(0.25, 0.4) inv (q, d);
endmodule
module top;
  reg a; reg [7:0] bus; real level; integer n;
  leaf u1 (.d(a), .q());
  task settle; reg [1:0] step; begin step = 2'd2; #1; end endtask
  initial begin
    a = 0; bus = 8'h0x; level = 0.5; n = 3;
    #1 a = 1; bus = 8'bzzzz1010;
    settle;
    bus = 8'b1; level = -1.25e-3;
    #1.5 a = 0; bus = 8'ha5; n = n + 1;
    #2 $finish;
  end
endmodule`;

let sim: Simulation;

beforeAll(() => {
  expect(existsSync(CLI), `${CLI} is missing: run 'npm run prepare' first`).toBe(true);
  sim = simulate(DESIGN, { dumpTop: 'top' });
});
afterAll(cleanupSimulations);

/** Value-change lines of a dump as written (Icarus writes one per line, §18.2.1). */
function writtenChanges(text: string): string[] {
  return bodyLines(text).filter((l) => !l.startsWith('#') && !l.startsWith('$'));
}

describe('midrail info on an iverilog dump', () => {
  test('--json gives the timescale, end time, counts and one entry per $var line, aliases included', () => {
    const info = json<InfoJson>(midrail('info', sim.vcdPath, '--json'));
    expect(Object.keys(info)).toEqual(['timescale_s', 'end_time_s', 'scopes', 'changes', 'nets', 'warnings']);
    expect(info.timescale_s).toBe(1e-12); // `timescale 1ns/1ps → 1 ps ticks (§18.2.3.5)
    expect(info.end_time_s).toBe(5.5e-9); // $finish at 1 + 1 + 1.5 + 2 ns: the last # line
    expect(info.scopes).toBe(3); // top, top.u1, top.settle
    // The changes written in the file, each once although top.a and top.u1.d share a code.
    expect(info.changes).toBe(writtenChanges(sim.text).length);
    expect(info.warnings).toEqual([]);
    const nets = [...info.nets].sort((x, y) => x.path.localeCompare(y.path));
    expect(nets.map(({ path, width, type }) => ({ path, width, type }))).toEqual([
      { path: 'top.a', width: 1, type: 'reg' },
      { path: 'top.bus', width: 8, type: 'reg' },
      { path: 'top.level', width: 1, type: 'real' },
      { path: 'top.n', width: 32, type: 'integer' },
      { path: 'top.settle.step', width: 2, type: 'reg' },
      { path: 'top.u1.d', width: 1, type: 'wire' },
      { path: 'top.u1.q', width: 1, type: 'wire' },
    ]);
    // a: 0 at 0, 1 at 1 ns, 0 at 3.5 ns; its alias u1.d shows the same three.
    expect(nets.find((n) => n.path === 'top.a')!.changes).toBe(3);
    expect(nets.find((n) => n.path === 'top.u1.d')!.changes).toBe(3);
    // bus: 0000xxxx, zzzz1010, 00000001, 10100101.
    expect(nets.find((n) => n.path === 'top.bus')!.changes).toBe(4);
  });

  test('without --json it prints an aligned table with every net, its range, width and type', () => {
    const r = midrail('info', sim.vcdPath);
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/timescale\s+1 ps/);
    expect(r.stdout).toMatch(/end time\s+5\.5 ns/);
    const row = r.stdout.split('\n').find((l) => l.startsWith('top.bus '));
    expect(row).toMatch(/^top\.bus\s+\[7:0\]\s+8\s+reg\s+4$/);
    // Columns line up: every row's type starts under the `type` heading.
    const lines = r.stdout.split('\n');
    const header = lines.find((l) => l.startsWith('net '))!;
    const typeAt = header.indexOf('type');
    const table = lines.filter((l) => l.startsWith('top.'));
    expect(table).toHaveLength(7);
    for (const row of table) expect(row.slice(typeAt)).toMatch(/^(reg|wire|real|integer) /);
  });
});

describe('midrail changes on an iverilog dump', () => {
  test('--json lists a vector MSB first, left-extended, with exact times (Table 18-1)', () => {
    const out = json<ChangesJson>(midrail('changes', sim.vcdPath, '--net', 'top.bus', '--json'));
    expect(out).toEqual({
      net: 'top.bus',
      width: 8,
      type: 'reg',
      changes: [
        { time_s: 0, value: '0000xxxx' },
        { time_s: 1e-9, value: 'zzzz1010' },
        { time_s: 2e-9, value: '00000001' },
        { time_s: 3.5e-9, value: '10100101' },
      ],
    });
  });

  test('a bit is addressed as top.bus[3], bit 3 of the declared [7:0] counted from the right', () => {
    const out = json<ChangesJson>(midrail('changes', sim.vcdPath, '--net', 'top.bus[3]', '--json'));
    // Bit 3 of 0000xxxx, zzzz1010, 00000001, 10100101 is x, 1, 0, 0: the last is no change.
    expect(out).toEqual({
      net: 'top.bus[3]',
      width: 1,
      type: 'reg',
      changes: [
        { time_s: 0, value: 'x' },
        { time_s: 1e-9, value: '1' },
        { time_s: 2e-9, value: '0' },
      ],
    });
  });

  test('real values are JSON numbers', () => {
    const out = json<ChangesJson>(midrail('changes', sim.vcdPath, '--net', 'top.level', '--json'));
    expect(out.changes).toEqual([
      { time_s: 0, value: 0.5 },
      { time_s: 2e-9, value: -1.25e-3 },
    ]);
  });

  test('a port alias shows the changes of the net it connects, and the gate behind it its own delays', () => {
    const d = json<ChangesJson>(midrail('changes', sim.vcdPath, '--net', 'u1.d', '--json'));
    expect(d.changes).toEqual([
      { time_s: 0, value: '0' },
      { time_s: 1e-9, value: '1' },
      { time_s: 3.5e-9, value: '0' },
    ]);
    // not #(0.25, 0.4): x→1 after the rise delay, 1→0 after the fall delay (§7.14).
    const q = json<ChangesJson>(midrail('changes', sim.vcdPath, '--net', 'top.u1.q', '--json'));
    expect(q.changes).toEqual([
      { time_s: 0, value: 'x' },
      { time_s: 0.25e-9, value: '1' },
      { time_s: 1.4e-9, value: '0' },
      { time_s: 3.75e-9, value: '1' },
    ]);
  });

  test('--csv writes time_s, tick and value rows per RFC 4180, the integer n = 3 then 4', () => {
    const r = midrail('changes', sim.vcdPath, '--net', 'top.n', '--csv');
    expect(r.code).toBe(0);
    // RFC 4180 §2: CRLF ends each record; text fields are quoted, numbers bare.
    expect(r.stdout).toBe(['"time_s","tick","value"', `0,0,"${'0'.repeat(30)}11"`, `3.5e-9,3500,"${'0'.repeat(29)}100"`, ''].join('\r\n'));
  });

  test('without --json it prints an aligned listing in ns with one row per change', () => {
    const r = midrail('changes', sim.vcdPath, '--net', 'top.bus');
    expect(r.code).toBe(0);
    const lines = r.stdout.trimEnd().split('\n');
    expect(lines[0]).toMatch(/^top\.bus\s+\(reg, 8 bits\)\s+4 changes$/);
    expect(lines.slice(2).map((l) => l.trim().split(/\s+/))).toEqual([
      ['0.000', '0', '0000xxxx'],
      ['1.000', '1000', 'zzzz1010'],
      ['2.000', '2000', '00000001'],
      ['3.500', '3500', '10100101'],
    ]);
    // Times are right-aligned and every value starts under the `value` heading.
    const valueAt = lines[1].indexOf('value');
    expect(lines.slice(2).map((l) => l.slice(valueAt))).toEqual(['0000xxxx', 'zzzz1010', '00000001', '10100101']);
  });
});

describe('the sample dumps, checked against the gate delays in samples/README.md', () => {
  const typ = 'samples/sensor_hub.vcd';

  test('info lists the sample nets with their widths and types, and the end at $finish (3.035 µs)', () => {
    const info = json<InfoJson>(midrail('info', typ, '--json'));
    expect(info.timescale_s).toBe(1e-12);
    expect(info.end_time_s).toBe(3.035e-6); // reset released at 35 ns, $finish 3000 ns later
    const byPath = new Map(info.nets.map((n) => [n.path, n]));
    expect(byPath.get('hub_bench.dut.sample_bus')).toMatchObject({ width: 12, type: 'wire' });
    expect(byPath.get('hub_bench.dut.u_afe.vout')).toMatchObject({ type: 'real' });
    expect(byPath.get('hub_bench.dut.u_adc.samples_taken')).toMatchObject({ width: 32, type: 'integer' });
    expect(byPath.get('hub_bench.dut.u_log.wrapped')).toMatchObject({ type: 'event' });
    expect(info.scopes).toBeGreaterThanOrEqual(10);
    expect(info.nets.length).toBeGreaterThanOrEqual(40);
  });

  test('the .vcd.gz sample reads exactly like the plain one', () => {
    expect(json(midrail('info', 'samples/sensor_hub.vcd.gz', '--json'))).toEqual(json(midrail('info', typ, '--json')));
  });

  test('the chip-select hazard: a0 falling with a2 = a1 = 1 pulses cs_flash_n high from +0.80 to +1.37 ns', () => {
    const addr = json<ChangesJson>(midrail('changes', typ, '--net', 'hub_bench.dut.spi_addr', '--json')).changes;
    const falls = addr.filter((c, i) => i > 0 && addr[i - 1].value === '111' && c.value === '110').map((c) => c.time_s);
    expect(falls.length).toBe(3); // three 111 → 110 transfers in hub_bench.v
    const cs = json<ChangesJson>(midrail('changes', typ, '--net', 'hub_bench.dut.cs_flash_n', '--json')).changes;
    for (const t0 of falls) {
      // Rise: and_hi fall 0.20 + or_flash fall 0.35 + nand_flash rise 0.25 = 0.80 ns.
      // Fall: inv_a0 rise 0.60 + and_lo rise 0.25 + or_flash rise 0.30 + nand_flash fall 0.22 = 1.37 ns.
      const rise = cs.find((c) => c.time_s > t0 && c.value === '1')!;
      const fall = cs.find((c) => c.time_s > rise.time_s && c.value === '0')!;
      expect(rise.time_s - t0).toBeCloseTo(0.8e-9, 15);
      expect(fall.time_s - t0).toBeCloseTo(1.37e-9, 15);
    }
  });

  test('each leaf clock follows clk_ref by its buffer delays, at the typical and the slow corner', () => {
    // First clk_ref rise is at 10 ns (always #10 toggle from 0); first fall at 20 ns.
    const cases: Array<[string, string, number, number]> = [
      // [file, net, delay after the rise, delay after the fall] in ns, from samples/README.md
      [typ, 'u_clk.clk_adc', 0.42, 0.42],
      [typ, 'u_clk.clk_spi', 0.75, 0.75],
      [typ, 'u_clk.clk_irq', 0.66, 0.76],
      [typ, 'u_clk.clk_log', 0.45, 0.39],
      ['samples/sensor_hub_slow.vcd', 'u_clk.clk_adc', 0.55, 0.55],
      ['samples/sensor_hub_slow.vcd', 'u_clk.clk_irq', 0.86, 0.98],
      ['samples/sensor_hub_slow.vcd', 'u_clk.clk_log', 0.59, 0.51],
    ];
    for (const [file, net, rise, fall] of cases) {
      const ch = json<ChangesJson>(midrail('changes', file, '--net', net, '--json')).changes;
      const firstRise = ch.find((c) => c.value === '1')!;
      const firstFall = ch.find((c) => c.value === '0' && c.time_s > firstRise.time_s)!;
      expect(firstRise.time_s - 10e-9, `${file} ${net} rise`).toBeCloseTo(rise * 1e-9, 15);
      expect(firstFall.time_s - 20e-9, `${file} ${net} fall`).toBeCloseTo(fall * 1e-9, 15);
    }
  });

  test('the RC node crosses half supply τ·ln 2 after a PWM edge (τ = 15 ns typical)', () => {
    // Handbook: v(t) = V(1 − e^(−t/τ)) reaches V/2 at τ·ln 2 = 10.397 ns. The filter model writes
    // the node every 0.25 ns, so level_hi rises at the first sample at or past that: 10.5 ns.
    const pwm = json<ChangesJson>(midrail('changes', typ, '--net', 'hub_bench.sensor_pwm', '--json')).changes;
    const edge = pwm.find((c) => c.value === '1')!.time_s;
    expect(edge).toBe(100e-9);
    const v = json<ChangesJson>(midrail('changes', typ, '--net', 'u_afe.vout', '--json')).changes;
    const before = v.filter((c) => c.time_s <= edge + 10e-9).pop()!;
    const after = v.find((c) => c.time_s >= edge + 10.5e-9)!;
    expect(before.value as number).toBeLessThan(1.65);
    expect(after.value as number).toBeGreaterThan(1.65);
    // Exact step response at a sample instant: 3.3 · (1 − e^(−10.5/15)).
    expect(after.value as number).toBeCloseTo(3.3 * (1 - Math.exp(-10.5 / 15)), 12);
    const hi = json<ChangesJson>(midrail('changes', typ, '--net', 'u_afe.level_hi', '--json')).changes;
    expect(hi.find((c) => c.value === '1')!.time_s).toBeCloseTo(edge + 10.5e-9, 15);
  });
});

describe('bad input and bad arguments exit 2 with a message', () => {
  test('a missing file', () => {
    const r = midrail('info', 'samples/no-such-dump.vcd', '--json');
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toMatch(/no-such-dump\.vcd.*no such file/);
  });

  test('binary junk names the line and byte offset', () => {
    const path = join(sim.dir, 'junk.vcd');
    const head = sim.text.slice(0, sim.text.indexOf('#0'));
    writeFileSync(path, Buffer.concat([Buffer.from(head), Buffer.from([0x23, 0x30, 0x0a, 0x00, 0xff, 0xfe, 0x07, 0x0a])]));
    const r = midrail('info', path);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/junk\.vcd: line \d+, byte \d+: /);
  });

  test('a truncated dump exits 2 by default, and --allow-truncated reads its complete part with a warning', () => {
    // Cut the file in the middle of the line after `#3500`.
    const at = sim.text.indexOf('\n', sim.text.indexOf('#3500\n') + 6) + 2;
    const path = join(sim.dir, 'cut.vcd');
    writeFileSync(path, sim.text.slice(0, at));
    const strict = midrail('info', path, '--json');
    expect(strict.code).toBe(2);
    expect(strict.stdout).toBe('');
    expect(strict.stderr).toMatch(/cut\.vcd.*cut off.*--allow-truncated/s);

    const r = midrail('changes', path, '--net', 'top.a', '--json', '--allow-truncated');
    expect(r.code).toBe(0);
    expect(r.stderr).toMatch(/warning: .*cut off at line \d+/);
    // Everything before the incomplete step at 3.5 ns is there.
    expect((JSON.parse(r.stdout) as ChangesJson).changes).toEqual([
      { time_s: 0, value: '0' },
      { time_s: 1e-9, value: '1' },
    ]);
    const info = JSON.parse(midrail('info', path, '--json', '--allow-truncated').stdout) as InfoJson;
    expect(info.warnings.length).toBeGreaterThan(0);
    expect(info.end_time_s).toBeLessThan(5.5e-9);
  });

  test('changes without --net, with an unknown net, or with both --json and --csv', () => {
    const noNet = midrail('changes', sim.vcdPath);
    expect(noNet.code).toBe(2);
    expect(noNet.stderr).toMatch(/--net/);
    const unknown = midrail('changes', sim.vcdPath, '--net', 'top.nothing');
    expect(unknown.code).toBe(2);
    expect(unknown.stderr).toMatch(/no net named 'top\.nothing'/);
    const outside = midrail('changes', sim.vcdPath, '--net', 'top.bus[8]');
    expect(outside.code).toBe(2);
    expect(outside.stderr).toMatch(/bit 8 is outside net 'top\.bus'/);
    const both = midrail('changes', sim.vcdPath, '--net', 'top.a', '--json', '--csv');
    expect(both.code).toBe(2);
  });
});
