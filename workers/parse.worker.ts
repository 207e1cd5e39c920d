// Parses a dump off the main thread. Reads a File in pieces into one reused buffer (see
// blobPieces.ts), or a same-origin URL as a stream; gunzips when the bytes start with the gzip
// magic; reports progress in input bytes; stops between pieces when cancelled; and transfers the
// finished Dump's typed arrays. A big plain File may be read by several workers (runInParts).

import * as Comlink from 'comlink';
import { type Dump, dumpBuffers } from '../src/model/dump';
import { PARTS_FROM_BYTES, type PartPort, type PartReply, portPart, readInParts, readingThreads } from '../src/parse/parts';
import { VcdError, VcdParser } from '../src/parse/vcd';
import { type BlobPieces, blobPieces, streamPieces } from './blobPieces';
import type { PartWorkerJob } from './parsePart.worker';

/** Bytes per slice: small enough for a smooth progress bar, large enough to parse fast. */
const SLICE = 1 << 20;

export interface ParseFailure {
  /** What went wrong, naming the file, line and byte offset when known. */
  message: string;
  line: number | null;
  offset: number | null;
  cancelled: boolean;
}

/** `threads`: how many threads read the dump (1: in one piece). */
export type ParseResult = { ok: true; dump: Dump; threads: number } | { ok: false; error: ParseFailure };

export type Progress = (bytesDone: number, bytesTotal: number) => void | Promise<void>;

let cancelled = false;

/** Counts bytes passing through, for progress in terms of the input file. */
function counting(stream: ReadableStream<Uint8Array>, onBytes: (n: number) => void): ReadableStream<Uint8Array> {
  return stream.pipeThrough(
    new TransformStream<Uint8Array, Uint8Array>({
      transform(chunk, ctrl) {
        onBytes(chunk.length);
        ctrl.enqueue(chunk);
      },
    }),
  );
}

/** Marks a dump whose compressed stream broke off, saying where. */
function cutShort(dump: Dump, source: string, why: string): Dump {
  const last = dump.times.length ? dump.times[dump.times.length - 1] : 0;
  dump.truncated = true;
  dump.warnings.push({ line: 0, offset: dump.bytes, message: `${source}: the compressed file stops early (${why}); loaded up to #${last}` });
  return dump;
}

/** Looks at the first chunk; if it starts with the gzip magic (1f 8b), gunzips the whole stream. */
async function maybeGunzip(stream: ReadableStream<Uint8Array>, onGzip: () => void): Promise<ReadableStream<Uint8Array>> {
  const reader = stream.getReader();
  const first = await reader.read();
  const head = first.done ? new Uint8Array(0) : first.value;
  const rest = new ReadableStream<Uint8Array>({
    start(ctrl) {
      if (head.length) ctrl.enqueue(head);
    },
    async pull(ctrl) {
      const r = await reader.read();
      if (r.done) ctrl.close();
      else ctrl.enqueue(r.value);
    },
    cancel(reason) {
      return reader.cancel(reason);
    },
  });
  if (head.length >= 2 && head[0] === 0x1f && head[1] === 0x8b) {
    onGzip();
    return rest.pipeThrough(new DecompressionStream('gzip') as unknown as ReadableWritablePair<Uint8Array, Uint8Array>);
  }
  return rest;
}

function failure(e: unknown, source: string): ParseFailure {
  if (e instanceof VcdError) return { message: e.message, line: e.line, offset: e.offset, cancelled: false };
  const msg = e instanceof Error ? e.message : String(e);
  // DecompressionStream reports a damaged .gz as a TypeError with a terse message.
  const hint = /compress|gzip|zlib|incorrect header|invalid/i.test(msg) ? ' (the file looks gzip-compressed but is damaged or cut short)' : '';
  return { message: `${source}: could not read the dump: ${msg}${hint}`, line: null, offset: null, cancelled: false };
}

/**
 * Parses `pieces` in this worker. `done()` is the input bytes read so far (compressed bytes for a
 * .gz), for progress against `total`; `gzipped()` says whether the bytes are being gunzipped.
 */
async function run(source: string, pieces: BlobPieces, done: () => number, total: number, onProgress?: Progress, gzipped = () => false): Promise<ParseResult> {
  let lastReport = 0;
  // On a cross-origin isolated page the finished arrays go on SharedArrayBuffers, so the page and
  // the measuring worker read one copy of the dump.
  const parser = new VcdParser(source, {}, { shared: self.crossOriginIsolated === true });
  try {
    for (;;) {
      let bytes: Uint8Array;
      try {
        bytes = await pieces.next(SLICE);
      } catch (e) {
        // A .gz cut short: keep what was decompressed, as for any dump that stops early.
        if (gzipped() && parser.bytesRead > 0) {
          const dump = cutShort(parser.finish(), source, (e as Error).message);
          if (onProgress) await onProgress(done(), total);
          return Comlink.transfer({ ok: true as const, dump, threads: 1 }, dumpBuffers(dump));
        }
        throw e;
      }
      if (bytes.length === 0) break;
      parser.push(bytes);
      if (onProgress && (done() - lastReport >= SLICE / 2 || done() === total)) {
        lastReport = done();
        // Awaiting the round trip also lets a cancel() message in between pieces.
        await onProgress(done(), total);
      }
      if (cancelled) {
        pieces.cancel();
        return cancelledResult(source);
      }
    }
    const dump = parser.finish();
    if (onProgress) await onProgress(done(), total);
    return Comlink.transfer({ ok: true as const, dump, threads: 1 }, dumpBuffers(dump));
  } catch (e) {
    pieces.cancel();
    return { ok: false, error: failure(e, source) };
  }
}

