// One design simulated at two delay corners by Icarus Verilog (regression-design.ts: IEEE 1364-2005
// §7.14.1 min:typ:max delays, chosen with `iverilog -T min|max`). The HDL says y lags a by 1 ns
// (min) or 3 ns (max); n1 adds 1 / 3 ns on rise and 2 / 4 ns on fall. A plan limiting a→y to
// 2.5 ns therefore passes at min and fails at max, and compare must see y move +2 ns and z +4 ns.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { compareDumps } from '../../src/compare/index';
import type { Dump } from '../../src/model/dump';
import { parseVcd } from '../../src/parse/vcd';
import { runPlan } from '../../src/plan/run';
import { toPlan } from '../../src/plan/validate';
import { cleanupSimulations, simulate } from './iverilog';
import { CORNER_DESIGN } from './regression-design';

const plan = toPlan(
  {
    format: 'midrail-plan',
    version: 1,
    measurements: [
      { id: 'a_to_y', kind: 'delay', from: 'corners.a', to: 'corners.y', max: '2.5ns' },
      { id: 'y_to_z_fall', kind: 'delay', from: 'corners.y', to: 'corners.z', edge: 'fall', max: '3.5ns' },
      { id: 'z_high', kind: 'pulse-width', net: 'corners.z', polarity: 'high', min: '19ns', max: '21ns' },
    ],
  },
  'corners.plan.json',
);

let fast: Dump;
let slow: Dump;

beforeAll(async () => {
  const [min, max] = await Promise.all([simulate(CORNER_DESIGN, { dumpTop: 'corners', corner: 'min' }), simulate(CORNER_DESIGN, { dumpTop: 'corners', corner: 'max' })]);
  fast = parseVcd(min.bytes, 'corners_min.vcd');
  slow = parseVcd(max.bytes, 'corners_max.vcd');
});

afterAll(cleanupSimulations);

describe('check at two delay corners', () => {
  it('passes the a→y limit at the min corner and fails it at the max corner', () => {
    const [minDelay] = runPlan(fast, plan);
    const [maxDelay] = runPlan(slow, plan);
    expect(minDelay.status).toBe('pass');
    expect(minDelay.worst).toBeCloseTo(1e-9, 15);
    expect(minDelay.margin).toBeCloseTo(1.5e-9, 15);
    expect(maxDelay.status).toBe('fail');
    expect(maxDelay.worst).toBeCloseTo(3e-9, 15);
    expect(maxDelay.margin).toBeCloseTo(-0.5e-9, 15);
    expect(maxDelay.violations).toBe(4);
    // The first violating pair: a rises at 10 ns, y at 13 ns.
    expect(maxDelay.worst_time_s).toBeCloseTo(13e-9, 15);
  });

  it('measures the fall delay of n1 at each corner (2 ns and 4 ns)', () => {
    const minFall = runPlan(fast, plan)[1];
    const maxFall = runPlan(slow, plan)[1];
    expect(minFall.max).toBeCloseTo(2e-9, 15);
    expect(maxFall.max).toBeCloseTo(4e-9, 15);
    expect([minFall.status, maxFall.status]).toEqual(['pass', 'fail']);
  });

  it('sees z high for 20 ns minus the difference of n1 rise and fall delays', () => {
    // z rises when y falls (after the rise delay) and falls when y rises (after the fall delay):
    // a high pulse of z lasts 20 ns + (fall − rise) = 21 ns at both corners (2−1, 4−3).
    for (const d of [fast, slow]) {
      const r = runPlan(d, plan)[2];
      expect(r.count).toBeGreaterThan(0);
      expect(r.min).toBeCloseTo(21e-9, 15);
      expect(r.max).toBeCloseTo(21e-9, 15);
    }
  });
});

describe('compare of the two corners', () => {
  it('reports the shift the HDL predicts for every net', () => {
    const r = compareDumps(fast, slow);
    const net = (n: string) => r.nets.find((x) => x.net === n)!;
    expect(net('corners.a').mean_shift_s).toBe(0);
    for (const [name, shift] of [
      ['corners.y', 2e-9],
      ['corners.z', 4e-9],
    ] as const) {
      const n = net(name);
      expect(n.added).toBe(0);
      expect(n.missing).toBe(0);
      expect(n.matched).toBe(n.base_edges);
      expect(n.min_shift_s).toBeCloseTo(shift, 15);
      expect(n.max_shift_s).toBeCloseTo(shift, 15);
      expect(n.mean_shift_s).toBeCloseTo(shift, 15);
    }
  });

  it('finds the first difference where y first lags, and none beyond a 4 ns tolerance', () => {
    const r = compareDumps(fast, slow);
    // Both corners start y at x; y settles to 0 at 1 ns (min) and 3 ns (max).
    expect(r.first_difference?.time_s).toBeCloseTo(1e-9, 15);
    const lasting = compareDumps(fast, slow, { toleranceS: 4e-9 });
    expect(lasting.first_difference).toBeNull();
  });
});
