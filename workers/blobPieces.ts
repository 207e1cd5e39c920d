// Reads a Blob front to back in pieces. Where the engine offers a BYOB reader on Blob.stream(),
// every piece lands in one reused buffer: in Chromium that reads a file about 4× faster than the
// default reader and 10–20× faster than awaiting blob.slice().arrayBuffer() per piece (measured
// on 64 MB), because nothing new is allocated per piece. A piece is valid until the next call.

export interface BlobPieces {
  /** The next bytes (at most `max`), or an empty array at the end. */
  next(max: number): Promise<Uint8Array>;
  cancel(): void;
}

export function blobPieces(blob: Blob, size: number): BlobPieces {
  const stream = blob.stream();
  let byob: ReadableStreamBYOBReader | null = null;
  try {
    byob = stream.getReader({ mode: 'byob' });
  } catch {
    byob = null; // not a byte stream here: take the pieces as they come
  }
  if (byob) {
    const reader = byob;
    let buffer = new ArrayBuffer(size);
    return {
      async next(max) {
        const r = await reader.read(new Uint8Array(buffer, 0, Math.min(max, size)));
        if (r.done || !r.value) return new Uint8Array(0);
        buffer = r.value.buffer as ArrayBuffer; // handed back by the read (the old one is detached)
        return r.value;
      },
      cancel: () => void reader.cancel().catch(() => undefined),
    };
  }
  return streamPieces(stream);
}

/** Pieces of any byte stream, as the stream gives them (cut to `max`). */
export function streamPieces(stream: ReadableStream<Uint8Array>): BlobPieces {
  const reader = stream.getReader();
  let held: Uint8Array | null = null;
  return {
    async next(max) {
      if (!held || held.length === 0) {
        const r = await reader.read();
        if (r.done) return new Uint8Array(0);
        held = r.value;
      }
      const out = held.subarray(0, Math.min(max, held.length));
      held = held.subarray(out.length);
      return out;
    },
    cancel: () => void reader.cancel().catch(() => undefined),
  };
}
