// Work that runs in a child process of its own. The parent starts `node --expose-gc <bench> --child
// <task> <json args>`; the child prints one `@@RESULT <json>` line.

import { runBaseline } from './baselineTask';
import { runFloor } from './floorTask';
import { runDelay, runGlitches } from './measureTask';
import { runParse } from './parseTask';
import { runThreads } from './threadsTask';
import { runTouch } from './touchTask';

export const RESULT_MARK = '@@RESULT ';

type Task = (args: Record<string, unknown>) => Promise<unknown> | unknown;

const TASKS: Record<string, Task> = {
  floor: (a) => runFloor(String(a.path)),
  parse: (a) => runParse(String(a.path)),
  touch: (a) => runTouch(Number(a.bytes)),
  threads: (a) => runThreads(String(a.path), Number(a.threads)),
  baseline: (a) => runBaseline(String(a.path), Number(a.capMs)),
  delay: (a) => runDelay(Number(a.pairs), Number(a.runs)),
  glitches: (a) => runGlitches(String(a.path), Number(a.maxWidthS), Number(a.runs)),
};

export async function childMain(name: string, json: string): Promise<void> {
  const task = TASKS[name];
  if (!task) throw new Error(`unknown bench child task '${name}'`);
  const result = await task(JSON.parse(json) as Record<string, unknown>);
  process.stdout.write(RESULT_MARK + JSON.stringify(result) + '\n');
}
