// Merging shard results: the merged summary equals the one a single run over all dumps gives, and
// results of different plans or of other tools are refused.
import { describe, expect, it } from 'vitest';
import { MergeError, asCheckDocument, mergeDocuments } from '../../src/plan/merge';
import { type CheckDocument, type DumpCheck, type MeasurementOutcome, exitCodeOf, summarize } from '../../src/plan/result';

function outcome(id: string, status: MeasurementOutcome['status']): MeasurementOutcome {
  return { id, kind: 'delay', quantity: 'delay', unit: 's', status, message: status, limit_min: null, limit_max: 1e-9, count: 1, violations: status === 'fail' ? 1 : 0, min: 0, max: 0, mean: 0, worst: 0, worst_time_s: 0, margin: 0, worst_items: [], details: {}, elapsed_s: 0 };
}

function dump(file: string, ...statuses: MeasurementOutcome['status'][]): DumpCheck {
  return { file, bytes: 1, sha256: `sha-${file}`, timescale: '1ns', end_s: 0, error: null, warnings: [], elapsed_s: 0, measurements: statuses.map((s, i) => outcome(`m${i}`, s)) };
}

function doc(planSha: string, ...dumps: DumpCheck[]): CheckDocument {
  return {
    format: 'midrail-check-result',
    format_version: 1,
    tool: 'midrail',
    tool_version: '0.1.0',
    generated_at: '2026-01-01T00:00:00.000Z',
    hostname: 'shard',
    plan: { file: 'p.json', name: null, sha256: planSha, measurements: [] },
    dumps,
    summary: summarize(dumps),
    caution: '',
  };
}

describe('merging check results', () => {
  it('gives the summary and exit status of one run over every dump', () => {
    const all = [dump('a.vcd', 'pass', 'pass'), dump('b.vcd', 'pass', 'fail'), dump('c.vcd', 'pass', 'pass')];
    const merged = mergeDocuments([doc('p', all[0]), doc('p', all[1], all[2])], ['s1', 's2'], new Date(0), 'ci').doc;
    expect(merged.summary).toEqual(summarize(all));
    expect(merged.summary).toEqual({ dumps: 3, testcases: 6, passed: 5, failed: 1, errors: 0, status: 'fail' });
    expect(exitCodeOf(merged.summary)).toBe(1);
    expect(merged.dumps.map((d) => d.file)).toEqual(['a.vcd', 'b.vcd', 'c.vcd']);
    expect(merged.hostname).toBe('ci');
  });

  it('lets bad input in any shard decide the exit status', () => {
    const bad = { ...dump('x.vcd'), error: 'cannot read' };
    const merged = mergeDocuments([doc('p', dump('a.vcd', 'fail')), doc('p', bad)], ['s1', 's2'], new Date(0), 'ci').doc;
    expect(exitCodeOf(merged.summary)).toBe(2);
  });

  it('refuses results of different plans', () => {
    expect(() => mergeDocuments([doc('p1', dump('a.vcd', 'pass')), doc('p2', dump('b.vcd', 'pass'))], ['s1', 's2'], new Date(0), 'ci')).toThrow(/s2 was checked against a different plan/);
  });

  it('warns about a dump reported by two shards', () => {
    const r = mergeDocuments([doc('p', dump('a.vcd', 'pass')), doc('p', dump('a.vcd', 'pass'))], ['s1', 's2'], new Date(0), 'ci');
    expect(r.warnings[0]).toMatch(/a\.vcd appears twice/);
  });

  it('names the JSON path that makes a file not a check result', () => {
    expect(() => asCheckDocument({ format: 'midrail-plan' }, 'f.json')).toThrow(MergeError);
    expect(() => asCheckDocument({ format: 'midrail-plan' }, 'f.json')).toThrow(/f\.json: \$\.format/);
    expect(() => asCheckDocument({ ...doc('p'), format_version: 9 }, 'g.json')).toThrow(/\$\.format_version/);
    expect(() => asCheckDocument({ ...doc('p'), dumps: [{}] }, 'h.json')).toThrow(/\$\.dumps\[0\]/);
  });
});
