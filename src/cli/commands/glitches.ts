// `midrail glitches <dump> --max-width TIME`: pulses narrower than TIME, zero-width glitches and
// runts, on every 1-bit net, every bit of every vector and every real net, or on a list or glob.

import { findGlitches } from '../../measure/index';
import type { GlitchResult } from '../../measure/types';
import { resolveNetList } from '../../model/netref';
import { formatTime } from '../../model/units';
import { glitchSheet } from '../../report/index';
import { readDumpFile } from '../readDump';
import { EXIT_OK, UsageError, parseCommandArgs } from '../run';
import { alignColumns } from './info';
import { OUTPUT_OPTIONS, asUsage, checkCommon, emit, levelOption, timeOption, unknownLines } from './measureIo';

const USAGE = 'midrail glitches <dump> --max-width TIME [--nets LIST|GLOB] [--json|--csv] [--xlsx FILE] [--allow-truncated]';

const HELP = `usage: ${USAGE}

A glitch is a pulse strictly narrower than --max-width between two opposite edges: high (rise then
fall) or low (fall then rise). Several changes at one time that leave a net where it started are a
zero-width glitch. On real-valued nets, a pulse that crosses the reference level but never reaches
the other state is a runt, reported whatever its width. Results are sorted by time, then net.

  --max-width TIME   report pulses narrower than TIME, e.g. 2ns (required)
  --nets LIST|GLOB   search only these nets (a vector stands for each of its bits); default every
                     1-bit net, every bit of every vector, and every real net
  --level L          reference level for real-valued nets (default 50%)
  --json | --csv     machine-readable result; --xlsx FILE also writes a workbook
  --allow-truncated  measure the complete part of a cut-off dump
`;

function textReport(r: GlitchResult): string[] {
  const out = [`glitches narrower than ${formatTime(r.max_width_s)} on ${r.nets} net${r.nets === 1 ? '' : 's'}: ${r.count}`];
  if (r.count > 0) {
    const rows = [['start', 'width', 'polarity', 'net']];
    for (const g of r.glitches.slice(0, 200)) rows.push([formatTime(g.start_s), formatTime(g.width_s), g.polarity, g.net]);
    out.push(...alignColumns(rows, new Set([0, 1])).map((l) => `  ${l}`));
    if (r.count > 200) out.push(`  … ${r.count - 200} more (see --json or --csv)`);
  }
  out.push(...unknownLines(r.unknown_spans, formatTime));
  return out;
}

export async function run(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs(
    args,
    { 'max-width': { type: 'string' }, nets: { type: 'string' }, level: { type: 'string' }, ...OUTPUT_OPTIONS },
    USAGE,
  );
  if (values.help) {
    process.stdout.write(HELP);
    return EXIT_OK;
  }
  const path = checkCommon('glitches', positionals, values, USAGE);
  const maxWidthS = timeOption('max-width', values['max-width'], USAGE);
  if (maxWidthS === undefined) throw new UsageError(`glitches needs --max-width TIME\nusage: ${USAGE}`);
  if (values.nets !== undefined && values.nets.trim() === '') throw new UsageError(`--nets needs a list or glob\nusage: ${USAGE}`);
  const level = levelOption(values.level);
  const dump = await readDumpFile(path, { allowTruncated: values['allow-truncated'] === true });
  const result = asUsage(() =>
    findGlitches(dump, { maxWidthS, nets: values.nets === undefined ? undefined : resolveNetList(dump, values.nets), level }),
  );
  await emit(values, result, () => glitchSheet(result), () => textReport(result), dump, path);
  return EXIT_OK;
}
