// The benchmark's sections, in run order. To add one (the check run of issue 6, the viewer's
// frame times of issues 4/5), write sections/<name>.ts exporting `async (opts) => void` that
// prints with report.ts (info/table/target), and point its entry here at it.

import type { BenchOptions, SectionName } from '../options';
import { info } from '../report';
import { checkSection } from './check';
import { measureSection } from './measure';
import { parseSection } from './parse';

export interface Section {
  name: SectionName;
  issue: string;
  run: (opts: BenchOptions) => Promise<void>;
}

/** A section not written yet: says so, and sets no target. */
function pending(what: string): (opts: BenchOptions) => Promise<void> {
  return async () => info(`${what}: not measured yet (hook: test/bench/sections/registry.ts)`);
}

export const SECTIONS: Section[] = [
  { name: 'parse', issue: '2', run: parseSection },
  { name: 'measure', issue: '3', run: measureSection },
  { name: 'check', issue: '6', run: checkSection },
  // HOOK issues 4/5: headless Chromium (playwright-core, executablePath /usr/bin/chromium, stack-recipe
  // flags), 64 shown nets, median frame time at 10 k vs 10 M changes in view (ratio ≤ 1.5, frame < 60 ms),
  // drop-to-first-traces ÷ parse time on 100 MB (≤ 1.3), delay markers ÷ engine time (≤ 1.5),
  // background glitch scan ÷ one parse (≤ 0.3).
  { name: 'browser', issue: '4/5', run: pending('browser (issues 4/5): frame times, drop-to-traces, delay markers, glitch scan') },
];
