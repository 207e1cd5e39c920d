// Buffered byte writer for the synthetic dump generator: bytes go into one reused 4 MiB block
// that is flushed with a single write call, so generating 500 MB costs a few hundred syscalls.

import { closeSync, openSync, writeSync } from 'node:fs';

const BLOCK = 4 << 20;
/** Room kept free so one change line (at most ~100 bytes here) never needs a bounds check. */
const SLACK = 512;

export class ByteWriter {
  readonly buf = new Uint8Array(BLOCK);
  pos = 0;
  written = 0;
  private fd: number;

  constructor(path: string) {
    this.fd = openSync(path, 'w');
  }

  /** Call once per line: flushes when the block is nearly full. */
  room(): void {
    if (this.pos > BLOCK - SLACK) this.flush();
  }

  ascii(text: string): void {
    for (let i = 0; i < text.length; i++) {
      if (this.pos >= BLOCK) this.flush();
      this.buf[this.pos++] = text.charCodeAt(i);
    }
  }

  bytes(b: Uint8Array): void {
    this.buf.set(b, this.pos);
    this.pos += b.length;
  }

  byte(c: number): void {
    this.buf[this.pos++] = c;
  }

  /** Non-negative integer up to 2^53 in decimal, without making a string. */
  uint(n: number): void {
    if (n < 10) {
      this.buf[this.pos++] = 48 + n;
      return;
    }
    let digits = 0;
    for (let m = n; m >= 1; m = Math.floor(m / 10)) digits++;
    let p = this.pos + digits;
    this.pos = p;
    for (let m = n; m >= 1; m = Math.floor(m / 10)) this.buf[--p] = 48 + (m % 10);
  }

  /** Total bytes handed to the writer so far (flushed or not). */
  get size(): number {
    return this.written + this.pos;
  }

  flush(): void {
    let off = 0;
    while (off < this.pos) off += writeSync(this.fd, this.buf, off, this.pos - off);
    this.written += this.pos;
    this.pos = 0;
  }

  close(): void {
    this.flush();
    closeSync(this.fd);
  }
}
