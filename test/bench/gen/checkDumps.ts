// The `check` section's inputs, cached in os.tmpdir()/midrail-bench like the other synthetic dumps:
// `count` dumps of one size from gen/checkVcd.ts, and the ten-measurement plan that fits their nets.
// The plan's limits follow from the delays the generator places, so every measurement should pass.

import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Plan } from '../../../src/plan/types';
import { CHECK_SYNTH_VERSION, type CheckSynthMeta, generateCheckVcd } from './checkVcd';
import { CACHE_DIR } from './dumpCache';

export interface CheckDumpFile {
  path: string;
  meta: CheckSynthMeta;
  fresh: boolean;
}

export function checkDumps(count: number, megabytes: number): CheckDumpFile[] {
  mkdirSync(CACHE_DIR, { recursive: true });
  const out: CheckDumpFile[] = [];
  for (let i = 0; i < count; i++) {
    const base = `check-v${CHECK_SYNTH_VERSION}-${megabytes}mb-${String(i).padStart(2, '0')}`;
    const path = join(CACHE_DIR, `${base}.vcd`);
    const metaPath = join(CACHE_DIR, `${base}.json`);
    if (existsSync(path) && existsSync(metaPath)) {
      out.push({ path, meta: JSON.parse(readFileSync(metaPath, 'utf8')) as CheckSynthMeta, fresh: false });
      continue;
    }
    rmSync(metaPath, { force: true }); // written last, so a half-written dump is never reused
    const meta = generateCheckVcd(path, i, megabytes * 1e6);
    writeFileSync(metaPath, JSON.stringify(meta, null, 2));
    out.push({ path, meta, fresh: true });
  }
  return out;
}

/** Ten measurements over the five kinds; the comments give the range the generator makes. */
export const CHECK_PLAN: Plan = {
  format: 'midrail-plan',
  version: 1,
  name: 'bench check plan',
  description: 'midrail benchmark: ten measurements on the synthetic clocked block of test/bench/gen/checkVcd.ts',
  measurements: [
    // Exactly 4 ns and 50 %.
    { id: 'clk_period', kind: 'period', net: 'bench.clk', min: '3.99ns', max: '4.01ns' },
    { id: 'clk_duty', kind: 'period', net: 'bench.clk', quantity: 'duty', min: '45%', max: '55%' },
    // Each edge wobbles ±4 ps, so adjacent periods differ by at most 16 ps.
    { id: 'leaf3_jitter', kind: 'period', net: 'bench.tree.leaf3', quantity: 'jitter', max: '20ps' },
    // Offsets 80..175 ps ±4 ps: at most 103 ps apart.
    { id: 'leaf_skew', kind: 'skew', nets: 'bench.tree.leaf*', edge: 'rise', window: '1ns', max: '150ps' },
    // 200..300 ps after the clock.
    { id: 'q0_clock_to_out', kind: 'delay', from: 'bench.clk', to: 'bench.core.q0', window: '1ns', min: '150ps', max: '400ps' },
    // 200..300 ps after clk, leaf2 at 136..144 ps: 56..164 ps.
    { id: 'q5_rise_from_leaf2', kind: 'delay', from: 'bench.tree.leaf2', to: 'bench.core.q5', edge: 'rise', window: '1ns', max: '250ps' },
    // 250..350 ps after the clock, whenever bit 3 changes.
    { id: 'bus3_clock_to_out', kind: 'delay', from: 'bench.clk', to: 'bench.core.bus[3]', window: '1ns', max: '400ps' },
    // 40..200 ps low pulses, about one cycle in 50; the count differs per dump, so no tight limit.
    { id: 'strobe_glitches', kind: 'glitch', nets: 'bench.core.strobe_n', max_width: '300ps', max: 1000000 },
    // Bulk nets change at most once a cycle: no pulse under 400 ps.
    { id: 'fill_glitches', kind: 'glitch', nets: 'bench.fill.*', max_width: '300ps', max: 0 },
    // High 1.5..5 ns.
    { id: 'pwm_high', kind: 'pulse-width', net: 'bench.core.pwm', polarity: 'high', min: '1ns', max: '6ns' },
  ],
};

export function checkPlanFile(): string {
  mkdirSync(CACHE_DIR, { recursive: true });
  const path = join(CACHE_DIR, `check-v${CHECK_SYNTH_VERSION}.plan.json`);
  writeFileSync(path, JSON.stringify(CHECK_PLAN, null, 2));
  return path;
}
