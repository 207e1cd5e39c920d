// Running a plan on a small dump whose every edge is known, so each figure can be worked out by hand
// from the definitions: IEEE 181-2011 pulse duration (leading to trailing mesial instant), period
// between like transitions, duty cycle = pulse duration / period (from memory, see
// shared notes/standards.md); cycle-to-cycle jitter = |difference of adjacent periods| (common practice).
import { describe, expect, it } from 'vitest';
import { parseVcd } from '../../src/parse/vcd';
import { runPlan } from '../../src/plan/run';
import type { MeasurementSpec, Plan } from '../../src/plan/types';
import { toPlan } from '../../src/plan/validate';

// clk rises at 10, 20, 30, 41 and falls at 15, 26, 35, 46 (ns):
//   high pulses 5, 6, 5, 5; low pulses 5, 4, 6; periods 10, 10, 11; duty 50 %, 60 %, 5/11;
//   jitter |10-10| = 0 at 20, |11-10| = 1 at 30.
// a rises at 12 and falls at 32; y follows at 14 (tPLH 2 ns) and 35 (tPHL 3 ns).
// g has one 1 ns high pulse at 44. u is high 10..16 with an x at 12..13, then high 20..25.
const VCD = `$timescale 1ns $end
$scope module top $end
$var wire 1 ! clk $end
$var wire 1 " a $end
$var wire 1 # y $end
$var wire 1 $ g $end
$var wire 1 % u $end
$upscope $end
$enddefinitions $end
#0
$dumpvars 0! 0" 0# 0$ 0% $end
#10 1! 1%
#12 1" x%
#13 1%
#14 1#
#15 0!
#16 0%
#20 1! 1%
#25 0%
#26 0!
#30 1!
#32 0"
#35 0! 0#
#41 1!
#44 1$
#45 0$
#46 0!
#50
`;

const dump = parseVcd(VCD, 'known.vcd');

function run(...measurements: object[]) {
  const plan = toPlan({ format: 'midrail-plan', version: 1, measurements }, 'plan.json') as Plan;
  return runPlan(dump, plan);
}

function one(m: Partial<MeasurementSpec> & { kind: string }) {
  return run({ id: 'm', ...m })[0];
}

