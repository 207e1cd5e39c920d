// One range of a dump read in parts (src/parse/parts.ts), in a Web Worker that parse.worker.ts
// starts: reads the header and its range from the File, reports progress, then answers
// the requests to close its input and to place its changes in the shared arrays.

import { PartReader, type PartReply, type PartRequest, servePart } from '../src/parse/parts';
import { blobPieces } from './blobPieces';

export interface PartWorkerJob {
  file: Blob;
  source: string;
  headerEnd: number;
  start: number;
  end: number;
}

const SLICE = 1 << 20;
/** Progress is sent after every this many bytes. */
const PROGRESS_STEP = 4 * SLICE;

const post = (reply: PartReply, transfer: Transferable[] = []) => self.postMessage(reply, { transfer });

self.onmessage = async (first: MessageEvent<PartWorkerJob>) => {
  const job = first.data;
  // Requests come only after the range is read (see portPart).
  self.onmessage = null;
  const answer = await servePart(async () => {
    const header = new Uint8Array(await job.file.slice(0, job.headerEnd).arrayBuffer());
    const reader = new PartReader(job.source, header, job.start);
    const pieces = blobPieces(job.file.slice(job.start, job.end), SLICE);
    let read = 0;
    let reported = 0;
    for (let bytes = await pieces.next(SLICE); bytes.length > 0; bytes = await pieces.next(SLICE)) {
      reader.push(bytes);
      read += bytes.length;
      if (read - reported >= PROGRESS_STEP) {
        reported = read;
        post({ kind: 'progress', bytes: read });
      }
    }
    post({ kind: 'progress', bytes: read });
    return reader;
  }, post);
  self.onmessage = (e: MessageEvent<PartRequest>) => answer(e.data);
};
