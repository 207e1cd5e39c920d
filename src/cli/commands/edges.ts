// `midrail edges <dump> --net NET`: the edges found on one net, with IEEE 181 state levels and
// 10–90 % transition durations for real-valued nets.

import { findEdges } from '../../measure/index';
import type { EdgeResult } from '../../measure/types';
import { resolveNet } from '../../model/netref';
import { formatTime } from '../../model/units';
import { edgesSheet } from '../../report/index';
import { readDumpFile } from '../readDump';
import { EXIT_OK, UsageError, parseCommandArgs } from '../run';
import { alignColumns } from './info';
import { OUTPUT_OPTIONS, asUsage, checkCommon, emit, levelOption, required, unknownLines } from './measureIo';

const USAGE = 'midrail edges <dump> --net NET [--level 50%|1.5V] [--states LOW,HIGH] [--json|--csv] [--xlsx FILE] [--allow-truncated]';

const HELP = `usage: ${USAGE}

Lists the edges of one net: rise (0→1) and fall (1→0) on 1-bit nets and bits (top.bus[3]),
change on vectors. Changes into or out of x/z/U are not edges; they are listed as unknown spans.
On real-valued nets, an edge is a crossing of the reference level, placed by linear interpolation,
counted only when the waveform moves from one state band to the other (IEEE 181 state boundaries,
±2 % of the swing, act as hysteresis); low and high are the state levels used (histogram mode,
min/max for few samples), and transition_s is the 10–90 % transition duration.

  --net NET          full path, unique suffix, or a bit of a vector (required)
  --level L          reference level for real nets: percentage of the swing (default 50%) or volts (1.5V)
  --states LOW,HIGH  state levels for a real net in volts (e.g. 0V,3.3V) instead of the histogram
  --json | --csv     machine-readable result; --xlsx FILE also writes a workbook
  --allow-truncated  measure the complete part of a cut-off dump
`;

function volts(text: string): number {
  const m = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(V|mV)\s*$/.exec(text);
  if (!m) throw new UsageError(`cannot read '${text}' as a state level; expected a value in volts such as 0V or 3.3V\nusage: ${USAGE}`);
  return Number(m[1]) * (m[2] === 'mV' ? 1e-3 : 1);
}

function statesOption(text: string | undefined): { low: number; high: number } | undefined {
  if (text === undefined) return undefined;
  const parts = text.split(',');
  if (parts.length !== 2) throw new UsageError(`--states takes two levels, LOW,HIGH (e.g. 0V,3.3V), not '${text}'\nusage: ${USAGE}`);
  const low = volts(parts[0]);
  const high = volts(parts[1]);
  if (!(high > low)) throw new UsageError(`--states: the high level must be above the low level ('${text}')`);
  return { low, high };
}

function textReport(r: EdgeResult): string[] {
  const out = [`edges of ${r.net}: ${r.edges.length}`];
  if (r.low !== undefined) {
    out.push(`state levels: low ${r.low}, high ${r.high} (${r.state_method}); reference level ${r.level} = ${r.reference_value}`);
  }
  if (r.edges.length > 0) {
    const real = r.low !== undefined;
    const rows = [real ? ['time', 'edge', 'transition 10–90 %'] : ['time', 'edge']];
    for (const e of r.edges) {
      const row = [formatTime(e.time_s), e.edge];
      if (real) row.push(e.transition_s === null || e.transition_s === undefined ? '—' : formatTime(e.transition_s));
      rows.push(row);
    }
    out.push(...alignColumns(rows, new Set([0, 2])).map((l) => `  ${l}`));
  }
  if (r.runts && r.runts.length > 0) {
    out.push(`runts: ${r.runts.length}`);
    for (const g of r.runts) out.push(`  ${formatTime(g.start_s)}  width ${formatTime(g.width_s)}  ${g.polarity}`);
  }
  if (r.zero_width_s.length > 0) out.push(`zero-width glitches at: ${r.zero_width_s.map((t) => formatTime(t)).join(', ')}`);
  out.push(...unknownLines(r.unknown_spans, formatTime));
  return out;
}

export async function run(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs(args, { net: { type: 'string' }, level: { type: 'string' }, states: { type: 'string' }, ...OUTPUT_OPTIONS }, USAGE);
  if (values.help) {
    process.stdout.write(HELP);
    return EXIT_OK;
  }
  const path = checkCommon('edges', positionals, values, USAGE);
  const name = required('net', values.net, 'edges', USAGE);
  const level = levelOption(values.level);
  const states = statesOption(values.states);
  const dump = await readDumpFile(path, { allowTruncated: values['allow-truncated'] === true });
  const result = asUsage(() => findEdges(dump, resolveNet(dump, name), { level, states }));
  await emit(values, result, () => edgesSheet(result), () => textReport(result), dump, path);
  return EXIT_OK;
}