describe('running a plan', () => {
  it('fails a delay limit at the worst pair with its time and margin', () => {
    const r = one({ kind: 'delay', from: 'a', to: 'y', max: '2.5ns' });
    expect(r.status).toBe('fail');
    expect(r.count).toBe(2);
    expect(r.violations).toBe(1);
    expect(r.worst).toBeCloseTo(3e-9, 18);
    expect(r.worst_time_s).toBeCloseTo(35e-9, 18);
    expect(r.margin).toBeCloseTo(-0.5e-9, 18);
    expect(r.message).toMatch(/tPHL/);
    expect(r.message).toMatch(/35 ns/);
    expect(r.message).toMatch(/margin -500 ps/);
  });

  it('counts only tPLH pairs when the output edge is rise', () => {
    const r = one({ kind: 'delay', from: 'a', to: 'y', edge: 'rise', max: '2.5ns' });
    expect(r.status).toBe('pass');
    expect(r.count).toBe(1);
    expect(r.margin).toBeCloseTo(0.5e-9, 18);
  });

  it('measures high and low pulse durations', () => {
    const high = one({ kind: 'pulse-width', net: 'clk', min: '5ns', max: '5.5ns' });
    expect(high.count).toBe(4);
    expect(high.status).toBe('fail');
    expect(high.worst).toBeCloseTo(6e-9, 18);
    expect(high.worst_time_s).toBeCloseTo(20e-9, 18);
    expect(high.margin).toBeCloseTo(-0.5e-9, 18);
    const low = one({ kind: 'pulse-width', net: 'clk', polarity: 'low', min: '4.5ns' });
    expect(low.count).toBe(3);
    expect(low.worst).toBeCloseTo(4e-9, 18);
    expect(low.worst_time_s).toBeCloseTo(26e-9, 18);
  });

  it('does not measure a pulse that holds an unknown span', () => {
    const r = one({ kind: 'pulse-width', net: 'u' });
    expect(r.count).toBe(1);
    expect(r.min).toBeCloseTo(5e-9, 18);
    expect(r.worst_time_s).toBeCloseTo(20e-9, 18);
  });

  it('measures period, frequency, duty cycle and cycle-to-cycle jitter', () => {
    const [period, freq, duty, jitter] = run(
      { id: 'p', kind: 'period', net: 'clk', max: '10.5ns' },
      { id: 'f', kind: 'period', net: 'clk', quantity: 'frequency', min: '95MHz' },
      { id: 'd', kind: 'period', net: 'clk', quantity: 'duty', min: '45%', max: '55%' },
      { id: 'j', kind: 'period', net: 'clk', quantity: 'jitter', max: '0.5ns' },
    );
    expect(period.count).toBe(3);
    expect(period.worst).toBeCloseTo(11e-9, 18);
    expect(period.worst_time_s).toBeCloseTo(30e-9, 18);
    expect(period.margin).toBeCloseTo(-0.5e-9, 18);
    expect(freq.worst).toBeCloseTo(1 / 11e-9, 3);
    expect(freq.status).toBe('fail');
    expect(duty.worst).toBeCloseTo(60, 9);
    expect(duty.worst_time_s).toBeCloseTo(20e-9, 18);
    expect(duty.margin).toBeCloseTo(-5, 9);
    expect(duty.min).toBeCloseTo((100 * 5) / 11, 9);
    expect(duty.unit).toBe('%');
    expect(jitter.count).toBe(2);
    expect(jitter.worst).toBeCloseTo(1e-9, 18);
    expect(jitter.worst_time_s).toBeCloseTo(30e-9, 18);
    expect(jitter.status).toBe('fail');
  });

  it('measures falling-edge cycles with the high time inside each', () => {
    const r = one({ kind: 'period', net: 'clk', edge: 'fall', quantity: 'duty' });
    // Falls at 15, 26, 35, 46: cycles of 11, 9, 11 ns with high times 6 (20..26), 5 (30..35), 5 (41..46),
    // so duty cycles of 6/11, 5/9 and 5/11.
    expect(r.count).toBe(3);
    expect(r.max).toBeCloseTo((100 * 5) / 9, 9);
    expect(r.mean).toBeCloseTo((100 * (6 / 11 + 5 / 9 + 5 / 11)) / 3, 9);
    expect(r.min).toBeCloseTo((100 * 5) / 11, 9);
  });

  it('limits the number of glitches and points at the first', () => {
    const r = one({ kind: 'glitch', nets: 'g', max_width: '2ns', max: 0 });
    expect(r.status).toBe('fail');
    expect(r.worst).toBe(1);
    expect(r.margin).toBe(-1);
    expect(r.worst_time_s).toBeCloseTo(44e-9, 18);
    expect(r.worst_items[0].value).toBeCloseTo(1e-9, 18);
    const none = one({ kind: 'glitch', nets: 'clk', max_width: '2ns', max: 0 });
    expect(none.status).toBe('pass');
    expect(none.margin).toBe(0);
  });

  it('fails a limited measurement that found nothing to check', () => {
    const r = one({ kind: 'delay', from: 'g', to: 'a', window: '1ns', max: '5ns' });
    expect(r.status).toBe('fail');
    expect(r.message).toMatch(/no pairs found/);
  });

  it('passes a measurement without limits and reports its worst value', () => {
    const r = one({ kind: 'skew', nets: 'a,y' });
    expect(r.status).toBe('pass');
    expect(r.margin).toBeNull();
    expect(r.worst).toBeCloseTo(3e-9, 18);
  });

  it('names the JSON path of a net that matches nothing, and still runs the others', () => {
    const [bad, good] = run({ id: 'x', kind: 'delay', from: 'top.nothere', to: 'y' }, { id: 'z', kind: 'pulse-width', net: 'clk' });
    expect(bad.status).toBe('error');
    expect(bad.message).toMatch(/^\$\.measurements\[0\]\.from: no net named 'top\.nothere'/);
    expect(good.status).toBe('pass');
    const [glob] = run({ id: 's', kind: 'skew', nets: ['a', 'top.leaf*'] });
    expect(glob.message).toMatch(/^\$\.measurements\[0\]\.nets: the pattern 'top\.leaf\*' matches no net/);
  });

  it('asks for one bit when a pulse measurement names a vector', () => {
    const vec = parseVcd('$timescale 1ns $end\n$var wire 4 ! bus [3:0] $end\n$enddefinitions $end\n#0\nb0 !\n#5\nb1 !\n', 'v.vcd');
    const plan = toPlan({ format: 'midrail-plan', version: 1, measurements: [{ id: 'w', kind: 'pulse-width', net: 'bus' }] }, 'p');
    expect(runPlan(vec, plan)[0].message).toMatch(/\$\.measurements\[0\]\.net: .*name one bit, such as bus\[0\]/);
  });

  it('names the levels entry that matches no net', () => {
    const plan = toPlan({ format: 'midrail-plan', version: 1, levels: { 'top.zz*': '40%' }, measurements: [{ id: 'z', kind: 'pulse-width', net: 'clk' }] }, 'p');
    const [r] = runPlan(dump, plan);
    expect(r.status).toBe('error');
    expect(r.message).toMatch(/\$\.levels\["top\.zz\*"\]/);
  });
});
