// `midrail info <dump> [--json]`: what a dump holds — timescale, end time, counts, and every net.

import type { Dump, Net } from '../../model/dump';
import { formatTime } from '../../model/units';
import { ticksToSeconds } from '../../measure/ticks';
import { readDumpFile } from '../readDump';
import { EXIT_OK, UsageError, parseCommandArgs } from '../run';

const USAGE = 'midrail info <dump> [--json] [--allow-truncated]';

const HELP = `usage: ${USAGE}

Prints the timescale, end time (the last # line), scope, net and change counts, and every net
with its full path, declared range, width, type and number of changes written.

  --json             one JSON object: timescale_s, end_time_s, scopes, changes, nets, warnings
  --allow-truncated  read a dump that is cut off up to its last complete time step (warns)
`;

export interface InfoNet {
  path: string;
  width: number;
  type: string;
  changes: number;
}

export interface InfoReport {
  timescale_s: number;
  end_time_s: number;
  scopes: number;
  changes: number;
  nets: InfoNet[];
  warnings: string[];
}

/** The JSON document of `info --json`: one entry per $var line, aliases included. */
export function infoReport(dump: Dump): InfoReport {
  return {
    timescale_s: ticksToSeconds(dump.timescale, 1),
    end_time_s: ticksToSeconds(dump.timescale, dump.endTick),
    scopes: dump.scopes.length,
    changes: dump.changes,
    nets: dump.nets.map((n) => ({
      path: n.path,
      width: n.width,
      type: n.type,
      // Changes written under this net's identifier code; aliases share the count.
      changes: dump.signals[n.signal].written,
    })),
    warnings: dump.warnings.map((w) => `line ${w.line}: ${w.message}`),
  };
}

/** Pads each column to its widest cell; columns listed in `right` are right-aligned. */
export function alignColumns(rows: string[][], right: ReadonlySet<number>): string[] {
  const widths: number[] = [];
  for (const row of rows) row.forEach((cell, c) => (widths[c] = Math.max(widths[c] ?? 0, cell.length)));
  return rows.map((row) =>
    row
      .map((cell, c) => (right.has(c) ? cell.padStart(widths[c]) : c === row.length - 1 ? cell : cell.padEnd(widths[c])))
      .join('  ')
      .trimEnd(),
  );
}

/** The declared range as written: `[7:0]`, `[3]` for a single index, empty for a scalar. */
function declaredRange(n: Net): string {
  if (!n.ranged) return '';
  return n.msb === n.lsb ? `[${n.msb}]` : `[${n.msb}:${n.lsb}]`;
}

function infoText(dump: Dump): string {
  const ts = dump.timescale;
  const codes = new Set(dump.nets.map((n) => n.signal)).size;
  const head: string[][] = [
    ['dump', `${dump.source} (${dump.bytes} bytes)`],
    ['written by', dump.version.trim() || '—'],
    ['date', dump.date.trim() || '—'],
    ['timescale', `${ts.magnitude} ${ts.unit}`],
    ['end time', `${formatTime(ticksToSeconds(ts, dump.endTick))} (#${dump.endTick})`],
    ['scopes', String(dump.scopes.length)],
    ['nets', `${dump.nets.length} ($var lines; ${codes} identifier codes)`],
    ['changes', String(dump.changes)],
  ];
  if (dump.truncated) head.push(['state', 'cut off: read up to the last complete time step']);
  // The warnings themselves go to stderr as the dump is read.
  if (dump.warnings.length > 0) head.push(['warnings', `${dump.warnings.length} (on stderr)`]);
  const out = alignColumns(head, new Set());
  out.push('');
  const rows: string[][] = [['net', 'range', 'width', 'type', 'changes']];
  for (const n of dump.nets) {
    rows.push([n.path, declaredRange(n), String(n.width), n.type, String(dump.signals[n.signal].written)]);
  }
  out.push(...alignColumns(rows, new Set([2, 4])));
  return out.join('\n') + '\n';
}

export async function run(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs(
    args,
    { json: { type: 'boolean' }, 'allow-truncated': { type: 'boolean' }, help: { type: 'boolean', short: 'h' } },
    USAGE,
  );
  if (values.help) {
    process.stdout.write(HELP);
    return EXIT_OK;
  }
  if (positionals.length !== 1) throw new UsageError(`info takes exactly one dump file\nusage: ${USAGE}`);
  const dump = await readDumpFile(positionals[0], { allowTruncated: values['allow-truncated'] === true });
  process.stdout.write(values.json ? `${JSON.stringify(infoReport(dump), null, 2)}\n` : infoText(dump));
  return EXIT_OK;
}
