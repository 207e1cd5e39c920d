// Spawning the built CLI for the measurement command tests.

import { spawnSync } from 'node:child_process';
import { join, resolve } from 'node:path';
import { expect } from 'vitest';

export const ROOT = resolve(import.meta.dirname, '../..');
/** The built CLI (`npm run prepare`); MIDRAIL_CLI points the tests at another build. */
export const CLI = process.env.MIDRAIL_CLI ?? join(ROOT, 'dist/cli/main.js');

export interface Ran {
  code: number | null;
  stdout: string;
  stderr: string;
}

export function midrail(...args: string[]): Ran {
  const r = spawnSync(process.execPath, [CLI, ...args], { cwd: ROOT, encoding: 'utf8', maxBuffer: 256 << 20 });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

/** Exit 0, nothing on stderr, and stdout is exactly one JSON document. */
export function json<T = any>(r: Ran): T {
  expect(r.stderr).toBe('');
  expect(r.code).toBe(0);
  return JSON.parse(r.stdout) as T;
}
