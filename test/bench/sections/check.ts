// Section 3 (issue 6): `midrail check` over many synthetic dumps with a ten-measurement plan, run
// as the built CLI in a child process: wall time with --jobs 1 and --jobs 2 and their ratio, and
// the process's peak resident memory (worker threads included) against the indexed arrays of the
// largest single dump, as the parse section counts them.

import { existsSync, readFileSync, readdirSync, statSync } from 'node:fs';
import { loadavg } from 'node:os';
import { join } from 'node:path';
import type { CheckDocument } from '../../../src/plan/result';
import { REPO_ROOT, type CliRun, dropCliSnapshot, runCli, snapshotCli } from '../child/cliRun';
import type { ParseResult } from '../child/parseTask';
import { runChild } from '../child/spawnTask';
import { loadParser } from '../engines';
import { CHECK_PLAN, type CheckDumpFile, checkDumps, checkPlanFile } from '../gen/checkDumps';
import type { BenchOptions } from '../options';
import { checkProfile } from './checkProfile';
import { fixed, heading, info, mb, table, target } from '../report';

const SECTION = 'check';
/** Issue 6 targets. */
const MAX_JOBS_RATIO = 0.65;
const MAX_PEAK_OVER_ARRAYS = 2.5;
const ROUNDS = 2;

interface Run {
  round: number;
  jobs: number;
  /** 1-minute load average just before the run: other work on the shared machine. */
  load: number;
  cli: CliRun;
  /** Sum over dumps of each dump's own elapsed time (read, parse, hash, measure), from the result document. */
  dumpSeconds: number;
  measureSeconds: number;
}

/** The sources the built CLI comes from; a newer one means dist/cli is stale. */
const SOURCE_DIRS = ['src/cli', 'src/cli/commands', 'src/parse', 'src/model', 'src/measure', 'src/plan'];

function staleSources(builtMs: number): string[] {
  const newer: string[] = [];
  for (const d of SOURCE_DIRS) {
    const dir = join(REPO_ROOT, d);
    if (!existsSync(dir)) continue;
    for (const f of readdirSync(dir)) {
      if (f.endsWith('.ts') && statSync(join(dir, f)).mtimeMs > builtMs) newer.push(`${d}/${f}`);
    }
  }
  return newer;
}

/** Every dump and measurement passed, and the counts the generator knows agree. */
function verify(doc: CheckDocument, dumps: CheckDumpFile[]): string[] {
  const problems: string[] = [];
  const byPath = new Map(dumps.map((d) => [d.path, d.meta]));
  if (doc.dumps.length !== dumps.length) problems.push(`${doc.dumps.length} dumps in the result, ${dumps.length} given`);
  for (const d of doc.dumps) {
    const meta = byPath.get(d.file);
    const name = d.file.split('/').pop();
    if (d.error !== null) problems.push(`${name}: ${d.error}`);
    if (d.measurements.length !== CHECK_PLAN.measurements.length) problems.push(`${name}: ${d.measurements.length} measurements`);
    for (const m of d.measurements) if (m.status !== 'pass') problems.push(`${name} ${m.id}: ${m.status}: ${m.message}`);
    const count = (id: string) => d.measurements.find((m) => m.id === id)?.count;
    if (meta) {
      if (count('strobe_glitches') !== meta.strobeGlitches) problems.push(`${name}: strobe glitches ${count('strobe_glitches')} (generator wrote ${meta.strobeGlitches})`);
      if (count('q0_clock_to_out') !== meta.q0Toggles) problems.push(`${name}: q0 pairs ${count('q0_clock_to_out')} (generator wrote ${meta.q0Toggles} toggles)`);
      if (count('q5_rise_from_leaf2') !== meta.q5Rises) problems.push(`${name}: q5 rises ${count('q5_rise_from_leaf2')} (generator wrote ${meta.q5Rises})`);
    }
  }
  return problems;
}

async function runCheck(round: number, jobs: number, files: string[], plan: string, dumps: CheckDumpFile[]): Promise<Run> {
  const load = loadavg()[0];
  const cli = await runCli(['check', ...files, '--plan', plan, '--json', '--jobs', String(jobs)]);
  if (cli.code !== 0) throw new Error(`midrail check --jobs ${jobs} exited ${cli.code}: ${cli.stderr.trim().split('\n').slice(-4).join(' | ')}`);
  const doc = JSON.parse(cli.stdout) as CheckDocument;
  const problems = verify(doc, dumps);
  for (const p of problems.slice(0, 8)) info(`CHECK FAILED (--jobs ${jobs}): ${p}`);
  let dumpSeconds = 0;
  let measureSeconds = 0;
  for (const d of doc.dumps) {
    dumpSeconds += d.elapsed_s;
    for (const m of d.measurements) measureSeconds += m.elapsed_s;
  }
  return { round, jobs, load, cli, dumpSeconds, measureSeconds };
}

