// The built page as shipped, for the browser section: `vite build` into dist/bench-web, then
// `vite preview` of that folder on its own port, stopped when the section ends. Vite is run
// straight from node_modules (not through npx), so the process started is the one stopped.

import { type ChildProcess, spawn, spawnSync } from 'node:child_process';
import { readdirSync } from 'node:fs';
import { join } from 'node:path';

/** The repository: `npm run bench` (test/bench/run.mjs) runs the built bench from there. */
export const ROOT = process.cwd();
const VITE = join(ROOT, 'node_modules/vite/bin/vite.js');
export const WEB_DIR = 'dist/bench-web';
export const PORT = 4179;

export function buildPage(): { ms: number } {
  const began = Date.now();
  const r = spawnSync(process.execPath, [VITE, 'build', '--outDir', WEB_DIR, '--emptyOutDir', '--logLevel', 'warn'], {
    cwd: ROOT,
    encoding: 'utf8',
  });
  if (r.status !== 0) throw new Error(`vite build of the page failed (exit ${r.status}): ${(r.stderr || r.stdout).trim().split('\n').slice(-6).join('\n')}`);
  return { ms: Date.now() - began };
}

/** Address of a built asset whose file name starts with `prefix` (e.g. the parse worker chunk). */
export function assetUrl(base: string, prefix: string): string | null {
  const name = readdirSync(join(ROOT, WEB_DIR, 'assets')).find((f) => f.startsWith(prefix) && f.endsWith('.js'));
  return name ? `${base}/assets/${name}` : null;
}

export interface Preview {
  base: string;
  stop(): void;
}

export async function startPreview(): Promise<Preview> {
  const child: ChildProcess = spawn(process.execPath, [VITE, 'preview', '--outDir', WEB_DIR, '--port', String(PORT), '--strictPort'], {
    cwd: ROOT,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let log = '';
  child.stdout!.setEncoding('utf8').on('data', (d: string) => (log += d));
  child.stderr!.setEncoding('utf8').on('data', (d: string) => (log += d));
  const stop = () => {
    if (child.exitCode === null && child.signalCode === null) child.kill('SIGTERM');
  };
  // Never leave the server behind, even when the bench stops on an error.
  process.once('exit', stop);
  const base = `http://127.0.0.1:${PORT}`;
  const deadline = Date.now() + 30_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`vite preview exited (${child.exitCode}): ${log.trim().split('\n').slice(-4).join('\n')}`);
    try {
      const res = await fetch(base + '/');
      if (res.ok) break;
    } catch {
      /* not listening yet */
    }
    if (Date.now() > deadline) {
      stop();
      throw new Error(`vite preview did not answer on ${base} within 30 s: ${log.trim()}`);
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  return { base, stop };
}
