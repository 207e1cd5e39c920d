// The benchmark's sections, in run order. To add one (the check run of issue 6, the viewer's
// frame times of issues 4/5), write sections/<name>.ts exporting `async (opts) => void` that
// prints with report.ts (info/table/target), and point its entry here at it.

import type { BenchOptions, SectionName } from '../options';
import { info } from '../report';
import { browserSection } from './browser';
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
  // Issues 4/5: the built viewer in headless Chromium (sections/browser.ts, test/bench/browser/).
  { name: 'browser', issue: '4/5', run: browserSection },
];
