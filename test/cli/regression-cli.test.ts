// `midrail check`, `merge` and `compare` as a CI job runs them: the built CLI on iverilog dumps of one
// design at two delay corners (test/sim/regression-design.ts: IEEE 1364-2005 §7.14.1 min:typ:max
// delays; y lags a by 1 ns at min and 3 ns at max). A 2.5 ns limit on a→y holds at min and breaks
// at max, so the exit status, the JUnit XML and the workbook must say so. Needs `npm run prepare`.
import { execFile } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync } from 'node:fs';
import { mkdtemp, readFile, readdir, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import ExcelJS from 'exceljs';
import { XMLParser } from 'fast-xml-parser';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { cleanupSimulations, simulate } from '../sim/iverilog';
import { CORNER_DESIGN } from '../sim/regression-design';

const CLI = resolve(process.env.MIDRAIL_CLI ?? 'dist/cli/main.js');

interface Run {
  code: number;
  stdout: string;
  stderr: string;
}

function midrail(args: string[], cwd: string): Promise<Run> {
  return new Promise((done) => {
    execFile('node', [CLI, ...args], { cwd, maxBuffer: 64 << 20 }, (err, stdout, stderr) => {
      done({ code: err ? ((err as { code?: number }).code ?? -1) : 0, stdout, stderr });
    });
  });
}

const PLAN = {
  format: 'midrail-plan',
  version: 1,
  name: 'corners',
  measurements: [
    { id: 'a_to_y', kind: 'delay', from: 'a', to: 'y', max: '2.5ns' },
    { id: 'z_fall', kind: 'delay', from: 'y', to: 'z', edge: 'fall', max: '5ns' },
  ],
};

let dir: string;
const sha = async (p: string) => createHash('sha256').update(await readFile(p)).digest('hex');

beforeAll(async () => {
  if (!existsSync(CLI)) throw new Error(`${CLI} is missing: run 'npm run prepare' to build the CLI first`);
  dir = await mkdtemp(join(tmpdir(), 'midrail-regress-'));
  const [min, max] = await Promise.all([simulate(CORNER_DESIGN, { dumpTop: 'corners', corner: 'min' }), simulate(CORNER_DESIGN, { dumpTop: 'corners', corner: 'max' })]);
  await writeFile(join(dir, 'run_min.vcd'), min.bytes);
  await writeFile(join(dir, 'run_max.vcd'), max.bytes);
  await writeFile(join(dir, 'plan.json'), JSON.stringify(PLAN, null, 2));
});

afterAll(async () => {
  await cleanupSimulations();
  if (dir) await rm(dir, { recursive: true, force: true });
});

describe('midrail check', () => {
  it('exits 0 when every limit holds (min corner)', async () => {
    const r = await midrail(['check', 'run_min.vcd', '--plan', 'plan.json'], dir);
    expect(r.stderr).toBe('');
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/2 testcases: 2 passed, 0 failed, 0 errors/);
  });

  it('exits 1 with JUnit, workbook and CSV that show the broken limit (both corners, worker threads)', async () => {
    const r = await midrail(['check', 'run_*.vcd', '--plan', 'plan.json', '--jobs', '2', '--json', '--junit', 'out.xml', '--xlsx', 'out.xlsx', '--csv', 'csv'], dir);
    expect(r.code).toBe(1);
    const doc = JSON.parse(r.stdout);
    expect(doc.dumps.map((d: { file: string }) => d.file)).toEqual(['run_max.vcd', 'run_min.vcd']);
    const [max, min] = doc.dumps;
    expect(min.measurements.map((m: { status: string }) => m.status)).toEqual(['pass', 'pass']);
    expect(max.measurements[0].status).toBe('fail');
    expect(max.measurements[0].worst).toBeCloseTo(3e-9, 15);
    expect(max.measurements[0].margin).toBeCloseTo(-5e-10, 15);
    expect(max.sha256).toBe(await sha(join(dir, 'run_max.vcd')));
    expect(doc.plan.sha256).toBe(await sha(join(dir, 'plan.json')));

    const junit = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '', isArray: (n) => ['testsuite', 'testcase'].includes(n) }).parse(await readFile(join(dir, 'out.xml'), 'utf8'));
    const suites = junit.testsuites.testsuite;
    expect(suites.map((s: { name: string }) => s.name)).toEqual(['run_max.vcd', 'run_min.vcd']);
    expect(suites[0].failures).toBe('1');
    expect(suites[1].failures).toBe('0');
    expect(suites[0].testcase[0].failure.message).toMatch(/3 ns at 13 ns .*margin -500 ps/);

    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(join(dir, 'out.xlsx'));
    expect(wb.worksheets.map((w) => w.name)).toEqual(['Summary', 'a_to_y', 'z_fall', 'Provenance']);
    const summary = wb.getWorksheet('Summary')!;
    const head = (summary.getRow(1).values as unknown[]).slice(1);
    const row = (summary.getRow(2).values as unknown[]).slice(1);
    const cell = (name: string) => row[head.indexOf(name)];
    expect([cell('dump'), cell('measurement'), cell('status'), cell('unit')]).toEqual(['run_max.vcd', 'a_to_y', 'fail', 's']);
    expect(cell('worst')).toBeCloseTo(3e-9, 15);
    expect(cell('limit_max')).toBeCloseTo(2.5e-9, 15);
    expect(cell('margin')).toBeCloseTo(-5e-10, 15);
    const prov = wb.getWorksheet('Provenance')!;
    const provText = JSON.stringify(prov.getSheetValues());
    expect(provText).toContain(await sha(join(dir, 'run_min.vcd')));
    expect(provText).toContain(await sha(join(dir, 'plan.json')));
    expect(provText).toMatch(/midrail \d+\.\d+\.\d+/);

    expect((await readdir(join(dir, 'csv'))).sort()).toEqual(['a_to_y.csv', 'provenance.csv', 'summary.csv', 'z_fall.csv']);
  });

  it('gives the same verdicts with one job as with two', async () => {
    const strip = (s: string) => JSON.parse(s).dumps.map((d: { file: string; measurements: Array<{ id: string; status: string; worst: number; margin: number }> }) => [d.file, d.measurements.map((m) => [m.id, m.status, m.worst, m.margin])]);
    const one = await midrail(['check', 'run_max.vcd', 'run_min.vcd', '--plan', 'plan.json', '--jobs', '1', '--json'], dir);
    const two = await midrail(['check', 'run_max.vcd', 'run_min.vcd', '--plan', 'plan.json', '--jobs', '2', '--json'], dir);
    expect(strip(one.stdout)).toEqual(strip(two.stdout));
  });

  it('exits 2 naming the JSON path of a bad plan field', async () => {
    await writeFile(join(dir, 'bad.json'), JSON.stringify({ ...PLAN, measurements: [{ id: 'x', kind: 'delay', from: 'a', to: 'y', max: '2.5' }] }));
    const r = await midrail(['check', 'run_min.vcd', '--plan', 'bad.json'], dir);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/bad\.json.*\n.*\$\.measurements\[0\]\.max: expected a time with a unit/);
  });

  it('exits 2 when a net of the plan is missing, naming its JSON path, and still reports the rest', async () => {
    await writeFile(join(dir, 'missing.json'), JSON.stringify({ ...PLAN, measurements: [...PLAN.measurements, { id: 'w', kind: 'pulse-width', net: 'top.nothere' }] }));
    const r = await midrail(['check', 'run_min.vcd', '--plan', 'missing.json', '--json'], dir);
    expect(r.code).toBe(2);
    const doc = JSON.parse(r.stdout);
    expect(doc.dumps[0].measurements.map((m: { status: string }) => m.status)).toEqual(['pass', 'pass', 'error']);
    expect(doc.dumps[0].measurements[2].message).toMatch(/^\$\.measurements\[2\]\.net: no net named 'top\.nothere'/);
  });

  it('exits 2 on an unreadable dump and on a glob that matches nothing', async () => {
    const gone = await midrail(['check', 'run_min.vcd', 'nothere.vcd', '--plan', 'plan.json'], dir);
    expect(gone.code).toBe(2);
    expect(gone.stderr).toMatch(/nothere\.vcd.*no such file/);
    const none = await midrail(['check', 'zzz*.vcd', '--plan', 'plan.json'], dir);
    expect(none.code).toBe(2);
    expect(none.stderr).toMatch(/'zzz\*\.vcd' matches no file/);
  });
});

