// Plumbing shared by the measurement commands (delay, skew, glitches, edges): option parsing into
// library values with clear exit-2 errors, and writing the result as text, JSON, CSV or .xlsx.

import { readFile, writeFile } from 'node:fs/promises';
import { LevelSyntaxError, type LevelSpec, MeasureError, parseLevel } from '../../measure/index';
import type { Dump } from '../../model/dump';
import { NetLookupError } from '../../model/netref';
import { TimeSyntaxError, parseTime } from '../../model/units';
import { type MeasurementSheet, provenanceFor, toCsv, writeXlsx } from '../../report/index';
import { UsageError } from '../run';

/** Runs `body`, turning the library's input errors (bad net, time, level, setting) into exit-2 errors. */
export function asUsage<T>(body: () => T): T {
  try {
    return body();
  } catch (err) {
    if (err instanceof NetLookupError || err instanceof TimeSyntaxError || err instanceof LevelSyntaxError || err instanceof MeasureError) {
      throw new UsageError(err.message);
    }
    throw err;
  }
}

/** A positive time with a unit, from option `--name`. */
export function timeOption(name: string, text: string | undefined, usage: string): number | undefined {
  if (text === undefined) return undefined;
  const s = asUsage(() => parseTime(text));
  if (!(s > 0)) throw new UsageError(`--${name} must be a positive time, not '${text}'\nusage: ${usage}`);
  return s;
}

export function levelOption(text: string | undefined): LevelSpec | undefined {
  return text === undefined ? undefined : asUsage(() => parseLevel(text));
}

export const OUTPUT_OPTIONS = {
  json: { type: 'boolean' },
  csv: { type: 'boolean' },
  xlsx: { type: 'string' },
  'allow-truncated': { type: 'boolean' },
  help: { type: 'boolean', short: 'h' },
} as const;

export interface OutputFlags {
  json?: boolean;
  csv?: boolean;
  xlsx?: string;
}

/** The single dump positional and the output flags, checked before the dump is read. */
export function checkCommon(command: string, positionals: string[], flags: OutputFlags, usage: string): string {
  if (positionals.length !== 1) throw new UsageError(`${command} takes exactly one dump file\nusage: ${usage}`);
  if (flags.json && flags.csv) throw new UsageError(`choose one of --json and --csv\nusage: ${usage}`);
  if (flags.xlsx !== undefined && flags.xlsx.trim() === '') throw new UsageError(`--xlsx needs a file name\nusage: ${usage}`);
  return positionals[0];
}

export function required(name: string, value: string | undefined, command: string, usage: string): string {
  if (value === undefined || value.trim() === '') throw new UsageError(`${command} needs --${name}\nusage: ${usage}`);
  return value.trim();
}

/**
 * Prints the result: exactly one JSON document with --json, CSV with --csv, else the text lines.
 * With --xlsx FILE the workbook (measurement, summary and provenance sheets) is written as well.
 */
export async function emit(
  flags: OutputFlags,
  result: unknown,
  sheet: () => MeasurementSheet,
  text: () => string[],
  dump: Dump,
  dumpPath: string,
): Promise<void> {
  if (flags.xlsx !== undefined) {
    const bytes = new Uint8Array(await readFile(dumpPath));
    const prov = await provenanceFor(dump, bytes, __MIDRAIL_VERSION__);
    const book = await writeXlsx([sheet()], prov);
    try {
      await writeFile(flags.xlsx, book);
    } catch (err) {
      throw new UsageError(`cannot write workbook '${flags.xlsx}': ${(err as Error).message}`);
    }
  }
  if (flags.json) process.stdout.write(JSON.stringify(result) + '\n');
  else if (flags.csv) process.stdout.write(toCsv([sheet()]));
  else {
    const lines = text();
    if (flags.xlsx !== undefined) lines.push(`workbook written to ${flags.xlsx}`);
    process.stdout.write(lines.join('\n') + '\n');
  }
}

/** The unknown spans line(s) of a text report: count and the first few. */
export function unknownLines(spans: Array<{ net: string; start_s: number; end_s: number | null; state?: string; dumpoff?: boolean }>, fmt: (s: number) => string): string[] {
  if (spans.length === 0) return ['unknown spans: none'];
  const out = [`unknown spans: ${spans.length} (x/z/U/… or no data; their changes are not edges)`];
  for (const s of spans.slice(0, 10)) {
    const what = s.dumpoff ? 'dumping off' : s.state ?? 'unknown';
    out.push(`  ${s.net}  ${fmt(s.start_s)} … ${s.end_s === null ? 'end of dump' : fmt(s.end_s)}  (${what})`);
  }
  if (spans.length > 10) out.push(`  … ${spans.length - 10} more (see --json)`);
  return out;
}
