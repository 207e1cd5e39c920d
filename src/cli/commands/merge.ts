// `midrail merge <result.json>...`: one summary from the `check --json` results of many shards.

import { readFile } from 'node:fs/promises';
import { hostname } from 'node:os';
import { MergeError, asCheckDocument, mergeDocuments } from '../../plan/merge';
import { exitCodeOf } from '../../plan/result';
import { UsageError, parseCommandArgs } from '../run';
import { humanReport, writeCheckOutputs } from './check';

const USAGE = 'midrail merge <result.json>... [--json] [--junit FILE] [--xlsx FILE] [--csv DIR]';

const HELP = `usage: ${USAGE}

Combines the results that 'midrail check --json' wrote on several machines (one per shard of a
regression) into one, checked against one plan. Prints a summary, or the merged result with
--json (which can be merged again).

  --json             print the merged result document on stdout
  --junit FILE       write JUnit XML: one testsuite per dump, one testcase per measurement
  --xlsx FILE        write a workbook: summary, worst items per measurement, provenance
  --csv DIR          write summary.csv and one CSV of worst items per measurement into DIR

Exit status: 0 every limit holds, 1 a limit is violated, 2 bad input (in any shard, or here).
`;

export async function run(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs(
    args,
    { json: { type: 'boolean' }, junit: { type: 'string' }, xlsx: { type: 'string' }, csv: { type: 'string' }, help: { type: 'boolean', short: 'h' } },
    USAGE,
  );
  if (values.help) {
    process.stdout.write(HELP);
    return 0;
  }
  if (positionals.length === 0) throw new UsageError(`name at least one check result\nusage: ${USAGE}`);
  const docs = [];
  for (const file of positionals) {
    let text: string;
    try {
      text = await readFile(file, 'utf8');
    } catch (err) {
      const code = (err as NodeJS.ErrnoException).code;
      throw new UsageError(`cannot read '${file}': ${code === 'ENOENT' ? 'no such file' : (err as Error).message}`);
    }
    let value: unknown;
    try {
      value = JSON.parse(text);
    } catch (err) {
      throw new UsageError(`${file} is not JSON (${(err as Error).message}); merge reads the output of 'midrail check --json'`);
    }
    try {
      docs.push(asCheckDocument(value, file));
    } catch (err) {
      if (err instanceof MergeError) throw new UsageError(err.message);
      throw err;
    }
  }
  let merged;
  try {
    merged = mergeDocuments(docs, positionals, new Date(), hostname() || 'localhost');
  } catch (err) {
    if (err instanceof MergeError) throw new UsageError(err.message);
    throw err;
  }
  for (const w of merged.warnings) process.stderr.write(`midrail: warning: ${w}\n`);
  await writeCheckOutputs(merged.doc, { junit: values.junit, xlsx: values.xlsx, csv: values.csv });
  if (values.json) process.stdout.write(`${JSON.stringify(merged.doc, null, 1)}\n`);
  else process.stdout.write(humanReport(merged.doc));
  return exitCodeOf(merged.doc.summary);
}