describe('midrail merge', () => {
  it('combines shard results into the summary one run would give, with its exit status', async () => {
    const a = await midrail(['check', 'run_min.vcd', '--plan', 'plan.json', '--json'], dir);
    const b = await midrail(['check', 'run_max.vcd', '--plan', 'plan.json', '--json'], dir);
    await writeFile(join(dir, 'shard1.json'), a.stdout);
    await writeFile(join(dir, 'shard2.json'), b.stdout);
    const m = await midrail(['merge', 'shard1.json', 'shard2.json', '--json', '--junit', 'merged.xml', '--xlsx', 'merged.xlsx'], dir);
    expect(m.code).toBe(1);
    const doc = JSON.parse(m.stdout);
    expect(doc.summary).toEqual({ dumps: 2, testcases: 4, passed: 3, failed: 1, errors: 0, status: 'fail' });
    expect(doc.dumps.map((d: { file: string }) => d.file)).toEqual(['run_min.vcd', 'run_max.vcd']);
    const junit = await readFile(join(dir, 'merged.xml'), 'utf8');
    expect(junit.match(/<testsuite /g)).toHaveLength(2);
    expect(existsSync(join(dir, 'merged.xlsx'))).toBe(true);
    // A merged result merges again.
    await writeFile(join(dir, 'merged.json'), m.stdout);
    expect((await midrail(['merge', 'merged.json'], dir)).code).toBe(1);
    expect((await midrail(['merge', 'shard1.json'], dir)).code).toBe(0);
  });

  it('refuses results of different plans and files that are not check results', async () => {
    await writeFile(join(dir, 'plan2.json'), JSON.stringify({ ...PLAN, name: 'other' }));
    const other = await midrail(['check', 'run_min.vcd', '--plan', 'plan2.json', '--json'], dir);
    await writeFile(join(dir, 'other.json'), other.stdout);
    const r = await midrail(['merge', 'shard1.json', 'other.json'], dir);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/different plan/);
    const notResult = await midrail(['merge', 'plan.json'], dir);
    expect(notResult.code).toBe(2);
    expect(notResult.stderr).toMatch(/plan\.json: \$\.format: expected "midrail-check-result"/);
  });
});

