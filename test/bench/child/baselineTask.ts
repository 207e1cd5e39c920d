// The npm package `vcd-parser` on a small slice, for scale. It hands each body line to its own
// timer callback, so a whole slice can take minutes: the run is capped, and when the cap is hit
// the figures are taken from the lines it got through (counted by wrapping setTimeout, which it
// calls once per line).

import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';

export interface BaselineResult {
  bytes: number;
  changes: number;
  ms: number;
  /** False when the cap ended the run; bytes and changes then cover the lines done. */
  finished: boolean;
  error: string | null;
}

type ParseFn = (content: string) => Promise<unknown>;

export async function runBaseline(path: string, capMs: number): Promise<BaselineResult> {
  const text = readFileSync(path, 'latin1');
  const require = createRequire(import.meta.url);
  const { parse } = require('vcd-parser') as { parse: ParseFn };

  // The body lines as the package splits them, with running byte and change counts.
  const bodyAt = text.indexOf('$enddefinitions');
  const lines = text.slice(bodyAt).split('\n');
  const lineEnd = new Float64Array(lines.length);
  const changesTo = new Float64Array(lines.length);
  let at = bodyAt;
  let changes = 0;
  lines.forEach((line, i) => {
    at += line.length + 1;
    const c = line.trimStart()[0];
    if (c !== undefined && c !== '#' && c !== '$') changes++;
    lineEnd[i] = at;
    changesTo[i] = changes;
  });

  let timers = 0;
  const realSetTimeout = globalThis.setTimeout;
  const counting = ((fn: () => void, ms?: number) => {
    timers++;
    return realSetTimeout(fn, ms);
  }) as typeof setTimeout;
  globalThis.setTimeout = counting;

  const t0 = performance.now();
  let error: string | null = null;
  let finished = false;
  const parsing = parse(text).then(
    () => void (finished = true),
    (e: unknown) => void (error = JSON.stringify(e)),
  );
  const cap = new Promise<void>((resolve) => realSetTimeout(resolve, capMs));
  await Promise.race([parsing, cap]);
  const ms = performance.now() - t0;
  globalThis.setTimeout = realSetTimeout;
  if (finished) return { bytes: text.length, changes, ms, finished, error };
  // One timer starts the parse; each later one starts a line, and the newest may still be pending.
  const done = Math.max(0, Math.min(lines.length, timers - 2));
  return {
    bytes: done > 0 ? lineEnd[done - 1] : 0,
    changes: done > 0 ? changesTo[done - 1] : 0,
    ms,
    finished,
    error,
  };
}
