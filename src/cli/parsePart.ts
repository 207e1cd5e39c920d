// One range of a dump read in parts (src/parse/parts.ts), in a worker thread: reads the header
// bytes and its range straight from the file, then answers the reading thread's requests to close
// its input and to place its changes in the shared arrays. Built as its own entry
// (dist/cli/parsePart.js) and started by readParts.ts.

import { closeSync, openSync } from 'node:fs';
import { isMainThread, parentPort, workerData } from 'node:worker_threads';
import { PartReader, servePart } from '../parse/parts';
import { forEachPiece, readAt } from './filePieces';

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

async function serve(job: PartJob): Promise<void> {
  const port = parentPort!;
  const answer = await servePart(
    async () => {
      const header = new Uint8Array(job.headerEnd);
      const fd = openSync(job.path, 'r');
      try {
        readAt(fd, header, 0);
      } finally {
        closeSync(fd);
      }
      const reader = new PartReader(job.source, header, job.start);
      forEachPiece(job.path, (bytes) => reader.push(bytes), job.start, job.end);
      return reader;
    },
    (reply, transfer) => port.postMessage(reply, transfer ?? []),
  );
  port.on('message', answer);
}

if (!isMainThread && (workerData as PartJob | null)?.role === PART_ROLE) void serve(workerData as PartJob);