describe('midrail compare', () => {
  it('reports the 2 ns shift of y and 4 ns of z between the corners', async () => {
    const r = await midrail(['compare', 'run_min.vcd', 'run_max.vcd', '--json'], dir);
    expect(r.code).toBe(0);
    const doc = JSON.parse(r.stdout);
    const net = (n: string) => doc.nets.find((x: { net: string }) => x.net === n);
    expect(net('corners.y').mean_shift_s).toBeCloseTo(2e-9, 15);
    expect(net('corners.z').mean_shift_s).toBeCloseTo(4e-9, 15);
    expect(net('corners.z').added + net('corners.z').missing).toBe(0);
  });

  it('writes CSV rows per net and a workbook, and takes a tolerance', async () => {
    const csv = await midrail(['compare', 'run_min.vcd', 'run_max.vcd', '--nets', 'corners.y', '--csv', '--xlsx', 'cmp.xlsx'], dir);
    expect(csv.code).toBe(0);
    const lines = csv.stdout.trim().split('\r\n');
    expect(lines[0]).toMatch(/^"net","kind","base_edges"/);
    expect(lines[1]).toMatch(/^"corners\.y","logic",/);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(join(dir, 'cmp.xlsx'));
    expect(wb.worksheets.map((w) => w.name)).toEqual(['Nets', 'First difference', 'Not compared', 'Provenance']);
    const quiet = await midrail(['compare', 'run_min.vcd', 'run_max.vcd', '--tolerance', '4ns'], dir);
    expect(quiet.stdout).toMatch(/no value differs longer than 4 ns/);
    const bad = await midrail(['compare', 'run_min.vcd', 'run_max.vcd', '--tolerance', '4'], dir);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/--tolerance: time '4' has no unit/);
  });
});
