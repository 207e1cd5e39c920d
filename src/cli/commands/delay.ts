// `midrail delay <dump> --from NET --to NET`: every edge pair between two nets, split into tPLH and
// tPHL (tPD for vector outputs), with statistics, tpd, pulse skew and fmax.

import { measureDelay } from '../../measure/index';
import type { DelayResult, DelayStats } from '../../measure/types';
import { resolveNet } from '../../model/netref';
import { formatFrequency, formatTime } from '../../model/units';
import { delaySheet } from '../../report/index';
import { readDumpFile } from '../readDump';
import { EXIT_OK, parseCommandArgs } from '../run';
import { alignColumns } from './info';
import { OUTPUT_OPTIONS, asUsage, checkCommon, emit, levelOption, required, timeOption, unknownLines } from './measureIo';

const USAGE = 'midrail delay <dump> --from NET --to NET [--level 50%|1.5V] [--window TIME] [--json|--csv] [--xlsx FILE] [--allow-truncated]';

const HELP = `usage: ${USAGE}

Pairs every edge of the --to net with the latest edge of the --from net at or before it. The
output direction names the pair: output rise = tPLH, output fall = tPHL, a vector output = tPD.
Changes into or out of x/z/U are not edges; they are listed as unknown spans.

  --from NET, --to NET   full path (top.u1.a), unique suffix (u1.a) or a bit (top.bus[3])
  --level L              reference level for real-valued nets: a percentage of each net's own
                         swing (default 50%) or a value in volts (1.5V)
  --from-level, --to-level L   a different level for one side
  --window TIME          drop (and count as unpaired) pairs longer than TIME, e.g. 20ns
  --json                 one JSON document: pairs, per-kind statistics, tpd_s, tskp_s, fmax_hz
  --csv                  one row per pair (worst first), then summary rows (RFC 4180)
  --xlsx FILE            also write a workbook with summary and provenance sheets
  --allow-truncated      measure the complete part of a cut-off dump

tpd = max(tPLH max, tPHL max); tsk(p) = |mean tPHL − mean tPLH|; fmax = 1/tpd.
Simulated delays are only as good as the simulation model; they do not replace static timing
analysis or sign-off characterization.
`;

function statsRow(kind: string, s: DelayStats): string[] {
  const f = (x: number | null) => (x === null ? '—' : formatTime(x));
  return [kind, String(s.count), f(s.min_s), f(s.max_s), f(s.mean_s), f(s.std_s), f(s.worst_time_s)];
}

function textReport(r: DelayResult): string[] {
  const out = [`delay ${r.from} → ${r.to}  (level ${r.level}${r.window_s === null ? '' : `, window ${formatTime(r.window_s)}`})`, ''];
  out.push(...alignColumns([['kind', 'count', 'min', 'max', 'mean', 'std', 'worst at'], statsRow('tPLH', r.tPLH), statsRow('tPHL', r.tPHL), statsRow('tPD', r.tPD)], new Set([1, 2, 3, 4, 5, 6])));
  out.push('');
  out.push(`tpd     ${r.tpd_s === null ? '—' : formatTime(r.tpd_s)}  (max of tPLH and tPHL maxima)`);
  out.push(`tsk(p)  ${r.tskp_s === null ? '—' : formatTime(r.tskp_s)}  (|mean tPHL − mean tPLH|; worst ${r.tskp_worst_s === null ? '—' : formatTime(r.tskp_worst_s)})`);
  out.push(`fmax    ${r.fmax_hz === null ? '—' : formatFrequency(r.fmax_hz)}  (1/tpd)`);
  out.push(`        ${r.caution}`);
  out.push('', `pairs: ${r.pairs.length}   unpaired output edges: ${r.unpaired}`);
  const byReason = new Map<string, number>();
  for (const u of r.unpaired_edges) byReason.set(u.reason, (byReason.get(u.reason) ?? 0) + 1);
  if (byReason.size > 0) out.push(`  ${[...byReason].map(([k, n]) => `${k}: ${n}`).join(', ')}`);
  out.push(...unknownLines(r.unknown_spans, formatTime));
  const worst = [...r.pairs].sort((a, b) => b.delay_s - a.delay_s || a.to_time_s - b.to_time_s).slice(0, 10);
  if (worst.length > 0) {
    out.push('', 'worst pairs:');
    const rows = [['kind', 'from', 'to', 'delay']];
    for (const p of worst) rows.push([p.kind, `${p.from_edge} ${formatTime(p.from_time_s)}`, `${p.to_edge} ${formatTime(p.to_time_s)}`, formatTime(p.delay_s)]);
    out.push(...alignColumns(rows, new Set([3])).map((l) => `  ${l}`));
  }
  return out;
}

export async function run(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs(
    args,
    {
      from: { type: 'string' },
      to: { type: 'string' },
      level: { type: 'string' },
      'from-level': { type: 'string' },
      'to-level': { type: 'string' },
      window: { type: 'string' },
      ...OUTPUT_OPTIONS,
    },
    USAGE,
  );
  if (values.help) {
    process.stdout.write(HELP);
    return EXIT_OK;
  }
  const path = checkCommon('delay', positionals, values, USAGE);
  const fromName = required('from', values.from, 'delay', USAGE);
  const toName = required('to', values.to, 'delay', USAGE);
  const level = levelOption(values.level);
  const fromLevel = levelOption(values['from-level']);
  const toLevel = levelOption(values['to-level']);
  const windowS = timeOption('window', values.window, USAGE);
  const dump = await readDumpFile(path, { allowTruncated: values['allow-truncated'] === true });
  const result = asUsage(() =>
    measureDelay(dump, { from: resolveNet(dump, fromName), to: resolveNet(dump, toName), level, fromLevel, toLevel, windowS }),
  );
  await emit(values, result, () => delaySheet(result), () => textReport(result), dump, path);
  return EXIT_OK;
}
