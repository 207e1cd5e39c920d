#!/usr/bin/env node
// midrail command-line entry: dispatches to one module per command.
// Exit codes: 0 success, 1 a limit was violated (check), 2 bad arguments or unreadable input.

import { UsageError, runCommand } from './run';

const COMMANDS: Record<string, () => Promise<{ run: (args: string[]) => Promise<number> }>> = {
  info: () => import('./commands/info'),
  changes: () => import('./commands/changes'),
  delay: () => import('./commands/delay'),
  skew: () => import('./commands/skew'),
  glitches: () => import('./commands/glitches'),
  edges: () => import('./commands/edges'),
  check: () => import('./commands/check'),
  compare: () => import('./commands/compare'),
  merge: () => import('./commands/merge'),
};

const HELP = `midrail — timing measurements on value change dumps (IEEE 1364 VCD)

usage: midrail <command> [options]

commands:
  info <dump> [--json]                        timescale, end time, counts and every net
  changes <dump> --net NET [--json|--csv]     every change of one net or bit, in file order
  delay <dump> --from NET --to NET            every tPLH/tPHL pair between two nets
  skew <dump> --nets LIST|GLOB                skew of every switching event across nets
  glitches <dump> --max-width TIME            pulses narrower than TIME
  edges <dump> --net NET                      the edges found on one net
  check <dump|glob>... --plan FILE            run a measurement plan with limits
  compare <base> <new>                        edge-by-edge shift between two dumps
  merge <result.json>...                      combine check results

Run 'midrail <command> --help' for a command's options.
Simulated delays are only as good as the simulation model; they do not replace static timing
analysis or sign-off characterization.
`;

async function main(argv: string[]): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    process.stdout.write(HELP);
    return name === undefined ? 2 : 0;
  }
  if (name === '--version') {
    process.stdout.write(`${__MIDRAIL_VERSION__}\n`);
    return 0;
  }
  const load = COMMANDS[name];
  if (!load) throw new UsageError(`unknown command '${name}'; run 'midrail --help' for the list`);
  const mod = await load();
  return mod.run(rest);
}

runCommand(() => main(process.argv.slice(2)));
