// `midrail skew <dump> --nets LIST|GLOB`: skew of every switching event across a group of nets.

import { measureSkew } from '../../measure/index';
import type { SkewResult } from '../../measure/types';
import { resolveNet, resolveNetList } from '../../model/netref';
import { formatTime } from '../../model/units';
import { skewSheet } from '../../report/index';
import { readDumpFile } from '../readDump';
import { EXIT_OK, UsageError, parseCommandArgs } from '../run';
import { alignColumns } from './info';
import { OUTPUT_OPTIONS, asUsage, checkCommon, emit, levelOption, required, timeOption, unknownLines } from './measureIo';

const USAGE = 'midrail skew <dump> --nets LIST|GLOB [--edge rise|fall|any] [--window TIME] [--ref NET] [--json|--csv] [--xlsx FILE] [--allow-truncated]';

const HELP = `usage: ${USAGE}

Sorts the edges of all the nets by time and groups them into events: an event starts at the
earliest edge not yet in one and takes each later edge within the window after it (one edge per
net). Skew = latest − earliest edge of the event. Every event is listed, also those where only
one net switched (skew 0).

  --nets LIST|GLOB   comma-separated names or globs; only * and ? are wildcards, brackets are
                     literal (top.clk_leaf*, top.bus[3],top.bus[4])
  --edge E           rise or fall: only that direction counts (a clock tree); any (default):
                     both directions group together (the bits of a bus)
  --window TIME      event window; default half the shortest interval between successive edges
                     of the group's busiest net
  --ref NET          net the mean offsets are measured from (one of --nets); default the net that
                     is earliest in most events
  --level L          reference level for real-valued nets (default 50%)
  --json | --csv     machine-readable result; --xlsx FILE also writes a workbook
  --allow-truncated  measure the complete part of a cut-off dump
`;

function textReport(r: SkewResult): string[] {
  const f = (x: number | null) => (x === null ? '—' : formatTime(x));
  const out = [
    `skew across ${r.nets.length} nets  (edge ${r.edge}, window ${formatTime(r.window_s)}${r.window_source === 'given' ? '' : ` from ${r.window_source}`})`,
    `events: ${r.events.length}   max skew: ${f(r.max_skew_s)}   mean skew: ${f(r.mean_skew_s)}`,
  ];
  if (r.ref !== null) {
    out.push('', `mean offset from ${r.ref}:`);
    out.push(...alignColumns([['net', 'offset', 'events'], ...r.offsets.map((o) => [o.net, f(o.mean_offset_s), String(o.events)])], new Set([1, 2])).map((l) => `  ${l}`));
  }
  const worst = [...r.events].sort((a, b) => b.skew_s - a.skew_s || a.time_s - b.time_s).slice(0, 10);
  if (worst.length > 0) {
    out.push('', 'worst events:');
    const rows = [['time', 'edge', 'skew', 'edges', 'earliest', 'latest']];
    for (const e of worst) rows.push([formatTime(e.time_s), e.edge, formatTime(e.skew_s), String(e.edges), e.earliest, e.latest]);
    out.push(...alignColumns(rows, new Set([0, 2, 3])).map((l) => `  ${l}`));
  }
  out.push(...unknownLines(r.unknown_spans, formatTime));
  return out;
}

export async function run(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs(
    args,
    {
      nets: { type: 'string' },
      edge: { type: 'string' },
      window: { type: 'string' },
      ref: { type: 'string' },
      level: { type: 'string' },
      ...OUTPUT_OPTIONS,
    },
    USAGE,
  );
  if (values.help) {
    process.stdout.write(HELP);
    return EXIT_OK;
  }
  const path = checkCommon('skew', positionals, values, USAGE);
  const list = required('nets', values.nets, 'skew', USAGE);
  const edge = values.edge ?? 'any';
  if (edge !== 'rise' && edge !== 'fall' && edge !== 'any') throw new UsageError(`--edge must be rise, fall or any, not '${edge}'\nusage: ${USAGE}`);
  const windowS = timeOption('window', values.window, USAGE);
  const level = levelOption(values.level);
  const dump = await readDumpFile(path, { allowTruncated: values['allow-truncated'] === true });
  const result = asUsage(() =>
    measureSkew(dump, {
      nets: resolveNetList(dump, list),
      edge,
      windowS,
      ref: values.ref === undefined ? undefined : resolveNet(dump, values.ref.trim()),
      level,
    }),
  );
  await emit(values, result, () => skewSheet(result), () => textReport(result), dump, path);
  return EXIT_OK;
}