/** Parses a stream that may be gzipped (a .gz File, a fetched body), counting its raw bytes. */
async function runStream(source: string, input: ReadableStream<Uint8Array>, total: number, onProgress?: Progress): Promise<ParseResult> {
  let read = 0;
  let gzipped = false;
  const stream = await maybeGunzip(
    counting(input, (n) => (read += n)),
    () => (gzipped = true),
  );
  return run(source, streamPieces(stream), () => read, total, onProgress, () => gzipped);
}

/** The part workers of a read in parts now running (stopped by cancel). */
const partPorts = new Set<PartPort>();

/** A part Web Worker as a PartPort; stopping it counts as its going away. */
function partPort(job: PartWorkerJob): PartPort {
  const worker = new Worker(new URL('./parsePart.worker.ts', import.meta.url), { type: 'module', name: 'midrail-parse-part' });
  let gone: ((why: string) => void) | null = null;
  const port: PartPort = {
    send: (req) => worker.postMessage(req),
    listen(onReply, onGone) {
      gone = onGone;
      worker.onmessage = (e: MessageEvent<PartReply>) => onReply(e.data);
      worker.onerror = (e) => onGone(e.message || 'the part worker failed');
    },
    stop() {
      worker.terminate();
      partPorts.delete(port);
      gone?.('stopped');
    },
  };
  partPorts.add(port);
  worker.postMessage(job);
  return port;
}

async function isGzipBlob(file: Blob): Promise<boolean> {
  const head = new Uint8Array(await file.slice(0, 2).arrayBuffer());
  return head.length === 2 && head[0] === 0x1f && head[1] === 0x8b;
}

/**
 * Reads a big plain file with several threads (src/parse/parts.ts): this worker reads the header
 * and the first range, part workers the rest, and the parts are joined on SharedArrayBuffers.
 * Returns null when the file must be read in one piece (the caller then does).
 */
async function runInParts(file: Blob, source: string, threads: number, onProgress?: Progress): Promise<ParseResult | null> {
  const partBytes: number[] = [];
  const firstPieces = blobPieces(file, SLICE);
  let firstBytes = 0;
  let lastReport = 0;
  const report = (force: boolean) => {
    const done = firstBytes + partBytes.reduce((a, b) => a + b, 0);
    if (!onProgress || (!force && done - lastReport < SLICE)) return;
    lastReport = done;
    return onProgress(done, file.size);
  };
  try {
    const joined = await readInParts(
      {
        source,
        size: file.size,
        next: (max) => firstPieces.next(max),
        window: async (offset, length) => new Uint8Array(await file.slice(offset, Math.min(file.size, offset + length)).arrayBuffer()),
        spawn: (range) => {
          const index = partBytes.push(0) - 1;
          return portPart(partPort({ file, source, ...range }), (bytes) => {
            partBytes[index] = bytes;
            void report(false);
          });
        },
        progress: async (bytes) => {
          firstBytes = bytes;
          // Awaiting the round trip also lets a cancel() message in between pieces.
          await report(false);
        },
        stopped: () => cancelled,
      },
      threads,
      SLICE,
    );
    firstPieces.cancel();
    if (joined === 'stopped' || cancelled) return cancelledResult(source);
    if (typeof joined === 'string') return null;
    firstBytes = file.size;
    partBytes.fill(0);
    await report(true);
    return Comlink.transfer({ ok: true as const, dump: joined, threads }, dumpBuffers(joined));
  } catch (e) {
    return cancelled ? cancelledResult(source) : { ok: false, error: failure(e, source) };
  }
}

function cancelledResult(source: string): ParseResult {
  return { ok: false, error: { message: `${source}: loading cancelled`, line: null, offset: null, cancelled: true } };
}

const api = {
  /**
   * Parses a File or Blob chosen by the user (picker or drop). A big plain file on a cross-origin
   * isolated page is read by several threads (`threads`, default by readingThreads).
   */
  async parseFile(file: Blob, name: string, onProgress?: Progress, threads?: number): Promise<ParseResult> {
    cancelled = false;
    if (await isGzipBlob(file)) return runStream(name, file.stream(), file.size, onProgress);
    const wanted = threads ?? readingThreads(file.size, navigator.hardwareConcurrency || 1);
    if (wanted > 1 && file.size >= PARTS_FROM_BYTES && self.crossOriginIsolated === true) {
      const inParts = await runInParts(file, name, wanted, onProgress);
      if (inParts) return inParts;
      if (cancelled) return cancelledResult(name);
    }
    const pieces = blobPieces(file, SLICE);
    let read = 0;
    const counted: BlobPieces = {
      next: async (max) => {
        const bytes = await pieces.next(max);
        read += bytes.length;
        return bytes;
      },
      cancel: () => pieces.cancel(),
    };
    return run(name, counted, () => read, file.size, onProgress);
  },

  /** Parses a same-origin URL (the page checks the origin before asking). */
  async parseUrl(url: string, name: string, onProgress?: Progress): Promise<ParseResult> {
    cancelled = false;
    let res: Response;
    try {
      res = await fetch(url, { credentials: 'same-origin' });
    } catch (e) {
      return { ok: false, error: { message: `${name}: could not fetch ${url}: ${(e as Error).message}`, line: null, offset: null, cancelled: false } };
    }
    if (!res.ok || !res.body) {
      return { ok: false, error: { message: `${name}: could not fetch ${url}: HTTP ${res.status} ${res.statusText}`, line: null, offset: null, cancelled: false } };
    }
    const total = Number(res.headers.get('content-length') ?? 0) || 0;
    return runStream(name, res.body, total, onProgress);
  },

  /** Stops the running parse at the next chunk boundary (and any part workers at once). */
  cancel(): void {
    cancelled = true;
    for (const port of [...partPorts]) port.stop();
  },
};

export type ParseApi = typeof api;

Comlink.expose(api);
