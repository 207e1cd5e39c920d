// Parses a dump off the main thread. Reads a File in slices (or a same-origin URL as a
// stream), gunzips when the bytes start with the gzip magic, reports progress in input bytes,
// stops between chunks when cancelled, and transfers the finished Dump's typed arrays.

import * as Comlink from 'comlink';
import { type Dump, dumpBuffers } from '../src/model/dump';
import { VcdError, VcdParser } from '../src/parse/vcd';

/** Bytes per slice: small enough for a smooth progress bar, large enough to parse fast. */
const SLICE = 1 << 20;

export interface ParseFailure {
  /** What went wrong, naming the file, line and byte offset when known. */
  message: string;
  line: number | null;
  offset: number | null;
  cancelled: boolean;
}

export type ParseResult = { ok: true; dump: Dump } | { ok: false; error: ParseFailure };

export type Progress = (bytesDone: number, bytesTotal: number) => void | Promise<void>;

let cancelled = false;

/** A stream of a Blob's bytes in SLICE-sized pieces. */
function sliceStream(blob: Blob): ReadableStream<Uint8Array> {
  let at = 0;
  return new ReadableStream<Uint8Array>({
    async pull(ctrl) {
      if (at >= blob.size) {
        ctrl.close();
        return;
      }
      const end = Math.min(blob.size, at + SLICE);
      const buf = await blob.slice(at, end).arrayBuffer();
      at = end;
      ctrl.enqueue(new Uint8Array(buf));
    },
  });
}

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

async function run(source: string, input: ReadableStream<Uint8Array>, total: number, onProgress?: Progress): Promise<ParseResult> {
  cancelled = false;
  let done = 0;
  let lastReport = 0;
  let gzipped = false;
  const stream = await maybeGunzip(counting(input, (n) => (done += n)), () => (gzipped = true));
  // On a cross-origin isolated page the finished arrays go on SharedArrayBuffers, so the page and
  // the measuring worker read one copy of the dump.
  const parser = new VcdParser(source, {}, { shared: self.crossOriginIsolated === true });
  const reader = stream.getReader();
  try {
    for (;;) {
      let r: ReadableStreamReadResult<Uint8Array>;
      try {
        r = await reader.read();
      } catch (e) {
        // A .gz cut short: keep what was decompressed, as for any dump that stops early.
        if (gzipped && parser.bytesRead > 0) {
          const dump = cutShort(parser.finish(), source, (e as Error).message);
          if (onProgress) await onProgress(done, total);
          return Comlink.transfer({ ok: true as const, dump }, dumpBuffers(dump));
        }
        throw e;
      }
      if (r.done) break;
      parser.push(r.value);
      if (onProgress && (done - lastReport >= SLICE / 2 || done === total)) {
        lastReport = done;
        // Awaiting the round trip also lets a cancel() message in between chunks.
        await onProgress(done, total);
      }
      if (cancelled) {
        await reader.cancel('cancelled');
        return { ok: false, error: { message: `${source}: loading cancelled`, line: null, offset: null, cancelled: true } };
      }
    }
    const dump = parser.finish();
    if (onProgress) await onProgress(done, total);
    return Comlink.transfer({ ok: true as const, dump }, dumpBuffers(dump));
  } catch (e) {
    return { ok: false, error: failure(e, source) };
  }
}

const api = {
  /** Parses a File or Blob chosen by the user (picker or drop). */
  async parseFile(file: Blob, name: string, onProgress?: Progress): Promise<ParseResult> {
    return run(name, sliceStream(file), file.size, onProgress);
  },

  /** Parses a same-origin URL (the page checks the origin before asking). */
  async parseUrl(url: string, name: string, onProgress?: Progress): Promise<ParseResult> {
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
    return run(name, res.body, total, onProgress);
  },

  /** Stops the running parse at the next chunk boundary. */
  cancel(): void {
    cancelled = true;
  },
};

export type ParseApi = typeof api;

Comlink.expose(api);
