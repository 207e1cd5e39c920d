// The viewer's measurements on the iverilog sample (samples/sensor_hub.vcd, typical corner): every
// delay and glitch is known from the HDL's gate delays (samples/README.md, from hdl/sensor_hub.v).
// The item arrays the canvas and table use must hold the same pairs, events and glitches as the
// engine's result records (the CLI's --json contract), and limits must flag the same items that
// `midrail check` counts as violations.

import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseVcd } from '../../src/parse/vcd';
import { defaultGlitchWidth } from '../../src/view/measure/clockguess';
import { orderItems } from '../../src/view/measure/order';
import { delayRun, glitchRun, skewRun } from '../../src/view/measure/runs';
import { JUDGED, VIOLATES } from '../../src/view/measure/types';

const dump = parseVcd(readFileSync(new URL('../../samples/sensor_hub.vcd', import.meta.url)), 'sensor_hub.vcd');
const ns = (x: number) => x * 1e-9;

describe('delay in the viewer', () => {
  it('clk_ref → clk_spi pairs are all 0.75 ns both ways (u_clk.b_spi buf #0.75, samples/README.md)', () => {
    const { view, result } = delayRun(dump, { id: 'd', kind: 'delay', from: 'clk_ref', to: 'dut.clk_spi' });
    expect(view.figures.tPLH.min_s).toBeCloseTo(ns(0.75), 15);
    expect(view.figures.tPLH.max_s).toBeCloseTo(ns(0.75), 15);
    expect(view.figures.tPHL.min_s).toBeCloseTo(ns(0.75), 15);
    expect(view.figures.tPHL.max_s).toBeCloseTo(ns(0.75), 15);
    expect(view.items.count).toBe(result.pairs.length);
    // The arrays hold exactly the engine's pair records.
    result.pairs.forEach((p, i) => {
      expect(view.items.time[i]).toBe(p.to_time_s);
      expect(view.items.value[i]).toBe(p.delay_s);
      expect(['tPLH', 'tPHL', 'tPD'][view.items.kind[i]]).toBe(p.kind);
      expect(view.items.end[i] - view.items.start[i]).toBe(750); // 1 ps ticks
    });
  });

  it('clk_ref → clk_log through two inverters: tPLH 0.45 ns, tPHL 0.39 ns (i_log1 0.22/0.19, i_log2 0.26/0.17)', () => {
    const { view } = delayRun(dump, { id: 'd', kind: 'delay', from: 'clk_ref', to: 'dut.clk_log' });
    expect(view.figures.tPLH.max_s).toBeCloseTo(ns(0.45), 15);
    expect(view.figures.tPHL.max_s).toBeCloseTo(ns(0.39), 15);
    expect(view.figures.tpd_s).toBeCloseTo(ns(0.45), 15);
  });

  it('a max limit flags only the judged edge kind, and counts what `check` counts', () => {
    const { view } = delayRun(dump, { id: 'd', kind: 'delay', from: 'clk_ref', to: 'dut.clk_log', edge: 'fall', max: '0.4ns' });
    // tPHL is 0.39 ns: within 0.4 ns; tPLH (0.45 ns) is not judged at all.
    expect(view.violations).toBe(0);
    expect(view.judged).toBe(view.figures.tPHL.count);
    const tight = delayRun(dump, { id: 'd', kind: 'delay', from: 'clk_ref', to: 'dut.clk_log', max: '0.42ns' }).view;
    expect(tight.violations).toBe(tight.figures.tPLH.count);
    expect(tight.outcome?.status).toBe('fail');
    expect(tight.outcome?.violations).toBe(tight.violations);
    for (let i = 0; i < tight.items.count; i++) {
      expect(!!(tight.items.flags[i] & VIOLATES)).toBe(tight.items.kind[i] === 0);
      expect(tight.items.flags[i] & JUDGED).toBe(JUDGED);
    }
  });

  it('"worst first" puts the largest delay at the top of the table', () => {
    const { view } = delayRun(dump, { id: 'd', kind: 'delay', from: 'clk_ref', to: 'dut.clk_log' });
    const order = orderItems(view.items, 'value', true, {}, view.limits);
    expect(view.items.value[order[0]]).toBe(view.figures.tpd_s);
    const onlyFalls = orderItems(view.items, 'time', false, { kind: 1 }, view.limits);
    expect(onlyFalls.length).toBe(view.figures.tPHL.count);
  });
});

describe('skew in the viewer', () => {
  it('the clock leaves skew 0.33 ns on rising edges (clk_adc +0.42 … clk_spi +0.75, samples/README.md)', () => {
    const { view, result } = skewRun(dump, { id: 's', kind: 'skew', nets: 'dut.clk_adc,dut.clk_spi,dut.clk_irq,dut.clk_log', edge: 'rise' });
    expect(view.figures.max_skew_s).toBeCloseTo(ns(0.33), 15);
    expect(view.items.count).toBe(result.events.length);
    expect(view.nets[view.latest[0]].label).toBe('hub_bench.dut.clk_spi');
    expect(view.nets[view.earliest[0]].label).toBe('hub_bench.dut.clk_adc');
    for (let i = 0; i < view.items.count; i++) expect(view.items.end[i] - view.items.start[i]).toBeCloseTo(view.items.value[i] * 1e12, 6);
  });
});

