// `npm run bench`: midrail's benchmark (not a test). Prints figures as ratios measured in the
// same run, each target with whether it was met. Built by test/bench/run.mjs with vite into
// dist/bench, so it runs the same TypeScript sources as the app; heavy work runs in child processes.

import { childMain } from './child/tasks';
import { cleanCache, CACHE_DIR } from './gen/dumpCache';
import { USAGE, parseOptions } from './options';
import { info, summary } from './report';
import { SECTIONS } from './sections/registry';

async function main(argv: string[]): Promise<number> {
  if (argv[0] === '--child') {
    await childMain(argv[1], argv[2]);
    process.exit(0); // a capped baseline leaves its timers running; the result is already written
  }
  const opts = parseOptions(argv);
  if (!opts) {
    process.stdout.write(USAGE);
    return 0;
  }
  if (opts.clean) cleanCache();
  const started = Date.now();
  info(`midrail benchmark${opts.quick ? ' (quick)' : ''}: sections ${[...opts.only].join(', ')}; dumps cached in ${CACHE_DIR}`);
  info(`node ${process.version}, ${(await import('node:os')).cpus().length} cores; every figure below is compared within this run`);
  for (const s of SECTIONS) {
    if (!opts.only.has(s.name)) continue;
    try {
      await s.run(opts);
    } catch (e) {
      info(`section ${s.name} stopped: ${(e as Error).stack ?? String(e)}`);
    }
  }
  const missed = summary();
  info(`total time ${((Date.now() - started) / 1e3).toFixed(0)} s; ${missed} target(s) not met`);
  return 0;
}

main(process.argv.slice(2)).then(
  (code) => (process.exitCode = code),
  (e: unknown) => {
    process.stderr.write(`bench: ${(e as Error).message ?? String(e)}\n`);
    process.exitCode = 2;
  },
);
