// Reads a file in fixed 16 MiB pieces into one reused buffer. The parser runs and the newline
// floor use this same reader, so their ratio compares the work done on the bytes only.
// Reusing the buffer is safe for midrail's parser because it copies any token cut by a piece
// boundary and keeps no view of a piece (src/parse/vcd.ts); the parse section also checks the
// change count against the generator's, which a stale view would upset.

import { closeSync, openSync, readSync } from 'node:fs';

export const PIECE = 16 << 20; // 16 MiB, as issue 2 specifies for the floor

export function pieceBuffer(): Uint8Array {
  return new Uint8Array(PIECE).fill(0); // touched once, so its pages count in the baseline
}

export function forEachPiece(path: string, buf: Uint8Array, onPiece: (piece: Uint8Array) => void): number {
  const fd = openSync(path, 'r');
  let total = 0;
  try {
    for (;;) {
      let n = 0;
      while (n < buf.length) {
        const got = readSync(fd, buf, n, buf.length - n, null);
        if (got === 0) break;
        n += got;
      }
      if (n === 0) break;
      total += n;
      onPiece(n === buf.length ? buf : buf.subarray(0, n));
      if (n < buf.length) break;
    }
  } finally {
    closeSync(fd);
  }
  return total;
}