describe('glitch scan in the viewer', () => {
  it('the default width is 10 % of clk_ref’s 20 ns period, the shortest steady clock (README: 50 MHz)', () => {
    const w = defaultGlitchWidth(dump);
    expect(w.source).toBe('clock');
    expect(w.periodS).toBeCloseTo(ns(20), 15);
    expect(w.seconds).toBeCloseTo(ns(2), 15);
  });

  it('with no steady clock, the default is 10 % of the shortest typical interval between changes', () => {
    // Hand-written data whose changes come 40, 60, 50, 80, 60, 100 ticks apart, over and over:
    // rise to rise it takes 100, 130 or 160 ticks, not steady enough to be a clock, and the
    // median of its intervals is 60 ticks.
    const gaps = [40, 60, 50, 80, 60, 100];
    let body = '#0\n0!\n';
    for (let i = 1, t = 0; i <= 20; i++) body += `#${(t += gaps[(i - 1) % gaps.length])}\n${i % 2}!\n`;
    const noClock = parseVcd(`$timescale 1ns $end\n$var wire 1 ! data $end\n$enddefinitions $end\n${body}`, 'data.vcd');
    const w = defaultGlitchWidth(noClock);
    expect(w.source).toBe('fallback');
    expect(w.periodS).toBeCloseTo(ns(60), 15);
    expect(w.seconds).toBeCloseTo(ns(6), 15);
  });

  it('holds exactly the engine records, in their order, whatever the width (built from the search arrays, not the records)', () => {
    for (const width of [ns(0.5), ns(1), ns(5), ns(40)]) {
      const { view, result } = glitchRun(dump, { seconds: width, source: 'given', clock: null, periodS: null });
      expect(view.items.count).toBe(result.glitches.length);
      expect(view.items.count).toBe(result.count);
      result.glitches.forEach((g, i) => {
        expect(view.targets[view.target[i]].label).toBe(g.net);
        expect(view.items.time[i]).toBe(g.start_s);
        expect(view.items.value[i]).toBe(g.width_s);
        expect(['low', 'high', 'zero-width', 'runt'][view.items.kind[i]]).toBe(g.polarity);
        expect((view.items.end[i] - view.items.start[i]) * 1e-12).toBeCloseTo(g.width_s, 18); // 1 ps ticks
      });
    }
  });

  it('below 1 ns: the three flash-select hazards and the one EEPROM decode glitch (samples/README.md)', () => {
    const { view } = glitchRun(dump, { seconds: ns(1), source: 'given', clock: null, periodS: null });
    const on = (path: string) => {
      const t = view.targets.findIndex((p) => p.label === path);
      return view.targetStart[t + 1] - view.targetStart[t];
    };
    expect(on('hub_bench.dut.u_dec.flash_sel')).toBe(3);
    expect(on('hub_bench.dut.cs_eeprom_n')).toBe(1);
    const t = view.targets.findIndex((p) => p.label === 'hub_bench.dut.u_dec.flash_sel');
    const first = view.byTarget[view.targetStart[t]];
    expect(view.items.time[first]).toBeCloseTo(ns(231.45), 15); // 230.9 ns + 0.55 ns
    expect(view.items.value[first]).toBeCloseTo(ns(0.6), 15);
    // The canvas reads each target's glitches in order from startByTarget and endByTarget.
    for (let j = 0; j < view.byTarget.length; j++) {
      expect(view.startByTarget[j]).toBe(view.items.start[view.byTarget[j]]);
      expect(view.endByTarget[j]).toBe(view.items.end[view.byTarget[j]]);
    }
    for (let k = 0; k < view.targets.length; k++) {
      for (let j = view.targetStart[k] + 1; j < view.targetStart[k + 1]; j++) expect(view.endByTarget[j]).toBeGreaterThanOrEqual(view.endByTarget[j - 1]);
    }
    // Narrower than 0.5 ns: only the 0.40 ns EEPROM glitch is left of these.
    const narrow = glitchRun(dump, { seconds: ns(0.5), source: 'given', clock: null, periodS: null }).view;
    const n = (path: string) => {
      const k = narrow.targets.findIndex((p) => p.label === path);
      return narrow.targetStart[k + 1] - narrow.targetStart[k];
    };
    expect(n('hub_bench.dut.u_dec.flash_sel')).toBe(0);
    expect(n('hub_bench.dut.cs_eeprom_n')).toBe(1);
  });
});
