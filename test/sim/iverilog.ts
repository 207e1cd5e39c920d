// Runs a small Verilog design through Icarus Verilog (iverilog + vvp) in a temporary folder and
// returns the VCD it wrote. Dumps made this way are truth from outside the project: the
// simulator, not midrail, decides every time and value in them.
//
// The design writes `dump.vcd` itself ($dumpfile("dump.vcd"); $dumpvars(...)), or passes
// `{ dumpTop: 'top' }` and the helper adds a root module that dumps `top` whole from time 0.
//   const sim = simulate(verilog, { dumpTop: 'top', corner: 'max' });
//   parseVcd(sim.vcd, sim.vcdPath) ...
//   afterAll(cleanupSimulations);   // removes the temporary folders
// simulate() runs synchronously; `await simulate(...)` works as well.
// Tests may skip (with a message saying why) only when iverilog is not installed; .ci/run installs it.

import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

function hasTool(name: string): boolean {
  const r = spawnSync(name, ['-V'], { encoding: 'utf8' });
  return r.error === undefined && r.status !== null;
}

export const iverilogAvailable = hasTool('iverilog') && hasTool('vvp');
export const IVERILOG_MISSING = 'iverilog/vvp not found on PATH: simulator-driven checks skipped (install the iverilog package to run them)';

if (!iverilogAvailable) console.warn(IVERILOG_MISSING);

export type DelayCorner = 'min' | 'typ' | 'max';

export interface SimOptions {
  /**
   * Name of a top module to dump whole. The helper adds its own root module that calls
   * `$dumpfile` and `$dumpvars(0, <dumpTop>)` at time 0, so the design needs no dump calls.
   */
  dumpTop?: string;
  /** File the design writes, relative to the simulation folder (default `dump.vcd`). */
  vcdName?: string;
  /** Delay corner for min:typ:max delays (`iverilog -T`), default typ (IEEE 1364-2005 §7.14.1). */
  corner?: DelayCorner;
  /** Language generation passed as `-g` (default 2005, i.e. IEEE 1364-2005). */
  generation?: string;
  /** Extra source files written beside the design: name → text. */
  files?: Record<string, string>;
  /** Extra arguments for vvp after the compiled file (plusargs such as `+seed=3`). */
  plusargs?: string[];
  /** Kill a simulation that runs longer than this (a design without $finish), default 60 s. */
  killAfterMs?: number;
}

export interface Simulation {
  /** Temporary folder holding the sources, the compiled design and the dump. */
  dir: string;
  vcdPath: string;
  /** The dump as text. */
  vcd: string;
  /** The same dump as text (alias of `vcd`). */
  text: string;
  /** The dump as written by vvp, byte for byte. */
  bytes: Uint8Array;
  /** What the simulation printed ($display output). */
  stdout: string;
}

const made: string[] = [];

function run(cmd: string, args: string[], cwd: string, killAfterMs: number): string {
  const r = spawnSync(cmd, args, { cwd, encoding: 'utf8', timeout: killAfterMs, maxBuffer: 64 << 20 });
  if ((r.error as NodeJS.ErrnoException | undefined)?.code === 'ENOENT') {
    throw new Error(`${cmd} is not installed (Debian package 'iverilog'; .ci/run installs it)`);
  }
  if (r.error || r.status !== 0) {
    throw new Error(`${cmd} ${args.join(' ')} failed in ${cwd}:\n${r.stderr}${r.stdout}${r.error ? r.error.message : ''}`);
  }
  return r.stdout;
}

/** Compiles `verilog` (plus `opts.files`) with iverilog, runs it with vvp, and reads the dump. */
export function simulate(verilog: string, opts: SimOptions = {}): Simulation {
  const dir = mkdtempSync(join(tmpdir(), 'midrail-sim-'));
  made.push(dir);
  const vcdName = opts.vcdName ?? 'dump.vcd';
  const sources = ['design.v'];
  writeFileSync(join(dir, 'design.v'), verilog);
  for (const [name, text] of Object.entries(opts.files ?? {})) {
    writeFileSync(join(dir, name), text);
    sources.push(name);
  }
  if (opts.dumpTop !== undefined) {
    // A second root module; iverilog elaborates every uninstantiated module as a root.
    const control = `module midrail_dump_control;\n  initial begin\n    $dumpfile("${vcdName}");\n    $dumpvars(0, ${opts.dumpTop});\n  end\nendmodule\n`;
    writeFileSync(join(dir, 'dump_control.v'), control);
    sources.push('dump_control.v');
  }
  const killAfterMs = opts.killAfterMs ?? 60_000;
  run('iverilog', [`-g${opts.generation ?? '2005'}`, '-T', opts.corner ?? 'typ', '-o', 'design.vvp', ...sources], dir, killAfterMs);
  const stdout = run('vvp', ['-n', 'design.vvp', ...(opts.plusargs ?? [])], dir, killAfterMs);
  const vcdPath = join(dir, vcdName);
  let bytes: Uint8Array;
  try {
    bytes = new Uint8Array(readFileSync(vcdPath));
  } catch {
    throw new Error(`the simulation in ${dir} wrote no ${vcdName}; does the design call $dumpfile("${vcdName}") and $dumpvars, or pass dumpTop?`);
  }
  const text = new TextDecoder().decode(bytes);
  return { dir, vcdPath, vcd: text, text, bytes, stdout };
}

/** Removes every folder `simulate` made in this process (call from afterAll). */
export function cleanupSimulations(): void {
  for (const d of made.splice(0)) rmSync(d, { recursive: true, force: true });
}

/** The lines after `$enddefinitions`, trimmed and without blanks, for naive cross-checks in tests. */
export function bodyLines(text: string): string[] {
  const at = text.indexOf('$enddefinitions');
  if (at < 0) return [];
  return text
    .slice(at)
    .split(/\r?\n/)
    .slice(1)
    .map((l) => l.trim())
    .filter((l) => l !== '');
}
