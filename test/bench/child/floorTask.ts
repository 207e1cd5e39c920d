// The floor: a plain newline count over the same bytes, read in the same 16 MiB pieces.
// A parser must look at every byte too, so this is the speed no JS tokenizer can beat.

import { forEachPiece, pieceBuffer } from './chunks';

export interface FloorResult {
  bytes: number;
  lines: number;
  ms: number;
}

function countNewlines(piece: Uint8Array): number {
  let n = 0;
  const len = piece.length;
  for (let i = 0; i < len; i++) if (piece[i] === 10) n++;
  return n;
}

export function runFloor(path: string): FloorResult {
  const buf = pieceBuffer();
  let lines = 0;
  const t0 = performance.now();
  const bytes = forEachPiece(path, buf, (piece) => {
    lines += countNewlines(piece);
  });
  return { bytes, lines, ms: performance.now() - t0 };
}
