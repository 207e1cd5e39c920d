// What every exported workbook records so its numbers can be reproduced: the dump's name, size and
// SHA-256, its timescale, the settings of each measurement and the tool version.
// The hash uses WebCrypto (crypto.subtle), present in browsers and in Node 20, so this stays pure.

import type { Dump } from '../model/dump';
import type { Cell } from './sheet';

export interface Provenance {
  dumpName: string;
  dumpBytes: number;
  /** Hex SHA-256 of the dump file as stored (compressed bytes for a .gz). */
  dumpSha256: string;
  timescale: string;
  toolVersion: string;
  /** ISO 8601 time of the export. */
  created: string;
}

export async function sha256Hex(bytes: Uint8Array): Promise<string> {
  // Copy into a fresh ArrayBuffer so a view onto a shared or larger buffer hashes exactly its bytes.
  const digest = await crypto.subtle.digest('SHA-256', bytes.slice().buffer as ArrayBuffer);
  return [...new Uint8Array(digest)].map((b) => b.toString(16).padStart(2, '0')).join('');
}

export async function provenanceFor(dump: Dump, fileBytes: Uint8Array, toolVersion: string, created = new Date()): Promise<Provenance> {
  return {
    dumpName: dump.source,
    dumpBytes: fileBytes.length,
    dumpSha256: await sha256Hex(fileBytes),
    timescale: `${dump.timescale.magnitude} ${dump.timescale.unit}`,
    toolVersion,
    created: created.toISOString(),
  };
}

export function provenanceRows(p: Provenance): Array<[string, Cell]> {
  return [
    ['dump', p.dumpName],
    ['dump size (bytes)', p.dumpBytes],
    ['dump SHA-256', p.dumpSha256],
    ['timescale', p.timescale],
    ['tool', `midrail ${p.toolVersion}`],
    ['exported (UTC)', p.created],
  ];
}
