// Plan validation: every wrong field is reported with its JSON path, so a person can find it.
import { readFileSync, readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { PlanError, parsePlan, planIssues } from '../../src/plan/validate';
import { PLAN_SCHEMA, formatPlan } from '../../src/plan/validate';

const good = {
  format: 'midrail-plan',
  version: 1,
  name: 'hub',
  levels: { 'top.v_out': '1.5V', 'top.clk*': '50%' },
  measurements: [
    { id: 'a_to_y', kind: 'delay', from: 'top.a', to: 'top.y', edge: 'fall', window: '20ns', max: '3ns' },
    { id: 'leaves', kind: 'skew', nets: 'top.clk_leaf*', edge: 'rise', max: '200ps' },
    { id: 'hazards', kind: 'glitch', max_width: '2ns', max: 0 },
    { id: 'strobe', kind: 'pulse-width', net: 'top.stb', polarity: 'low', min: '10ns' },
    { id: 'clk_duty', kind: 'period', net: 'top.clk', quantity: 'duty', min: '45%', max: '55%' },
    { id: 'clk_freq', kind: 'period', net: 'top.clk', quantity: 'frequency', max: '101MHz' },
    { id: 'clk_jit', kind: 'period', net: 'top.clk', edge: 'fall', quantity: 'jitter', max: '50ps' },
  ],
};

function paths(value: unknown): string[] {
  return planIssues(value).map((i) => i.path);
}

describe('plan validation', () => {
  it('accepts a plan using every kind and field', () => {
    expect(planIssues(good)).toEqual([]);
  });

  it('names the JSON path of an error in each field', () => {
    const bad = {
      format: 'midrail-plot',
      version: '1',
      colour: 'red',
      levels: { 'top.v_out': '1.5' },
      measurements: [
        { id: 'bad id!', kind: 'delay', from: 3, to: '', edge: 'up', window: '5', level: '50', min: '1MHz', max: '2 nanoseconds', windw: '1ns' },
        { id: 's', kind: 'skew', nets: [], edge: 'both', window: '-1ns', ref: 5, max: '3' },
        { id: 'g', kind: 'glitch', nets: 7, max_width: '0.5', min: -1, max: '0' },
        { id: 'p', kind: 'pulse-width', polarity: 'up' },
        { id: 'd', kind: 'period', net: 'top.clk', quantity: 'duty', min: '45', max: '10ns' },
        { id: 'f', kind: 'period', net: 'top.clk', quantity: 'frequency', edge: 'any', max: '10ns' },
        { id: 'k', kind: 'dleay' },
      ],
    };
    const got = paths(bad);
    for (const p of [
      '$.format',
      '$.version',
      '$.colour',
      '$.levels["top.v_out"]',
      '$.measurements[0].id',
      '$.measurements[0].from',
      '$.measurements[0].to',
      '$.measurements[0].edge',
      '$.measurements[0].window',
      '$.measurements[0].level',
      '$.measurements[0].min',
      '$.measurements[0].max',
      '$.measurements[0].windw',
      '$.measurements[1].nets',
      '$.measurements[1].edge',
      '$.measurements[1].window',
      '$.measurements[1].ref',
      '$.measurements[1].max',
      '$.measurements[2].nets',
      '$.measurements[2].max_width',
      '$.measurements[2].min',
      '$.measurements[2].max',
      '$.measurements[3]', // missing net
      '$.measurements[3].polarity',
      '$.measurements[4].min',
      '$.measurements[4].max',
      '$.measurements[5].edge',
      '$.measurements[5].max',
      '$.measurements[6].kind',
    ]) {
      expect(got, p).toContain(p);
    }
  });

  it('says which unit a limit needs', () => {
    const plan = { ...good, measurements: [{ id: 'x', kind: 'delay', from: 'a', to: 'b', max: '5MHz' }] };
    const [issue] = planIssues(plan);
    expect(issue.path).toBe('$.measurements[0].max');
    expect(issue.message).toMatch(/time with a unit/);
    expect(issue.message).toContain('"5MHz"');
    const duty = { ...good, measurements: [{ id: 'x', kind: 'period', net: 'c', quantity: 'duty', max: '5ns' }] };
    expect(planIssues(duty)[0].message).toMatch(/percentage/);
  });

  it('suggests the field meant by a misspelt one', () => {
    const plan = { ...good, measurements: [{ id: 'x', kind: 'delay', from: 'a', to: 'b', windw: '1ns' }] };
    expect(planIssues(plan)[0].message).toMatch(/did you mean 'window'/);
  });

  it('rejects duplicate ids, min above max, zero windows and levels outside 0..100%', () => {
    const plan = {
      ...good,
      levels: { 'top.a': '150%' },
      measurements: [
        { id: 'x', kind: 'delay', from: 'a', to: 'b', min: '5ns', max: '3ns' },
        { id: 'x', kind: 'skew', nets: 'a,b', window: '0ns' },
      ],
    };
    const issues = planIssues(plan);
    const byPath = Object.fromEntries(issues.map((i) => [i.path, i.message]));
    expect(byPath['$.levels["top.a"]']).toMatch(/between 0% and 100%/);
    expect(byPath['$.measurements[0].min']).toMatch(/above max/);
    expect(byPath['$.measurements[1].id']).toMatch(/duplicate id 'x'.*\$\.measurements\[0\]/);
    expect(byPath['$.measurements[1].window']).toMatch(/longer than zero/);
  });

  it('refuses a newer format version with advice', () => {
    expect(planIssues({ ...good, version: 2 })[0]).toEqual({ path: '$.version', message: expect.stringMatching(/version 2.*reads version 1/) });
  });

  it('reports a JSON syntax error with its line and column', () => {
    const text = '{\n  "format": "midrail-plan",\n  "version": 1,\n  "measurements": [,]\n}\n';
    let err: unknown;
    try {
      parsePlan(text, 'p.json');
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(PlanError);
    expect((err as Error).message).toMatch(/p\.json/);
    expect((err as Error).message).toMatch(/line 4, column 20/);
  });

  it('lists every problem in the error thrown by parsePlan', () => {
    const text = JSON.stringify({ ...good, measurements: [{ id: 'x', kind: 'delay', from: 'a', to: 'b', max: '1', min: '2' }] });
    expect(() => parsePlan(text, 'p.json')).toThrow(/2 problems[\s\S]*\$\.measurements\[0\]\.max[\s\S]*\$\.measurements\[0\]\.min/);
  });

  it('ships a schema file that is the one validation enforces', () => {
    const file = JSON.parse(readFileSync(new URL('../../src/plan/midrail-plan.schema.json', import.meta.url), 'utf8'));
    expect(file).toEqual(PLAN_SCHEMA);
    expect(file.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
  });

  it('accepts every sample plan shipped in samples/plans', () => {
    const folder = new URL('../../samples/plans/', import.meta.url);
    const files = readdirSync(folder).filter((f) => f.endsWith('.json'));
    expect(files.length).toBeGreaterThan(0);
    for (const f of files) expect(() => parsePlan(readFileSync(new URL(f, folder), 'utf8'), f)).not.toThrow();
  });

  it('saves a plan as text that loads back to the same plan, and refuses to save a broken one', () => {
    const text = formatPlan(good as Parameters<typeof formatPlan>[0]);
    expect(parsePlan(text, 'saved.json')).toEqual(good);
    expect(() => formatPlan({ ...good, measurements: [] } as unknown as Parameters<typeof formatPlan>[0])).toThrow(/\$\.measurements: expected at least 1 item/);
  });
});
