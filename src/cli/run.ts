// Shared plumbing for CLI commands: error classes, exit codes, argument parsing.

import { parseArgs, type ParseArgsConfig } from 'node:util';

/** Bad arguments or unreadable input: exit 2 with the message on stderr. */
export class UsageError extends Error {}

export const EXIT_OK = 0;
export const EXIT_VIOLATION = 1;
export const EXIT_BAD_INPUT = 2;

export function runCommand(body: () => Promise<number>): void {
  // A reader that stops early (`midrail info x.vcd | head`) closes the pipe; that is not an error.
  process.stdout.on('error', (err: NodeJS.ErrnoException) => {
    if (err.code === 'EPIPE') process.exit(process.exitCode ?? EXIT_OK);
    throw err;
  });
  body().then(
    (code) => {
      process.exitCode = code;
    },
    (err: unknown) => {
      const msg = err instanceof Error ? err.message : String(err);
      process.stderr.write(`midrail: ${msg}\n`);
      if (process.env.MIDRAIL_DEBUG && err instanceof Error) process.stderr.write(`${err.stack}\n`);
      process.exitCode = EXIT_BAD_INPUT;
    },
  );
}

/** node:util parseArgs with strict checking; its errors become UsageError (exit 2). */
export function parseCommandArgs<T extends NonNullable<ParseArgsConfig['options']>>(args: string[], options: T, usage: string) {
  try {
    return parseArgs({ args, options, allowPositionals: true, strict: true });
  } catch (err) {
    throw new UsageError(`${(err as Error).message}\nusage: ${usage}`);
  }
}
