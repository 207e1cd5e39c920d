// Reads a big plain dump file with several threads (src/parse/parts.ts): this thread reads the
// header and the first range, worker threads (parsePart.ts) the others, and the parts are joined
// into one Dump on SharedArrayBuffers. Returns null when the file must be read in one piece
// instead (the caller does; see joinParts for when).

import { closeSync, existsSync, openSync } from 'node:fs';
import { basename } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { Dump } from '../model/dump';
import { type PartPort, type PartReply, portPart, readInParts } from '../parse/parts';
import { PIECE_BYTES, pieceBuffer, readAt } from './filePieces';
import { PART_ROLE, type PartJob } from './parsePart';

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

/** A worker_threads Worker as a PartPort. */
function workerPort(script: string, job: PartJob): PartPort {
  const worker = new Worker(script, { workerData: job });
  return {
    send: (req) => worker.postMessage(req),
    listen(onReply, onGone) {
      worker.on('message', (reply: PartReply) => onReply(reply));
      worker.on('error', (err) => onGone(err.message));
      worker.on('exit', () => onGone('the worker stopped'));
    },
    stop: () => void worker.terminate(),
  };
}

/**
 * Reads `path` (`size` bytes, not gzipped) in up to `parts` parts. Errors in the first range are
 * thrown; anything that stops a join makes it return null after telling `onOnePiece` why.
 */
export async function readDumpInParts(path: string, size: number, parts: number, script: string, onOnePiece: (why: string) => void): Promise<Dump | null> {
  const source = basename(path);
  const fd = openSync(path, 'r');
  const buffer = pieceBuffer();
  let at = 0;
  try {
    const joined = await readInParts(
      {
        source,
        size,
        next: async (max) => {
          const n = readAt(fd, buffer.subarray(0, Math.min(max, buffer.length)), at);
          at += n;
          return buffer.subarray(0, n);
        },
        window: async (offset, length) => {
          const bytes = new Uint8Array(length);
          return bytes.subarray(0, readAt(fd, bytes, offset));
        },
        spawn: (range) => portPart(workerPort(script, { role: PART_ROLE, path, source, ...range })),
      },
      parts,
      PIECE_BYTES,
    );
    if (typeof joined === 'string') {
      onOnePiece(joined);
      return null;
    }
    return joined;
  } finally {
    closeSync(fd);
  }
}
