// One range of a dump read in parts (src/parse/parts.ts), in a worker thread: reads the header
// bytes and its range straight from the file, then answers the reading thread's requests to close
// its input and to place its changes in the shared arrays. Built as its own entry
// (dist/cli/parsePart.js) and started by readParts.ts.

import { closeSync, openSync, readSync } from 'node:fs';
import { isMainThread, parentPort, workerData } from 'node:worker_threads';
import { PartReader, servePart } from '../parse/parts';

/** Marks the worker's workerData so a stray import never starts serving. */
export const PART_ROLE = 'midrail-parse-part';

export interface PartJob {
  role: typeof PART_ROLE;
  path: string;
  source: string;
  /** Bytes of the header: the file up to just past `$enddefinitions $end`. */
  headerEnd: number;
  /** The range [start, end) this part reads; start is the `#` of a timestamp line. */
  start: number;
  end: number;
}

/** Bytes read per piece from a plain file into one reused buffer. */
export const READ_PIECE = 4 * 1024 * 1024;

/** Reads buf.length bytes at `position` (fewer only at the end of the file); returns how many. */
export function readAt(fd: number, buf: Uint8Array, position: number): number {
  let n = 0;
  while (n < buf.length) {
    const got = readSync(fd, buf, n, buf.length - n, position + n);
    if (got === 0) break;
    n += got;
  }
  return n;
}

async function serve(job: PartJob): Promise<void> {
  const port = parentPort!;
  const answer = await servePart(
    async () => {
      const fd = openSync(job.path, 'r');
      try {
        const header = new Uint8Array(job.headerEnd);
        readAt(fd, header, 0);
        const reader = new PartReader(job.source, header, job.start);
        const piece = new Uint8Array(Math.min(READ_PIECE, job.end - job.start));
        for (let at = job.start; at < job.end; ) {
          const n = readAt(fd, piece.subarray(0, Math.min(piece.length, job.end - at)), at);
          if (n === 0) break;
          reader.push(piece.subarray(0, n));
          at += n;
        }
        return reader;
      } finally {
        closeSync(fd);
      }
    },
    (reply, transfer) => port.postMessage(reply, transfer ?? []),
  );
  port.on('message', answer);
}

if (!isMainThread && (workerData as PartJob | null)?.role === PART_ROLE) void serve(workerData as PartJob);
