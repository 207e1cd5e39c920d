// Parent side of a child task: one fresh Node process per measurement, so the heap, the JIT and
// resident memory start clean each time.

import { spawn } from 'node:child_process';
import { RESULT_MARK } from './tasks';

export interface SpawnOptions {
  /** Extra node flags, such as --cpu-prof. */
  nodeFlags?: string[];
  timeoutMs?: number;
}

export function runChild<T>(task: string, args: Record<string, unknown>, opts: SpawnOptions = {}): Promise<T> {
  const script = process.argv[1];
  const argv = ['--expose-gc', ...(opts.nodeFlags ?? []), script, '--child', task, JSON.stringify(args)];
  return new Promise<T>((resolve, reject) => {
    const child = spawn(process.execPath, argv, { stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    let err = '';
    child.stdout.setEncoding('utf8').on('data', (d: string) => (out += d));
    child.stderr.setEncoding('utf8').on('data', (d: string) => (err += d));
    const timer = opts.timeoutMs
      ? setTimeout(() => {
          child.kill('SIGKILL');
          reject(new Error(`child task '${task}' took longer than ${opts.timeoutMs} ms and was stopped`));
        }, opts.timeoutMs)
      : null;
    child.on('close', (code) => {
      if (timer) clearTimeout(timer);
      const line = out.split('\n').find((l) => l.startsWith(RESULT_MARK));
      if (code === 0 && line) resolve(JSON.parse(line.slice(RESULT_MARK.length)) as T);
      else reject(new Error(`child task '${task}' failed (exit ${code}): ${(err || out).trim().split('\n').slice(-6).join('\n')}`));
    });
  });
}
