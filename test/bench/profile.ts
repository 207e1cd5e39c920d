// Where a parse spends its time: reads a V8 .cpuprofile (node --cpu-prof), adds up self time per
// function and maps bundle positions back to the TypeScript sources through the build's source map.

import { existsSync, mkdirSync, readFileSync, readdirSync, rmSync } from 'node:fs';
import { SourceMap } from 'node:module';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { runChild } from './child/spawnTask';
import { CACHE_DIR } from './gen/dumpCache';
import { fixed, info, table } from './report';

interface CallFrame {
  functionName: string;
  url: string;
  lineNumber: number;
  columnNumber: number;
}
interface ProfileNode {
  id: number;
  callFrame: CallFrame;
}
interface CpuProfile {
  nodes: ProfileNode[];
  samples: number[];
  timeDeltas: number[];
}

export interface HotFunction {
  name: string;
  where: string;
  selfMs: number;
  share: number;
}

const maps = new Map<string, SourceMap | null>();

function sourceMapFor(url: string): SourceMap | null {
  if (!maps.has(url)) {
    let map: SourceMap | null = null;
    try {
      const file = url.startsWith('file:') ? fileURLToPath(url) : url;
      if (existsSync(`${file}.map`)) map = new SourceMap(JSON.parse(readFileSync(`${file}.map`, 'utf8')));
    } catch {
      map = null;
    }
    maps.set(url, map);
  }
  return maps.get(url) ?? null;
}

function place(frame: CallFrame): string {
  if (!frame.url) return '';
  const map = sourceMapFor(frame.url);
  if (map) {
    const e = map.findEntry(frame.lineNumber, frame.columnNumber) as { originalSource?: string; originalLine?: number };
    if (e.originalSource) return `${e.originalSource.replace(/^.*?\/(src|test)\//, '$1/')}:${(e.originalLine ?? 0) + 1}`;
  }
  return `${frame.url.replace(/^.*\//, '')}:${frame.lineNumber + 1}`;
}

export function hottestFunctions(profilePath: string, top: number): { totalMs: number; rows: HotFunction[] } {
  const prof = JSON.parse(readFileSync(profilePath, 'utf8')) as CpuProfile;
  const byId = new Map(prof.nodes.map((n) => [n.id, n]));
  const self = new Map<string, { frame: CallFrame; us: number }>();
  let total = 0;
  // timeDeltas[i + 1] is the time until the next sample, spent where sample i was taken.
  for (let i = 0; i < prof.samples.length; i++) {
    const us = prof.timeDeltas[i + 1] ?? 0;
    const node = byId.get(prof.samples[i]);
    if (!node) continue;
    const f = node.callFrame;
    const key = `${f.functionName}|${f.url}|${f.lineNumber}|${f.columnNumber}`;
    const entry = self.get(key) ?? { frame: f, us: 0 };
    entry.us += us;
    self.set(key, entry);
    total += us;
  }
  const rows = [...self.values()]
    .sort((a, b) => b.us - a.us)
    .slice(0, top)
    .map((e) => ({
      name: e.frame.functionName || '(anonymous)',
      where: place(e.frame),
      selfMs: e.us / 1000,
      share: total > 0 ? e.us / total : 0,
    }));
  return { totalMs: total / 1000, rows };
}

/** Runs one child task under node --cpu-prof and prints its 15 hottest functions by self time. */
export async function profileChild(task: string, args: Record<string, unknown>, label: string): Promise<void> {
  mkdirSync(CACHE_DIR, { recursive: true });
  // Profiles of earlier runs of this task are replaced, so the cache folder does not grow.
  for (const old of readdirSync(CACHE_DIR)) if (old.startsWith(`profile-${task}-`)) rmSync(join(CACHE_DIR, old), { recursive: true, force: true });
  const dir = join(CACHE_DIR, `profile-${task}-${Date.now()}`);
  mkdirSync(dir, { recursive: true });
  await runChild(task, args, { nodeFlags: ['--cpu-prof', `--cpu-prof-dir=${dir}`] });
  const file = readdirSync(dir).find((f) => f.endsWith('.cpuprofile'));
  if (!file) return info('no CPU profile was written');
  const { totalMs, rows } = hottestFunctions(join(dir, file), 15);
  info(`CPU profile of ${label} (${fixed(totalMs)} ms sampled; ${join(dir, file)}):`);
  table(
    ['self %', 'self ms', 'function', 'source'],
    rows.map((r) => [(r.share * 100).toFixed(1), fixed(r.selfMs), r.name, r.where]),
  );
}
