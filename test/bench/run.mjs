// `npm run bench` entry: builds the TypeScript benchmark (test/bench/run.ts) and the part-reading
// worker with vite into dist/bench, then runs it with the arguments given (`npm run bench -- --quick --only parse`).
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('../..', import.meta.url));
const vite = fileURLToPath(new URL('../../node_modules/vite/bin/vite.js', import.meta.url));
const build = spawnSync(
  process.execPath,
  [vite, 'build', '--ssr', 'test/bench/run.ts', '--outDir', 'dist/bench', '--emptyOutDir', '--sourcemap', '--logLevel', 'warn'],
  { cwd: root, stdio: 'inherit' },
);
if (build.status !== 0) process.exit(build.status ?? 2);
// The worker that reads one part of a dump (src/cli/readParts.ts), beside run.js.
const part = spawnSync(
  process.execPath,
  [vite, 'build', '--ssr', 'src/cli/parsePart.ts', '--outDir', 'dist/bench', '--emptyOutDir=false', '--logLevel', 'warn'],
  { cwd: root, stdio: 'inherit' },
);
if (part.status !== 0) process.exit(part.status ?? 2);
const run = spawnSync(process.execPath, ['dist/bench/run.js', ...process.argv.slice(2)], { cwd: root, stdio: 'inherit' });
process.exit(run.status ?? 2);
