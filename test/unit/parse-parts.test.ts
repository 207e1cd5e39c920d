// A dump read in parts (src/parse/parts.ts: ranges cut at timestamp lines, each read on its own,
// then joined) must be the dump read in one piece: same arrays, same timestamps, same warnings
// with the file's own line numbers. Parts run in this thread here; the CLI runs them in worker
// threads (test/cli). What a part cannot decide alone must make the caller read in one piece.
import { describe, expect, it } from 'vitest';
import type { Dump } from '../../src/model/dump';
import { type PartHandle, PartReader, cutTargets, firstTimestampLine, joinParts, localPart } from '../../src/parse/parts';
import { VcdParser } from '../../src/parse/vcd';
import { contents, variedDump } from './varied-dump';

const encoder = new TextEncoder();

function whole(text: string): Dump {
  const p = new VcdParser('parts.vcd');
  p.push(encoder.encode(text));
  return p.finish();
}

/** Reads `text` in parts cut at the given offsets (each the `#` of a timestamp line). */
async function inParts(text: string, cuts: number[], shared = false): Promise<Dump | string> {
  const bytes = encoder.encode(text);
  const first = new VcdParser('parts.vcd');
  first.push(bytes.subarray(0, cuts[0]));
  const header = bytes.subarray(0, first.bodyStart);
  const others = cuts.map((cut, j): PartHandle => {
    const reader = new PartReader('parts.vcd', header, cut);
    const end = j + 1 < cuts.length ? cuts[j + 1] : bytes.length;
    try {
      // Odd-sized pieces, so ranges also split inside tokens.
      for (let at = cut; at < end; at += 777) reader.push(bytes.subarray(at, Math.min(end, at + 777)));
    } catch (err) {
      // As a worker thread reports it: the part's read fails.
      return { ...localPart(reader), read: () => Promise.reject(err) };
    }
    return localPart(reader);
  });
  return joinParts(first, others, bytes.length, shared);
}

/** Offsets of every timestamp line in the body. */
function timestampLines(text: string): number[] {
  const bytes = encoder.encode(text);
  const body = text.indexOf('$enddefinitions');
  const out: number[] = [];
  for (let at = firstTimestampLine(bytes, body); at >= 0; at = firstTimestampLine(bytes, at + 1)) out.push(at);
  return out;
}

describe('a dump read in parts is the dump read in one piece', () => {
  const text = variedDump('\n', false);
  const lines = timestampLines(text);

  it('finds timestamp lines only where a line starts with # and a digit', () => {
    const bytes = encoder.encode('ab\n#x\n #5\n#12\n');
    expect(firstTimestampLine(bytes, 0)).toBe(10);
    expect(cutTargets(100, 400, 4)).toEqual([175, 250, 325]);
    expect(lines.length).toBeGreaterThan(100);
  });

  it('in two parts, whichever timestamp line the cut is at (an equal tick on both sides included)', async () => {
    const expected = contents(whole(text));
    for (const cut of lines.slice(1)) expect(contents((await inParts(text, [cut])) as Dump)).toEqual(expected);
  });

  it('in three and five parts, on SharedArrayBuffers', async () => {
    const expected = contents(whole(text));
    const pick = (parts: number) => cutTargets(0, lines.length, parts).map((i) => lines[i]);
    for (const parts of [3, 5]) {
      const d = (await inParts(text, pick(parts), true)) as Dump;
      expect(d.signals[0].timeIndex.buffer).toBeInstanceOf(SharedArrayBuffer);
      expect(contents(d)).toEqual(expected);
    }
  });

  it('cut off in its last part: the same dropped step and warning, with the file line numbers', async () => {
    const cutOff = text.slice(0, text.length - 40);
    const expected = whole(cutOff);
    expect(expected.truncated).toBe(true);
    const got = (await inParts(cutOff, [lines[40], lines[90]])) as Dump;
    expect(contents(got)).toEqual(contents(expected));
    expect(got.warnings.map((w) => w.message)).toContain(expected.warnings[expected.warnings.length - 1].message);
  });
});

describe('what a part cannot decide alone sends the caller back to one piece', () => {
  it('$dumpoff and $dumpon', async () => {
    const text = variedDump('\n', true);
    const lines = timestampLines(text);
    expect(await inParts(text, [lines[100]])).toBe('the dump uses $dumpoff/$dumpon');
  });

  it('a cut inside a section (a comment with lines that start with #)', async () => {
    const head = '$timescale 1ns $end\n$var wire 1 ! a $end\n$enddefinitions $end\n';
    const text = `${head}#0\n0!\n$comment notes\n#5 is not a time here\n$end\n#10\n1!\n`;
    const cut = text.indexOf('#5');
    expect(await inParts(text, [cut])).toMatch(/^the first cut is not between two time steps \(the file ends inside the \$comment section/);
    // The part after such a cut fails on its own too; that alone also sends the caller back.
    const three = `${head}#0\n0!\n#3\n1!\n$comment notes\n#5 is not a time here\n$end\n#10\n1!\n`;
    expect(await inParts(three, [three.indexOf('#3'), three.indexOf('#5')])).toMatch(/^a part could not be read: .*unexpected 'is'/);
  });

  it('time going backwards across a cut', async () => {
    const head = '$timescale 1ns $end\n$var wire 1 ! a $end\n$enddefinitions $end\n';
    const text = `${head}#0\n0!\n#20\n1!\n#10\n0!\n`;
    expect(await inParts(text, [text.indexOf('#10')])).toBe('time goes backwards across a cut');
  });
});
