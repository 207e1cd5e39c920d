// Runs the built CLI (`node dist/cli/main.js ...`) as a child process and measures it from outside:
// wall time from spawn to exit, and the process's peak resident set. Worker threads live in the
// same process, so one figure covers them all. The peak comes from GNU time's "Maximum resident
// set size" (the kernel's ru_maxrss for the child, getrusage(2)); without /usr/bin/time, from
// sampling VmHWM in /proc/<pid>/status every 20 ms (the kernel's high-water mark, proc(5)).

import { spawn } from 'node:child_process';
import { cpSync, existsSync, readFileSync, rmSync, statSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';

export const REPO_ROOT = fileURLToPath(new URL('../..', pathToFileURL(process.argv[1])));
export const CLI_MAIN = `${REPO_ROOT}dist/cli/main.js`;
export const CLI_WORKER = `${REPO_ROOT}dist/cli/checkWorker.js`;
/**
 * A private copy of dist/cli, so an `npm run prepare` (it empties dist/cli) or another bench build
 * (it empties dist/bench) elsewhere cannot break a timed run. In the repository's ignored
 * .bench-tmp, so the bundle is still an ES module (package.json type) and finds node_modules.
 */
const SNAPSHOT = `${REPO_ROOT}.bench-tmp/check-cli-${process.pid}`;
let cliMain = CLI_MAIN;
const GNU_TIME = '/usr/bin/time';

export interface CliRun {
  code: number | null;
  wallMs: number;
  /** Peak resident bytes of the CLI process, worker threads included; 0 if it could not be read. */
  peakRss: number;
  peakSource: 'getrusage' | 'VmHWM samples' | 'none';
  /** CPU seconds in user and kernel mode over all threads, and minor page faults (GNU time; null without it). */
  userS: number | null;
  sysS: number | null;
  minorFaults: number | null;
  stdout: string;
  stderr: string;
}

/**
 * Copies the built CLI (main.js, its chunks and checkWorker.js) and runs that copy from then on.
 * Returns the build time of the copy, or null when the CLI is not built.
 */
export function snapshotCli(): number | null {
  if (!existsSync(CLI_MAIN) || !existsSync(CLI_WORKER)) return null;
  const built = Math.min(statSync(CLI_MAIN).mtimeMs, statSync(CLI_WORKER).mtimeMs);
  rmSync(SNAPSHOT, { recursive: true, force: true });
  cpSync(`${REPO_ROOT}dist/cli`, SNAPSHOT, { recursive: true });
  if (!existsSync(`${SNAPSHOT}/main.js`) || !existsSync(`${SNAPSHOT}/checkWorker.js`)) return null; // caught mid-rebuild
  cliMain = `${SNAPSHOT}/main.js`;
  return built;
}

export function dropCliSnapshot(): void {
  rmSync(SNAPSHOT, { recursive: true, force: true });
  cliMain = CLI_MAIN;
}

function vmHwm(pid: number): number {
  try {
    const m = /VmHWM:\s+(\d+)\s+kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
    return m ? Number(m[1]) * 1024 : 0;
  } catch {
    return 0;
  }
}

export function runCli(args: string[], nodeFlags: string[] = [], timeoutMs = 10 * 60_000): Promise<CliRun> {
  const withTime = existsSync(GNU_TIME);
  const node = [process.execPath, ...nodeFlags, cliMain, ...args];
  const [cmd, ...argv] = withTime ? [GNU_TIME, '-v', ...node] : node;
  return new Promise((resolve, reject) => {
    const t0 = performance.now();
    const child = spawn(cmd, argv, { cwd: REPO_ROOT, stdio: ['ignore', 'pipe', 'pipe'] });
    const out: Buffer[] = [];
    let err = '';
    child.stdout.on('data', (d: Buffer) => out.push(d));
    child.stderr.setEncoding('utf8').on('data', (d: string) => (err += d));
    let sampled = 0;
    const sampler = withTime ? null : setInterval(() => (sampled = Math.max(sampled, vmHwm(child.pid ?? 0))), 20);
    const timer = setTimeout(() => {
      child.kill('SIGKILL');
      reject(new Error(`midrail ${args[0]} took longer than ${timeoutMs / 1000} s and was stopped`));
    }, timeoutMs);
    child.on('error', reject);
    child.on('close', (code) => {
      const wallMs = performance.now() - t0;
      clearTimeout(timer);
      if (sampler) clearInterval(sampler);
      let peakRss = sampled;
      let peakSource: CliRun['peakSource'] = sampled > 0 ? 'VmHWM samples' : 'none';
      let stderr = err;
      const field = (name: string): number | null => {
        const m = new RegExp(`${name}: ([\\d.]+)`).exec(err);
        return m ? Number(m[1]) : null;
      };
      if (withTime) {
        const m = /Maximum resident set size \(kbytes\): (\d+)/.exec(err);
        if (m) {
          peakRss = Number(m[1]) * 1024;
          peakSource = 'getrusage';
        }
        // GNU time appends its report after the command's own stderr.
        const exited = err.lastIndexOf('Command exited with non-zero status');
        const at = exited >= 0 ? exited : err.lastIndexOf('\tCommand being timed:');
        if (at >= 0) stderr = err.slice(0, at);
      }
      resolve({
        code,
        wallMs,
        peakRss,
        peakSource,
        userS: field('User time \\(seconds\\)'),
        sysS: field('System time \\(seconds\\)'),
        minorFaults: field('Minor \\(reclaiming a frame\\) page faults'),
        stdout: Buffer.concat(out).toString('utf8'),
        stderr,
      });
    });
  });
}
