// Reads a dump file from disk in 16 MiB pieces through the streaming parser, gunzipping
// `.vcd.gz` (recognised by its magic bytes, whatever the name).

import { createReadStream } from 'node:fs';
import { open, stat } from 'node:fs/promises';
import { basename } from 'node:path';
import { createGunzip } from 'node:zlib';
import type { Dump } from '../model/dump';
import { VcdParser } from '../parse/vcd';
import { UsageError } from './run';

export interface ReadDumpOptions {
  /** Measure the complete part of a cut-off dump (with a warning) instead of failing. */
  allowTruncated?: boolean;
  /** Where warnings go; stderr by default. */
  warn?: (message: string) => void;
}

const PIECE = 16 * 1024 * 1024;

export async function isGzip(path: string): Promise<boolean> {
  const fh = await open(path, 'r');
  try {
    const head = Buffer.alloc(2);
    const { bytesRead } = await fh.read(head, 0, 2, 0);
    return bytesRead === 2 && head[0] === 0x1f && head[1] === 0x8b;
  } finally {
    await fh.close();
  }
}

export async function readDumpFile(path: string, options: ReadDumpOptions = {}): Promise<Dump> {
  try {
    const st = await stat(path);
    if (!st.isFile()) throw new UsageError(`cannot read dump '${path}': not a file`);
  } catch (err) {
    if (err instanceof UsageError) throw err;
    throw new UsageError(`cannot read dump '${path}': ${(err as NodeJS.ErrnoException).code === 'ENOENT' ? 'no such file' : (err as Error).message}`);
  }
  const parser = new VcdParser(basename(path));
  const gz = await isGzip(path);
  const raw = createReadStream(path, { highWaterMark: PIECE });
  const stream = gz ? raw.pipe(createGunzip({ chunkSize: 1024 * 1024 })) : raw;
  try {
    for await (const piece of stream as AsyncIterable<Buffer>) {
      parser.push(new Uint8Array(piece.buffer, piece.byteOffset, piece.byteLength));
    }
  } catch (err) {
    raw.destroy();
    const e = err as NodeJS.ErrnoException;
    if (gz && e.code?.startsWith('Z_')) throw new UsageError(`${path}: the gzip data is damaged after ${parser.bytesRead} bytes of VCD (${e.message})`);
    throw err;
  }
  return finishDump(parser, options);
}

/** Ends a parse fed by any reader: refuses a cut-off dump unless allowed, and passes the warnings on. */
export function finishDump(parser: VcdParser, options: ReadDumpOptions = {}): Dump {
  const warn = options.warn ?? ((m: string) => process.stderr.write(`midrail: warning: ${m}\n`));
  const dump = parser.finish();
  if (dump.truncated) {
    const cut = dump.warnings[dump.warnings.length - 1]?.message ?? 'the dump is cut off';
    if (!options.allowTruncated) {
      throw new UsageError(`${dump.source}: ${cut}. A regression must not pass on part of a dump; rerun with --allow-truncated to measure the complete part`);
    }
  }
  for (const w of dump.warnings) warn(`${dump.source}: line ${w.line}: ${w.message}`);
  return dump;
}
