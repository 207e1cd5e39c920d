// `midrail compare <base> <new>`: what changed between two runs of the same stimulus, net by net.

import { stat, writeFile } from 'node:fs/promises';
import { CompareError, type CompareResult, compareDumps } from '../../compare/index';
import { type DumpFacts, compareTables, netTable } from '../../compare/tables';
import type { Dump } from '../../model/dump';
import { NetLookupError } from '../../model/netref';
import { TimeSyntaxError, formatTime, parseTime } from '../../model/units';
import { tableCsv, tablesWorkbook } from '../../plan/workbook';
import { sha256File } from '../checkWorker';
import { readDumpFile } from '../readDump';
import { EXIT_OK, UsageError, parseCommandArgs } from '../run';

const USAGE = 'midrail compare <base> <new> [--nets LIST|GLOB] [--bits] [--tolerance TIME] [--window TIME] [--json|--csv] [--xlsx FILE] [--allow-truncated]';

const HELP = `usage: ${USAGE}

Compares two dumps of the same stimulus (for example a zero-delay RTL run as <base> and a timed
gate-level run as <new>). For each net present in both, its edges are matched in order: an edge
matches the nearest edge of the same direction in the other run when each is the other's nearest.
Reported per net: matched, added (only in <new>) and missing (only in <base>) edges, and the mean,
min and max shift new − base. Matching is unambiguous while a shift stays below half the interval
between the net's like edges.

Also reported: the first time any net's value differs between the runs for longer than the
tolerance.

  --nets LIST|GLOB   nets to compare (default: every net in both dumps); bits as top.bus[3]
  --bits             compare every bit of a vector on its own (a bus whose bits switch at
                     different times then matches bit by bit instead of as one changing value)
  --tolerance TIME   a difference must last longer than this to count (default 0: any)
  --window TIME      never match edges further apart than this (default: no limit)
  --json             one JSON document on stdout (times in seconds, fields ending _s)
  --csv              one row per net on stdout
  --xlsx FILE        workbook: nets, first difference, nets not compared, provenance
  --allow-truncated  compare the complete part of a cut-off dump
`;

function time(name: string, text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  try {
    const t = parseTime(text);
    if (t < 0) throw new UsageError(`--${name} must not be negative, got '${text}'`);
    return t;
  } catch (err) {
    if (err instanceof TimeSyntaxError) throw new UsageError(`--${name}: ${err.message}`);
    throw err;
  }
}

function shift(v: number | null): string {
  return v === null ? '—' : formatTime(v, 4);
}

function humanReport(r: CompareResult): string {
  const head = ['net', 'matched', 'added', 'missing', 'mean shift', 'min shift', 'max shift'];
  const rows = r.nets.map((n) => [n.net, String(n.matched), String(n.added), String(n.missing), shift(n.mean_shift_s), shift(n.min_shift_s), shift(n.max_shift_s)]);
  const widths = head.map((h, k) => Math.max(h.length, ...rows.map((row) => row[k].length)));
  const line = (cells: string[]) => cells.map((c, k) => (k === 0 ? c.padEnd(widths[k]) : c.padStart(widths[k]))).join('  ');
  const out = [`base ${r.base}, new ${r.new}: ${r.nets.length} nets compared`, line(head), ...rows.map(line)];
  const f = r.first_difference;
  const tol = r.tolerance_s > 0 ? ` longer than ${formatTime(r.tolerance_s)}` : '';
  if (f) {
    const lasting = f.duration_s === null ? 'to the end' : `for ${formatTime(f.duration_s)}`;
    out.push(`first difference${tol}: ${f.net} at ${formatTime(f.time_s)}: base ${f.base_value}, new ${f.new_value} (${lasting})`);
  } else out.push(`no value differs${tol}`);
  if (r.only_in_base.length > 0) out.push(`only in base: ${r.only_in_base.join(', ')}`);
  if (r.only_in_new.length > 0) out.push(`only in new: ${r.only_in_new.join(', ')}`);
  for (const x of r.incomparable) out.push(`not compared: ${x.net}: ${x.reason}`);
  return `${out.join('\n')}\n`;
}

async function facts(path: string, dump: Dump): Promise<DumpFacts> {
  return { file: path, bytes: (await stat(path)).size, sha256: await sha256File(path), timescale: `${dump.timescale.magnitude}${dump.timescale.unit}` };
}

export async function run(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs(
    args,
    {
      nets: { type: 'string' },
      bits: { type: 'boolean' },
      tolerance: { type: 'string' },
      window: { type: 'string' },
      json: { type: 'boolean' },
      csv: { type: 'boolean' },
      xlsx: { type: 'string' },
      'allow-truncated': { type: 'boolean' },
      help: { type: 'boolean', short: 'h' },
    },
    USAGE,
  );
  if (values.help) {
    process.stdout.write(HELP);
    return EXIT_OK;
  }
  if (positionals.length !== 2) throw new UsageError(`name exactly two dumps, the base run and the new run\nusage: ${USAGE}`);
  if (values.json && values.csv) throw new UsageError('choose one of --json and --csv');
  const toleranceS = time('tolerance', values.tolerance);
  const windowS = time('window', values.window);
  const [basePath, newPath] = positionals;
  const allowTruncated = values['allow-truncated'] === true;
  const base = await readDumpFile(basePath, { allowTruncated });
  const next = await readDumpFile(newPath, { allowTruncated });
  let result: CompareResult;
  try {
    result = compareDumps(base, next, { nets: values.nets, bits: values.bits === true, toleranceS, windowS });
  } catch (err) {
    if (err instanceof CompareError || err instanceof NetLookupError) throw new UsageError(err.message);
    throw err;
  }
  if (values.xlsx !== undefined) {
    const tables = compareTables(result, await facts(basePath, base), await facts(newPath, next), __MIDRAIL_VERSION__);
    try {
      await writeFile(values.xlsx, await tablesWorkbook(tables));
    } catch (err) {
      throw new UsageError(`cannot write '${values.xlsx}': ${(err as Error).message}`);
    }
  }
  if (values.json) process.stdout.write(`${JSON.stringify(result, null, 1)}\n`);
  else if (values.csv) process.stdout.write(tableCsv(netTable(result)));
  else process.stdout.write(humanReport(result));
  return EXIT_OK;
}
