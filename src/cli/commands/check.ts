// `midrail check <dump|glob>... --plan FILE`: runs a measurement plan with limits on many dumps,
// in parallel over worker threads, one dump per thread at a time, so memory stays bounded by the
// largest dumps in flight rather than the sum of all. Exit 0 when every limit holds, 1 when any
// is violated, 2 on bad input (unreadable plan or dump, a net the plan names missing).

import { createHash } from 'node:crypto';
import { existsSync } from 'node:fs';
import { mkdir, readFile, readdir, stat, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import { availableParallelism, hostname } from 'node:os';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { TIMING_CAUTION } from '../../measure/index';
import { limitsOf } from '../../plan/limits';
import { CHECK_RESULT_FORMAT, CHECK_RESULT_VERSION, type CheckDocument, type DumpCheck, exitCodeOf, summarize } from '../../plan/result';
import type { Plan } from '../../plan/types';
import { PlanError, parsePlan } from '../../plan/validate';
import { type CheckReply, type CheckSettings, WORKER_ROLE, checkDumpFile } from '../checkWorker';
import { checkJunitXml } from '../../plan/toJunit';
import { checkCsvFiles, checkWorkbook } from '../../plan/workbook';
import { UsageError, parseCommandArgs } from '../run';

const USAGE = 'midrail check <dump|glob>... --plan FILE [--json] [--junit FILE] [--xlsx FILE] [--csv DIR] [--jobs N] [--allow-truncated]';

const HELP = `usage: ${USAGE}

Runs every measurement of a plan (a midrail-plan JSON file) on every dump and holds each result
against the plan's limits. Quote a glob ('runs/*.vcd') to let midrail expand it; only * and ?
are wildcards, and ** matches any depth of folders.

  --plan FILE        the measurement plan (required)
  --json             print the result document (the input of 'midrail merge') on stdout
  --junit FILE       write JUnit XML: one testsuite per dump, one testcase per measurement
  --xlsx FILE        write a workbook: summary, worst items per measurement, provenance
  --csv DIR          write summary.csv and one CSV of worst items per measurement into DIR
  --jobs N           dumps measured at once, each in its own worker thread (default: core count)
  --allow-truncated  measure the complete part of a cut-off dump instead of failing it

Exit status: 0 every limit holds, 1 a limit is violated, 2 bad input.
Simulated delays are only as good as the simulation model; they do not replace static timing
analysis or sign-off characterization.
`;

function segmentPattern(seg: string): RegExp {
  let re = '';
  for (const ch of seg) re += ch === '*' ? '[^/]*' : ch === '?' ? '[^/]' : ch.replace(/[.+^${}()|[\]\\]/g, '\\$&');
  return new RegExp(`^${re}$`);
}

async function isFile(p: string): Promise<boolean> {
  try {
    return (await stat(p)).isFile();
  } catch {
    return false;
  }
}

/** Files matching a glob whose segments may hold * and ? (not matching '/' or a leading dot) and ** (any depth). */
async function globFiles(pattern: string): Promise<string[]> {
  const absolute = pattern.startsWith('/');
  const segs = pattern.split('/').filter((s, i) => s !== '' || i === 0);
  const out: string[] = [];
  const walk = async (base: string, rest: string[]): Promise<void> => {
    if (rest.length === 0) {
      if (await isFile(base)) out.push(base);
      return;
    }
    const [seg, ...tail] = rest;
    if (seg === '' || seg === '.') return walk(base, tail);
    if (seg === '**') {
      await walk(base, tail);
      const entries = await readdir(base, { withFileTypes: true }).catch(() => []);
      for (const e of entries) if (e.isDirectory() && !e.name.startsWith('.')) await walk(join(base, e.name), rest);
      return;
    }
    if (!seg.includes('*') && !seg.includes('?')) return walk(join(base, seg), tail);
    const re = segmentPattern(seg);
    const entries = await readdir(base, { withFileTypes: true }).catch(() => []);
    for (const e of entries.map((x) => x.name).sort()) {
      if (e.startsWith('.') && !seg.startsWith('.')) continue;
      if (re.test(e)) await walk(join(base, e), tail);
    }
  };
  await walk(absolute ? '/' : '.', absolute ? segs.slice(1) : segs);
  return [...new Set(out.map((p) => (absolute ? p : p.replace(/^\.\//, ''))))];
}

/** Dump arguments as files: plain paths as given, globs expanded (each must match something). */
export async function expandDumpArgs(args: string[]): Promise<string[]> {
  const out: string[] = [];
  for (const a of args) {
    if (!a.includes('*') && !a.includes('?')) {
      out.push(a);
      continue;
    }
    const found = await globFiles(a);
    if (found.length === 0) throw new UsageError(`the pattern '${a}' matches no file`);
    out.push(...found);
  }
  return out;
}

export interface OutputFiles {
  junit?: string;
  xlsx?: string;
  csv?: string;
}

/** JUnit XML, .xlsx and CSV of a check (or merged) result. */
export async function writeCheckOutputs(doc: CheckDocument, files: OutputFiles): Promise<void> {
  const write = async (path: string, data: string | Uint8Array) => {
    try {
      await writeFile(path, data);
    } catch (err) {
      throw new UsageError(`cannot write '${path}': ${(err as Error).message}`);
    }
  };
  if (files.junit !== undefined) await write(files.junit, checkJunitXml(doc));
  if (files.xlsx !== undefined) await write(files.xlsx, await checkWorkbook(doc));
  if (files.csv !== undefined) {
    await mkdir(files.csv, { recursive: true }).catch((err: Error) => {
      throw new UsageError(`cannot make folder '${files.csv}': ${err.message}`);
    });
    for (const [name, text] of checkCsvFiles(doc)) await write(join(files.csv, name), text);
  }
}

function planSha256(text: string): string {
  return createHash('sha256').update(text).digest('hex');
}

async function readPlan(path: string): Promise<{ plan: Plan; text: string }> {
  let text: string;
  try {
    text = await readFile(path, 'utf8');
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code;
    throw new UsageError(`cannot read plan '${path}': ${code === 'ENOENT' ? 'no such file' : (err as Error).message}`);
  }
  try {
    return { plan: parsePlan(text, path), text };
  } catch (err) {
    if (err instanceof PlanError) throw new UsageError(err.message);
    throw err;
  }
}

/**
 * The worker entry, built beside the CLI as dist/cli/checkWorker.js. Null when this module runs
 * from TypeScript source (unit tests), where the dumps are measured in this thread instead.
 */
function workerScript(): string | null {
  if (!import.meta.url.endsWith('.js')) return null;
  for (const rel of ['./checkWorker.js', '../checkWorker.js']) {
    const url = new URL(rel, import.meta.url);
    if (url.protocol === 'file:' && existsSync(url)) return fileURLToPath(url);
  }
  throw new Error(`checkWorker.js is missing beside ${fileURLToPath(import.meta.url)}; rebuild the CLI with 'npm run prepare'`);
}

/** Runs the dumps over `jobs` worker threads, each pulling the next dump when it finishes one. */
async function runOnWorkers(files: string[], settings: CheckSettings, jobs: number, script: string): Promise<DumpCheck[]> {
  const results: DumpCheck[] = new Array(files.length);
  let next = 0;
  const one = (): Promise<void> =>
    new Promise<void>((resolve, reject) => {
      const worker = new Worker(script, { workerData: { role: WORKER_ROLE, settings } });
      let current = -1;
      let finished = false;
      let crash = 'it exited';
      const feed = () => {
        if (next >= files.length) {
          finished = true;
          void worker.terminate();
          return;
        }
        current = next++;
        worker.postMessage({ index: current, file: files[current] });
      };
      worker.on('message', (reply: CheckReply) => {
        results[reply.index] = reply.result;
        feed();
      });
      worker.on('error', (err) => {
        crash = err.message;
      });
      worker.on('exit', () => {
        if (finished) {
          resolve();
          return;
        }
        // A crash (out of memory, a bug) fails the dump it was measuring; a fresh worker goes on.
        if (current >= 0 && results[current] === undefined) {
          results[current] = { file: files[current], bytes: 0, sha256: null, timescale: null, end_s: null, error: `the worker measuring it stopped: ${crash}`, warnings: [], elapsed_s: 0, measurements: [] };
        }
        one().then(resolve, reject);
      });
      feed();
    });
  await Promise.all(Array.from({ length: Math.min(jobs, files.length) }, one));
  return results;
}

async function runInThread(files: string[], settings: CheckSettings): Promise<DumpCheck[]> {
  const out: DumpCheck[] = [];
  for (const f of files) out.push(await checkDumpFile(f, settings));
  return out;
}

export function humanReport(doc: CheckDocument): string {
  const lines = [`plan ${doc.plan.file}: ${doc.plan.measurements.length} measurements on ${doc.dumps.length} dump${doc.dumps.length === 1 ? '' : 's'}`];
  for (const d of doc.dumps) {
    if (d.error !== null) {
      lines.push(`${d.file}: ERROR ${d.error}`);
      continue;
    }
    const passed = d.measurements.filter((m) => m.status === 'pass').length;
    lines.push(`${d.file}: ${passed}/${d.measurements.length} pass`);
    for (const m of d.measurements) lines.push(`  ${m.status.toUpperCase().padEnd(5)} ${m.id}: ${m.message}`);
  }
  const s = doc.summary;
  lines.push(`${s.testcases} testcases: ${s.passed} passed, ${s.failed} failed, ${s.errors} errors`);
  return `${lines.join('\n')}\n`;
}

export function checkDocument(planFile: string, plan: Plan, planText: string, dumps: DumpCheck[]): CheckDocument {
  return {
    format: CHECK_RESULT_FORMAT,
    format_version: CHECK_RESULT_VERSION,
    tool: 'midrail',
    tool_version: __MIDRAIL_VERSION__,
    generated_at: new Date().toISOString(),
    hostname: hostname() || 'localhost',
    plan: {
      file: planFile,
      name: plan.name ?? null,
      sha256: planSha256(planText),
      measurements: plan.measurements.map((m) => {
        const l = limitsOf(m);
        return { id: m.id, kind: m.kind, quantity: l.quantity, unit: l.unit };
      }),
    },
    dumps,
    summary: summarize(dumps),
    caution: TIMING_CAUTION,
  };
}

export async function run(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs(
    args,
    {
      plan: { type: 'string' },
      json: { type: 'boolean' },
      junit: { type: 'string' },
      xlsx: { type: 'string' },
      csv: { type: 'string' },
      jobs: { type: 'string' },
      'allow-truncated': { type: 'boolean' },
      help: { type: 'boolean', short: 'h' },
    },
    USAGE,
  );
  if (values.help) {
    process.stdout.write(HELP);
    return 0;
  }
  if (values.plan === undefined) throw new UsageError(`--plan FILE is required\nusage: ${USAGE}`);
  if (positionals.length === 0) throw new UsageError(`name at least one dump or glob\nusage: ${USAGE}`);
  let jobs = availableParallelism();
  if (values.jobs !== undefined) {
    if (!/^[1-9]\d*$/.test(values.jobs)) throw new UsageError(`--jobs takes a whole number of 1 or more, not '${values.jobs}'`);
    jobs = Number(values.jobs);
  }
  const { plan, text } = await readPlan(values.plan);
  const files = await expandDumpArgs(positionals);
  const settings: CheckSettings = { plan, allowTruncated: values['allow-truncated'] === true };
  const script = jobs > 1 && files.length > 1 ? workerScript() : null;
  const dumps = script ? await runOnWorkers(files, settings, jobs, script) : await runInThread(files, settings);
  for (const d of dumps) for (const w of d.warnings) process.stderr.write(`midrail: warning: ${w}\n`);
  const doc = checkDocument(values.plan, plan, text, dumps);
  await writeCheckOutputs(doc, { junit: values.junit, xlsx: values.xlsx, csv: values.csv });
  if (values.json) process.stdout.write(`${JSON.stringify(doc, null, 1)}\n`);
  else process.stdout.write(humanReport(doc));
  for (const d of dumps) if (d.error !== null) process.stderr.write(`midrail: ${d.error}\n`);
  return exitCodeOf(doc.summary);
}
