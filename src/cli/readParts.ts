// Reads a big plain dump file with several threads (src/parse/parts.ts): this thread reads the
// header and the first range, worker threads (parsePart.ts) the others, and the parts are joined
// into one Dump on SharedArrayBuffers. Returns null when the file must be read in one piece
// instead (the caller does; see joinParts for when).

import { closeSync, existsSync, openSync } from 'node:fs';
import { basename } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { Dump } from '../model/dump';
import type { DumpArrays, PartPlacement } from '../model/layout';
import { type PartClosed, type PartHandle, type PartPlaced, type PartRead, cutTargets, firstTimestampLine, joinParts } from '../parse/parts';
import { VcdParser } from '../parse/vcd';
import { PART_ROLE, type PartJob, type PartRequest, READ_PIECE, readAt } from './parsePart';

/** Bytes searched for a timestamp line after each cut's target. */
const CUT_WINDOW = 1024 * 1024;

/**
 * dist/cli/parsePart.js beside the running CLI, or null when running from TypeScript source
 * (unit tests), where there is no built worker to start.
 */
export function partWorkerScript(): string | null {
  if (!import.meta.url.endsWith('.js')) return null;
  for (const rel of ['./parsePart.js', '../parsePart.js']) {
    const url = new URL(rel, import.meta.url);
    if (url.protocol === 'file:' && existsSync(url)) return fileURLToPath(url);
  }
  return null;
}

type Reply = { kind: 'read'; read: PartRead } | { kind: 'closed'; closed: PartClosed } | { kind: 'placed'; placed: PartPlaced } | { kind: 'error'; message: string };

/** A part read by a worker thread; its replies arrive in the order asked. */
function workerPart(script: string, job: PartJob): PartHandle {
  const worker = new Worker(script, { workerData: job });
  const replies: Reply[] = [];
  const waiting: Array<(r: Reply) => void> = [];
  let gone: string | null = null;
  const deliver = (r: Reply) => {
    const w = waiting.shift();
    if (w) w(r);
    else replies.push(r);
  };
  worker.on('message', deliver);
  worker.on('error', (err) => {
    gone = err.message;
    while (waiting.length) waiting.shift()!({ kind: 'error', message: gone });
  });
  worker.on('exit', () => {
    gone ??= 'the worker stopped';
    while (waiting.length) waiting.shift()!({ kind: 'error', message: gone });
  });
  const next = <K extends Reply['kind']>(kind: K): Promise<Extract<Reply, { kind: K }>> =>
    new Promise((resolve, reject) => {
      const take = (r: Reply) => (r.kind === kind ? resolve(r as Extract<Reply, { kind: K }>) : reject(new Error(r.kind === 'error' ? r.message : `unexpected ${r.kind}`)));
      const early = replies.shift();
      if (early) take(early);
      else if (gone !== null) reject(new Error(gone));
      else waiting.push(take);
    });
  const ask = (req: PartRequest) => worker.postMessage(req);
  return {
    read: async () => (await next('read')).read,
    close: async (lineAtStart: number) => {
      ask({ kind: 'close', lineAtStart });
      return (await next('closed')).closed;
    },
    place: async (arrays: DumpArrays, placement: PartPlacement) => {
      ask({ kind: 'place', arrays, placement });
      return (await next('placed')).placed;
    },
    dispose: () => void worker.terminate(),
  };
}

/**
 * Reads `path` (`size` bytes, not gzipped) in up to `parts` parts. Errors in the first range
 * (which this thread reads, with exact line numbers) are thrown; anything that stops a join makes
 * it return null after telling `onOnePiece` why.
 */
export async function readDumpInParts(path: string, size: number, parts: number, script: string, onOnePiece: (why: string) => void): Promise<Dump | null> {
  const source = basename(path);
  const first = new VcdParser(source, {}, { shared: true });
  const handles: PartHandle[] = [];
  const fd = openSync(path, 'r');
  try {
    const piece = new Uint8Array(READ_PIECE);
    let at = 0;
    while (first.bodyStart < 0 && at < size) {
      const n = readAt(fd, piece, at);
      if (n === 0) break;
      first.push(piece.subarray(0, n));
      at += n;
    }
    if (first.bodyStart < 0) {
      onOnePiece('no end of the header found');
      return null;
    }
    const cuts: number[] = [];
    const window = new Uint8Array(CUT_WINDOW);
    for (const target of cutTargets(first.bodyStart, size, parts)) {
      const from = Math.max(target, at, cuts.length ? cuts[cuts.length - 1] + 1 : 0) - 1;
      const n = readAt(fd, window, from);
      const found = firstTimestampLine(window.subarray(0, n), 1);
      if (found >= 0) cuts.push(from + found);
    }
    if (cuts.length === 0) {
      onOnePiece('no timestamp line to cut at');
      return null;
    }
    for (let j = 0; j < cuts.length; j++) {
      const job: PartJob = { role: PART_ROLE, path, source, headerEnd: first.bodyStart, start: cuts[j], end: j + 1 < cuts.length ? cuts[j + 1] : size };
      handles.push(workerPart(script, job));
    }
    // The first range, read here while the workers read theirs.
    while (at < cuts[0]) {
      const n = readAt(fd, piece.subarray(0, Math.min(READ_PIECE, cuts[0] - at)), at);
      if (n === 0) break;
      first.push(piece.subarray(0, n));
      at += n;
    }
    closeSync(fd);
    const joined = await joinParts(first, handles, size, true);
    if (typeof joined === 'string') {
      onOnePiece(joined);
      return null;
    }
    return joined;
  } finally {
    try {
      closeSync(fd);
    } catch {
      // already closed
    }
    for (const h of handles) h.dispose();
  }
}
