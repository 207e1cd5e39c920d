// Section 2 (issue 3): delay pairing over many edge pairs and the glitch search over every net of
// the 100 MB synthetic dump, each as changes/s and as a fraction of a plain pass that reads every
// change once. Each also runs at a tenth of the size, to show the time grows linearly (O(n)).

import type { TimedResult } from '../child/measureTask';
import { runChild } from '../child/spawnTask';
import { loadMeasure, loadParser } from '../engines';
import { synthDump } from '../gen/dumpCache';
import type { BenchOptions } from '../options';
import { profileChild } from '../profile';
import { fixed, heading, info, rate, table, target } from '../report';

const SECTION = 'measure';
/** Issue 3: at least 30 % of the plain pass's speed. */
const MIN_PLAIN_RATIO = 0.3;
/** The bench's own reading of "O(n)": changes/s at 10× the size stays above half. */
const MIN_SCALING = 0.5;
/** Glitch width limit for the search: 200 ps against timestamps 100–1099 ps apart. */
const GLITCH_WIDTH_S = 200e-12;
const TIMEOUT_MS = 15 * 60_000;

interface Row {
  name: string;
  r: TimedResult;
}

const perSecond = (n: number, ms: number) => (n / ms) * 1e3;
const plainRatio = (r: TimedResult) => r.plainMs / r.measureMs;

function printRows(rows: Row[]): void {
  table(
    ['measurement', 'changes', 'ms', 'cold ms', 'records ms', 'changes/s', 'plain pass/s', 'ratio', 'found'],
    rows.map(({ name, r }) => [
      name,
      String(r.changes),
      fixed(r.measureMs),
      fixed(r.coldMs),
      fixed(r.recordsMs),
      rate(perSecond(r.changes, r.measureMs), ''),
      rate(perSecond(r.changes, r.plainMs), ''),
      fixed(plainRatio(r)),
      Object.entries(r.found)
        .map(([k, v]) => `${v} ${k}`)
        .join(', '),
    ]),
  );
}

function judge(name: string, small: Row | null, big: Row | null): void {
  target({
    section: SECTION,
    name: `${name}: speed ÷ plain pass`,
    value: big ? plainRatio(big.r) : null,
    limit: MIN_PLAIN_RATIO,
    bound: 'min',
    unit: '',
    note: big ? big.name : 'not measured',
  });
  const scaling = small && big ? perSecond(big.r.changes, big.r.measureMs) / perSecond(small.r.changes, small.r.measureMs) : null;
  target({
    section: SECTION,
    name: `${name}: changes/s at full size ÷ at a tenth (linear time)`,
    value: scaling,
    limit: MIN_SCALING,
    bound: 'min',
    unit: '',
    note: "bench's own threshold for O(n)",
  });
}

async function timed(name: string, task: string, args: Record<string, unknown>): Promise<Row | null> {
  try {
    return { name, r: await runChild<TimedResult>(task, args, { timeoutMs: TIMEOUT_MS }) };
  } catch (e) {
    info(`${name}: not measured: ${(e as Error).message}`);
    return null;
  }
}

export async function measureSection(opts: BenchOptions): Promise<void> {
  heading('Measure (issue 3): delay pairing and glitch search against a plain pass over the changes');
  const m = await loadMeasure();
  if (!m || typeof m.measureDelay !== 'function' || typeof m.findGlitches !== 'function') {
    info('measure engine not available (src/measure/index.ts with measureDelay and findGlitches is not there yet)');
    judge('delay pairing', null, null);
    judge('glitch search', null, null);
    return;
  }
  // Best of several timed runs of each side: the machine is shared, and one quiet run is what counts.
  const runs = opts.quick ? 3 : 5;
  const rows: Row[] = [];

  const pairs = opts.quick ? 200_000 : 1_000_000;
  const delaySmall = await timed(`delay, ${pairs / 10} pairs`, 'delay', { pairs: pairs / 10, runs });
  const delayBig = await timed(`delay, ${pairs} pairs`, 'delay', { pairs, runs });
  rows.push(...[delaySmall, delayBig].filter((r): r is Row => r !== null));

  let glitchSmall: Row | null = null;
  let glitchBig: Row | null = null;
  if (!(await loadParser())) info('glitch search: not measured (midrail parser not available)');
  else {
    const bigMb = opts.quick ? 50 : 100;
    const small = synthDump(100, bigMb / 10);
    const big = synthDump(100, bigMb);
    glitchSmall = await timed(`glitches, 100 nets/${bigMb / 10} MB`, 'glitches', { path: small.path, maxWidthS: GLITCH_WIDTH_S, runs });
    glitchBig = await timed(`glitches, 100 nets/${bigMb} MB`, 'glitches', { path: big.path, maxWidthS: GLITCH_WIDTH_S, runs });
    rows.push(...[glitchSmall, glitchBig].filter((r): r is Row => r !== null));
  }
  printRows(rows);
  info('plain pass = for each net measured, one loop over its stored changes that reads each change once, its time');
  info('  (times[timeIndex[i]]) and its value (the logic code, every word of both vector planes, or the real) from');
  info('  the same arrays the measurement reads, and sums them; it finds nothing and writes nothing.');
  info(`ms / plain pass: best of ${runs} timed runs after 2 untimed warm-up runs of each side, taken in turn;`);
  info('cold ms = the first measurement in a fresh process; records ms = building the JSON-shaped records on first read');
  info('  (`pairs` + `unpaired_edges`, or `glitches` + `unknown_spans`), done once after timing and not included in ms:');
  info('  the measurement pairs every edge and sums the statistics, or finds and stores every glitch, but lists pairs and');
  info('  unknown spans only when they are read.');
  info(`ratio = plain pass time ÷ measurement time; glitch width limit ${GLITCH_WIDTH_S * 1e12} ps, every 1-bit net, vector bit and real`);
  judge('delay pairing', delaySmall, delayBig);
  judge('glitch search', glitchSmall, glitchBig);

  if (opts.profile) {
    await profileChild('delay', { pairs, runs: 1 }, `delay pairing over ${pairs} pairs (dump building included)`);
    if (glitchBig) {
      const path = synthDump(100, opts.quick ? 50 : 100).path;
      await profileChild('glitches', { path, maxWidthS: GLITCH_WIDTH_S, runs: 1 }, `${glitchBig.name} (parse included)`);
    }
  }
}