/** Bytes of the largest dump's typed arrays (times, per-signal index and values), from one parse in a child. */
async function largestArrays(largest: CheckDumpFile): Promise<number | null> {
  if (!(await loadParser())) return null;
  const p = await runChild<ParseResult>('parse', { path: largest.path });
  if (p.changes !== largest.meta.changes) info(`CHECK FAILED: parser gave ${p.changes} changes for ${largest.path} (generator wrote ${largest.meta.changes})`);
  const arrays = p.held.times + p.held.logic + p.held.vector + p.held.real;
  info(`largest dump's indexed arrays: ${mb(arrays)} (${fixed(arrays / p.changes)} B/change), from one parse in a child;`);
  info(`that parse alone peaked ${mb(p.peakRssDelta)} above its baseline (${fixed(p.peakRssDelta / arrays)}× arrays): the floor for one dump in flight`);
  return arrays;
}

/** Reads every dump once so the timed runs all find them in the OS page cache. */
function warmPageCache(dumps: CheckDumpFile[]): void {
  for (const d of dumps) readFileSync(d.path);
}

export async function checkSection(opts: BenchOptions): Promise<void> {
  try {
    await measureCheck(opts);
  } finally {
    dropCliSnapshot();
  }
}

async function measureCheck(opts: BenchOptions): Promise<void> {
  const count = opts.quick ? 6 : 20;
  const size = opts.quick ? 10 : 20;
  heading(`Check (issue 6): midrail check, ${count} dumps of ${size} MB, ${CHECK_PLAN.measurements.length}-measurement plan, built CLI as a child process`);
  const notMeasured = (why: string) => {
    info(why);
    target({ section: SECTION, name: '--jobs 2 ÷ --jobs 1 wall time', value: null, limit: MAX_JOBS_RATIO, bound: 'max', unit: '', note: why });
    target({ section: SECTION, name: 'peak resident ÷ largest dump\'s arrays', value: null, limit: MAX_PEAK_OVER_ARRAYS, bound: 'max', unit: '×', note: why });
  };
  const built = snapshotCli();
  if (built === null) return notMeasured('the CLI is not built (dist/cli/main.js, dist/cli/checkWorker.js): run npm run prepare');
  const stale = staleSources(built);
  if (stale.length) info(`WARNING: dist/cli is older than ${stale.slice(0, 4).join(', ')}${stale.length > 4 ? ', …' : ''}: run npm run prepare first`);

  const t0 = Date.now();
  const dumps = checkDumps(count, size);
  const fresh = dumps.filter((d) => d.fresh).length;
  if (fresh) info(`generated ${fresh} dump(s) in ${fixed((Date.now() - t0) / 1e3)} s`);
  const plan = checkPlanFile();
  const files = dumps.map((d) => d.path);
  const totalBytes = dumps.reduce((s, d) => s + d.meta.bytes, 0);
  const largest = [...dumps].sort((a, b) => b.meta.bytes - a.meta.bytes)[0];
  info(`${count} dumps, ${mb(totalBytes)} in all, ${largest.meta.nets} nets and ~${fixed(largest.meta.changes / 1e6)} M changes each; plan ${plan}`);
  const arrays = await largestArrays(largest);

  warmPageCache(dumps);
  // Fixed cost: the same CLI on two tiny dumps, so the peak is Node, the code and the worker isolates.
  const sample = ['samples/sensor_hub.vcd', 'samples/sensor_hub_slow.vcd'];
  const fixedRss = new Map<number, number>();
  for (const jobs of [1, 2]) {
    const r = await runCli(['check', ...sample, '--plan', 'samples/plans/sensor_hub.plan.json', '--json', '--jobs', String(jobs)]);
    fixedRss.set(jobs, r.peakRss);
  }

  info(`load average before the timed runs: ${loadavg().map((l) => l.toFixed(1)).join(' ')} (2 cores shared with other work)`);
  const runs: Run[] = [];
  for (let round = 1; round <= ROUNDS; round++) {
    // Alternating, so a burst of load from elsewhere tends to hit both settings.
    for (const jobs of round % 2 ? [1, 2] : [2, 1]) {
      try {
        runs.push(await runCheck(round, jobs, files, plan, dumps));
      } catch (e) {
        info(`round ${round}, --jobs ${jobs}: ${(e as Error).message}`);
      }
    }
  }

  table(
    ['round', 'jobs', 'load', 'wall s', 'CPU s', 'sys s', 'faults', 'MB/s', 'peak RSS', 'fixed RSS', 'Σ per-dump s', 'Σ measure s', 'busy ÷ wall'],
    runs.map((r) => [
      String(r.round),
      String(r.jobs),
      fixed(r.load),
      fixed(r.cli.wallMs / 1e3),
      r.cli.userS !== null && r.cli.sysS !== null ? fixed(r.cli.userS + r.cli.sysS) : '—',
      r.cli.sysS !== null ? fixed(r.cli.sysS) : '—',
      r.cli.minorFaults !== null ? `${fixed(r.cli.minorFaults / 1e3)} k` : '—',
      fixed(totalBytes / 1e6 / (r.cli.wallMs / 1e3)),
      mb(r.cli.peakRss),
      mb(fixedRss.get(r.jobs) ?? 0),
      fixed(r.dumpSeconds),
      fixed(r.measureSeconds),
      fixed(r.dumpSeconds / (r.cli.wallMs / 1e3)),
    ]),
  );
  info('Σ per-dump s = sum of each dump\'s elapsed_s in the result (read + parse + hash + measure, in its thread);');
  info('busy ÷ wall = how many dumps were in progress on average; fixed RSS = peak of the same CLI on the two tiny samples;');
  info('load = 1-minute load average before the run; CPU s = user + sys over all threads; faults = minor page faults (GNU time)');
  info(`peak RSS from ${runs[0]?.cli.peakSource ?? 'none'}; worker threads share the process, so it covers them`);

  const byRound = (jobs: number, round: number) => runs.find((r) => r.jobs === jobs && r.round === round);
  const ratios: string[] = [];
  for (let round = 1; round <= ROUNDS; round++) {
    const a = byRound(1, round);
    const b = byRound(2, round);
    if (a && b) ratios.push(`round ${round}: ${fixed(b.cli.wallMs / a.cli.wallMs)}`);
  }
  const best = (jobs: number) => runs.filter((r) => r.jobs === jobs).sort((a, b) => a.cli.wallMs - b.cli.wallMs)[0];
  const one = best(1);
  const two = best(2);
  if (one && two) {
    const perDump = (r: Run) => r.dumpSeconds / count;
    info(`--jobs 2 ÷ --jobs 1 per round: ${ratios.join(', ')}; a dump takes ${fixed(perDump(two) / perDump(one))}× as long when two run at once`);
  }
  const cpu = (r: Run) => (r.cli.userS !== null && r.cli.sysS !== null ? r.cli.userS + r.cli.sysS : null);
  const cpuOf = (jobs: number) => {
    const v = runs.filter((r) => r.jobs === jobs).map(cpu).filter((c): c is number => c !== null);
    return v.length ? Math.min(...v) : null;
  };
  const cpu1 = cpuOf(1);
  const cpu2 = cpuOf(2);
  if (cpu1 !== null && cpu2 !== null && one) {
    // CPU seconds hardly depend on other load, unlike wall time: they show the cost of running two at once.
    info(
      `CPU seconds (all threads, least of ${ROUNDS}): --jobs 2 ÷ --jobs 1 = ${fixed(cpu2 / cpu1)}; --jobs 1 keeps ${fixed((cpu(one) ?? cpu1) / (one.cli.wallMs / 1e3))} cores busy ` +
        `(V8's background GC threads); so on two free cores --jobs 2 could take at best ${fixed(cpu2 / 2 / (one.cli.wallMs / 1e3))}× the --jobs 1 time`,
    );
  }
  target({
    section: SECTION,
    name: '--jobs 2 ÷ --jobs 1 wall time',
    value: one && two ? two.cli.wallMs / one.cli.wallMs : null,
    limit: MAX_JOBS_RATIO,
    bound: 'max',
    unit: '',
    note: one && two ? `best of ${ROUNDS} each: ${fixed(two.cli.wallMs / 1e3)} s ÷ ${fixed(one.cli.wallMs / 1e3)} s; per round ${ratios.join(', ')}` : 'runs failed',
  });
  const peak = (jobs: number) => Math.max(0, ...runs.filter((r) => r.jobs === jobs).map((r) => r.cli.peakRss));
  if (arrays !== null) {
    for (const jobs of [1, 2]) {
      const fx = fixedRss.get(jobs) ?? 0;
      info(`--jobs ${jobs}: peak ${mb(peak(jobs))} = ${fixed(peak(jobs) / arrays)}× arrays; above the fixed ${mb(fx)}: ${fixed((peak(jobs) - fx) / arrays)}× arrays`);
    }
  }
  const judged = peak(2) || peak(1);
  target({
    section: SECTION,
    name: 'peak resident ÷ largest dump\'s arrays',
    value: arrays !== null && judged > 0 ? judged / arrays : null,
    limit: MAX_PEAK_OVER_ARRAYS,
    bound: 'max',
    unit: '×',
    note: arrays === null ? 'parser not available' : `whole-process peak with --jobs ${peak(2) ? 2 : 1}, Node and worker isolates included`,
  });

  if (opts.profile) await checkProfile(files, plan);
}
