// `midrail changes <dump> --net NET [--json|--csv]`: every change of one net, or one bit of a
// vector (`top.bus[3]`), in file order.

import type { Dump, Signal } from '../../model/dump';
import { valueText } from '../../model/lookup';
import { type NetRef, bitSignal, resolveNet } from '../../model/netref';
import { unitFor } from '../../model/units';
import { ticksToSeconds } from '../../measure/ticks';
import { csvField } from '../../report/csv';
import { readDumpFile } from '../readDump';
import { EXIT_OK, UsageError, parseCommandArgs } from '../run';
import { alignColumns } from './info';

const USAGE = 'midrail changes <dump> --net NET [--json|--csv] [--allow-truncated]';

const HELP = `usage: ${USAGE}

Lists every change of one net in file order, including several changes at one time (zero-width
glitches). NET is a full path (top.u1.q), a unique path suffix (u1.q), or one bit of a vector in
its declared range (top.bus[3]; in [7:0], bit 0 is the rightmost digit).

Digital values are written most significant bit first at full width: 0/1/x/z in lower case,
other states (U, W, L, H, -) in upper case. Real values are numbers; a real has no value while
dumping is off ($dumpoff), shown as null in JSON and an empty cell in CSV (as is any value
that is not a finite number).

  --net NET          the net or bit to list (required)
  --json             {"net", "width", "type", "changes": [{"time_s", "value"}]}
  --csv              columns time_s, tick, value (RFC 4180: CRLF line ends, values quoted)
  --allow-truncated  read a dump that is cut off up to its last complete time step (warns)
`;

export interface ChangeEntry {
  time_s: number;
  value: string | number | null;
}

/** Value of change i: text for digital nets, a number (null when not a number) for reals. */
function changeValue(sig: Signal, i: number): string | number | null {
  if (sig.kind === 'real' && !sig.texts.has(i)) {
    const v = sig.reals[i];
    return Number.isFinite(v) ? v : null;
  }
  return valueText(sig, i);
}

interface Listing {
  ref: NetRef;
  sig: Signal;
  width: number;
}

function listing(dump: Dump, name: string): Listing {
  const ref = resolveNet(dump, name);
  const sig = bitSignal(dump, ref);
  return { ref, sig, width: ref.bit === null ? ref.net.width : 1 };
}

function tickOf(dump: Dump, sig: Signal, i: number): number {
  return dump.times[sig.timeIndex[i]];
}

/** The `changes --json` document, built line by line so a long listing stays one change per line. */
function* jsonLines(dump: Dump, l: Listing): Generator<string> {
  const head = { net: l.ref.label, width: l.width, type: l.ref.net.type };
  yield `${JSON.stringify(head).slice(0, -1)},"changes":[`;
  for (let i = 0; i < l.sig.count; i++) {
    const entry: ChangeEntry = { time_s: ticksToSeconds(dump.timescale, tickOf(dump, l.sig, i)), value: changeValue(l.sig, i) };
    yield `  ${JSON.stringify(entry)}${i + 1 < l.sig.count ? ',' : ''}`;
  }
  yield ']}';
}

/** CSV per RFC 4180 with the report module's field rules (text quoted and formula-guarded). */
function* csvLines(dump: Dump, l: Listing): Generator<string> {
  yield ['time_s', 'tick', 'value'].map(csvField).join(',');
  for (let i = 0; i < l.sig.count; i++) {
    const tick = tickOf(dump, l.sig, i);
    yield [ticksToSeconds(dump.timescale, tick), tick, changeValue(l.sig, i)].map(csvField).join(',');
  }
}

/**
 * Column unit for the text listing: the SI unit a thousand ticks fall in (ps ticks → ns), with as
 * many decimals as one tick needs, so every time is exact and the column lines up.
 */
function timeColumn(dump: Dump): { unit: string; format: (tick: number) => string } {
  const tick = ticksToSeconds(dump.timescale, 1);
  const [scale, unit] = unitFor(tick * 1000);
  const decimals = Math.min(15, Math.max(0, Math.round(Math.log10(scale / tick))));
  return { unit, format: (t) => (ticksToSeconds(dump.timescale, t) / scale).toFixed(decimals) };
}

function* textLines(dump: Dump, l: Listing): Generator<string> {
  const what = l.sig.kind === 'real' ? l.ref.net.type : `${l.ref.net.type}, ${l.width} bit${l.width === 1 ? '' : 's'}`;
  yield `${l.ref.label}  (${what})  ${l.sig.count} change${l.sig.count === 1 ? '' : 's'}`;
  const col = timeColumn(dump);
  const rows: string[][] = [[`time (${col.unit})`, 'tick', 'value']];
  for (let i = 0; i < l.sig.count; i++) {
    const tick = tickOf(dump, l.sig, i);
    const v = changeValue(l.sig, i);
    rows.push([col.format(tick), String(tick), v === null ? '(none)' : String(v)]);
  }
  yield* alignColumns(rows, new Set([0, 1]));
}

/** Writes lines in blocks so a listing of millions of changes is never one giant string. */
function writeLines(lines: Iterable<string>, eol = '\n'): void {
  let block: string[] = [];
  for (const line of lines) {
    block.push(line);
    if (block.length === 8192) {
      process.stdout.write(block.join(eol) + eol);
      block = [];
    }
  }
  if (block.length > 0) process.stdout.write(block.join(eol) + eol);
}

export async function run(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs(
    args,
    {
      net: { type: 'string' },
      json: { type: 'boolean' },
      csv: { type: 'boolean' },
      'allow-truncated': { type: 'boolean' },
      help: { type: 'boolean', short: 'h' },
    },
    USAGE,
  );
  if (values.help) {
    process.stdout.write(HELP);
    return EXIT_OK;
  }
  if (positionals.length !== 1) throw new UsageError(`changes takes exactly one dump file\nusage: ${USAGE}`);
  if (values.net === undefined || values.net.trim() === '') throw new UsageError(`changes needs --net NET\nusage: ${USAGE}`);
  if (values.json && values.csv) throw new UsageError(`choose one of --json and --csv\nusage: ${USAGE}`);
  const dump = await readDumpFile(positionals[0], { allowTruncated: values['allow-truncated'] === true });
  const l = listing(dump, values.net.trim());
  if (values.csv) writeLines(csvLines(dump, l), '\r\n');
  else writeLines(values.json ? jsonLines(dump, l) : textLines(dump, l));
  return EXIT_OK;
}
