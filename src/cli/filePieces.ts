// Reads files in pieces into one buffer per thread, reused for every piece and every file: fresh
// memory costs more to touch than the bytes cost to read (npm run bench prints it), and the parser
// copies a token cut at a piece's end and keeps no view of a piece. A piece is valid until the next
// read on the same thread.

import { closeSync, openSync, readSync } from 'node:fs';

/** Small enough that a hash and the parser both find a piece in the CPU cache. */
export const PIECE_BYTES = 1 << 20;

let shared: Uint8Array | null = null;

/** This thread's piece buffer. */
export function pieceBuffer(): Uint8Array {
  return (shared ??= new Uint8Array(PIECE_BYTES));
}

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

/** Calls `onPiece` with the bytes of [from, to) of the file at `path`, in order. */
export function forEachPiece(path: string, onPiece: (bytes: Uint8Array) => void, from = 0, to = Number.POSITIVE_INFINITY): void {
  const buf = pieceBuffer();
  const fd = openSync(path, 'r');
  try {
    for (let at = from; at < to; ) {
      const n = readAt(fd, buf.subarray(0, Math.min(buf.length, to - at)), at);
      if (n === 0) break;
      onPiece(buf.subarray(0, n));
      at += n;
    }
  } finally {
    closeSync(fd);
  }
}
