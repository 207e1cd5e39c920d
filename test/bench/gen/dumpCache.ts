// Synthetic dumps live in os.tmpdir()/midrail-bench and are reused while a file of the same
// size, net count and generator version exists with its finished metadata beside it.
// They are never written into the repository.

import { closeSync, existsSync, mkdirSync, openSync, readFileSync, readSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { SYNTH_VERSION, type SynthMeta, generateSynthVcd } from './synthVcd';

export const CACHE_DIR = join(tmpdir(), 'midrail-bench');

export interface SynthDump {
  path: string;
  meta: SynthMeta;
  /** True when this run wrote the file. */
  fresh: boolean;
}

function ensureDir(): void {
  mkdirSync(CACHE_DIR, { recursive: true });
}

export function synthDump(nets: number, megabytes: number): SynthDump {
  ensureDir();
  const base = `synth-v${SYNTH_VERSION}-n${nets}-${megabytes}mb`;
  const path = join(CACHE_DIR, `${base}.vcd`);
  const metaPath = join(CACHE_DIR, `${base}.json`);
  if (existsSync(path) && existsSync(metaPath)) {
    return { path, meta: JSON.parse(readFileSync(metaPath, 'utf8')) as SynthMeta, fresh: false };
  }
  rmSync(metaPath, { force: true }); // written last, so a half-written dump is never reused
  const meta = generateSynthVcd(path, { nets, targetBytes: megabytes * 1e6, seed: 0x5eed + nets + megabytes });
  writeFileSync(metaPath, JSON.stringify(meta, null, 2));
  return { path, meta, fresh: true };
}

/**
 * The start of a dump cut to about `bytes`: the whole header and every complete timestamp
 * that fits, ending just before a `#` line, so it is a valid dump on its own.
 */
export function sliceDump(source: SynthDump, bytes: number): { path: string; bytes: number } {
  ensureDir();
  const path = join(CACHE_DIR, `slice-${Math.round(bytes / 1e3)}kb-of-${source.path.split('/').pop()}`);
  if (existsSync(path)) return { path, bytes: readFileSync(path).length };
  const buf = new Uint8Array(bytes);
  const fd = openSync(source.path, 'r');
  const n = readSync(fd, buf, 0, bytes, 0);
  closeSync(fd);
  let end = n;
  while (end > 1 && !(buf[end - 1] === 35 && buf[end - 2] === 10)) end--; // find "\n#"
  const cut = buf.subarray(0, end - 1);
  writeFileSync(path, cut);
  return { path, bytes: cut.length };
}

export function cleanCache(): void {
  rmSync(CACHE_DIR, { recursive: true, force: true });
}
