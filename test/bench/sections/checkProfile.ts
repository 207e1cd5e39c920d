// `--profile` for the check section: the built CLI under node --cpu-prof with --jobs 2. Node writes
// one profile per thread (the main thread and each worker), so this shows which thread does what:
// whether the dumps' parsing and hashing really happen in the workers.

import { mkdirSync, readdirSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { runCli } from '../child/cliRun';
import { CACHE_DIR } from '../gen/dumpCache';
import { hottestFunctions } from '../profile';
import { fixed, info, table } from '../report';

const PROFILED_DUMPS = 4;

export async function checkProfile(files: string[], plan: string): Promise<void> {
  mkdirSync(CACHE_DIR, { recursive: true });
  for (const old of readdirSync(CACHE_DIR)) if (old.startsWith('profile-check-')) rmSync(join(CACHE_DIR, old), { recursive: true, force: true });
  const dir = join(CACHE_DIR, `profile-check-${Date.now()}`);
  mkdirSync(dir, { recursive: true });
  const some = files.slice(0, PROFILED_DUMPS);
  const r = await runCli(['check', ...some, '--plan', plan, '--json', '--jobs', '2'], ['--cpu-prof', `--cpu-prof-dir=${dir}`]);
  info(`CPU profile of check --jobs 2 on ${some.length} dumps: ${fixed(r.wallMs / 1e3)} s wall, exit ${r.code}; ${dir}`);
  const profiles = readdirSync(dir).filter((f) => f.endsWith('.cpuprofile')).sort();
  for (const f of profiles) {
    const { totalMs, rows } = hottestFunctions(join(dir, f), 8);
    // The CLI is built without source maps, so places are bundle file:line.
    info(`${f}: ${fixed(totalMs)} ms sampled`);
    table(
      ['self %', 'self ms', 'function', 'where'],
      rows.map((x) => [(x.share * 100).toFixed(1), fixed(x.selfMs), x.name, x.where]),
    );
  }
}
