// A dump read by several threads at once, each from its own byte range of the file.
//
// The body is cut at timestamp lines (`#<digits>` at the start of a line), so every range but the
// first begins a time step. The first range is read by the coordinating thread's own parser,
// which also reads the header; every other range is read by a PartReader that reads the header
// bytes first (so it knows the identifier codes) and then its range. When all are read, the
// parts' counts give one layout (layout.ts) in which each part's changes of a signal follow the
// previous part's; every part then scatters its own change log into the shared arrays, all at
// once, and nothing is copied twice. Pure TypeScript: the transport to the threads (worker_threads
// in the CLI) is the caller's, behind PartHandle.
//
// Anything a part cannot decide alone makes the caller read the file in one piece instead, which
// then reports it exactly: an error in any part, a cut that fell inside a section (such as a
// $comment spanning lines that start with `#`), time going backwards across a cut, and
// $dumpoff/$dumpon (whose state would have to cross a cut).

import type { AssembledRest, DumpBuilder, PlacedText } from '../model/builder';
import type { Dump, DumpWarning } from '../model/dump';
import { type DumpArrays, type PartPlacement, type PartTotals, allocateArrays, allocateBuffer, planLayout } from '../model/layout';
import { VcdParser } from './vcd';

/** After a part has read its range. */
export interface PartRead {
  /** Line numbers its range spans (newlines in it). */
  lines: number;
  /** '' when the range ends cleanly between two time steps, else why not. */
  endState: string;
  sawDumpSwitch: boolean;
}

/** After a part has closed its input (see VcdParser.closeInput). */
export interface PartClosed {
  totals: PartTotals;
  truncated: boolean;
  /** Warnings from its range, with the file's line numbers and offsets. */
  warnings: DumpWarning[];
  endTick: number;
}

/** After a part has placed its changes. */
export interface PartPlaced {
  texts: PlacedText[];
  /** Its timestamps (transferable). */
  times: Float64Array;
}

/** A part being read somewhere (another thread, or this one in tests). */
export interface PartHandle {
  read(): Promise<PartRead>;
  /** `lineAtStart`: the file's line number where the part's range begins. */
  close(lineAtStart: number): Promise<PartClosed>;
  place(arrays: DumpArrays, placement: PartPlacement): Promise<PartPlaced>;
  dispose(): void;
}

const NEWLINE = new Uint8Array([10]);

/** Reads one range of a dump after its header; runs inside whichever thread the caller picks. */
export class PartReader {
  private readonly parser: VcdParser;
  private readonly rangeStartLine: number;
  private readonly headerBytes: number;
  private readonly warningsBefore: number;

  /** `header`: the file's bytes up to just past `$enddefinitions $end`; `start`: the range's offset. */
  constructor(
    source: string,
    header: Uint8Array,
    private readonly start: number,
  ) {
    this.parser = new VcdParser(source);
    this.parser.push(header);
    // The header's last token ends the bytes given; a newline keeps it apart from the range's first.
    this.parser.push(NEWLINE);
    if (this.parser.bodyStart < 0) throw new Error(`${source}: the header given to a part does not end with $enddefinitions $end`);
    this.headerBytes = header.length + 1;
    this.rangeStartLine = this.parser.lineNumber;
    this.warningsBefore = this.parser.builder.warnings.length;
  }

  push(chunk: Uint8Array): void {
    this.parser.push(chunk);
  }

  read(): PartRead {
    return { lines: this.parser.lineNumber - this.rangeStartLine, endState: this.parser.endState(), sawDumpSwitch: this.parser.sawDumpSwitch };
  }

  close(lineAtStart: number): PartClosed {
    const truncated = this.parser.closeInput(lineAtStart - this.rangeStartLine, this.start - this.headerBytes);
    const b = this.parser.builder;
    return { totals: b.partTotals(), truncated, warnings: b.warnings.slice(this.warningsBefore), endTick: b.endTick };
  }

  place(arrays: DumpArrays, placement: PartPlacement): PartPlaced {
    const b = this.parser.builder;
    // Timestamps first: their log goes before the scatter touches the arrays' pages.
    const times = new Float64Array(b.partTotals().timeCount);
    b.timesInto(times, 0, 0);
    const texts = b.scatterInto(arrays, placement);
    return { texts, times };
  }
}

/** What the reading thread asks of a part running elsewhere. */
export type PartRequest = { kind: 'close'; lineAtStart: number } | { kind: 'place'; arrays: DumpArrays; placement: PartPlacement };

/** What a part running elsewhere sends back: its answers in the order asked, progress, or failure. */
export type PartReply =
  | { kind: 'progress'; bytes: number }
  | { kind: 'read'; read: PartRead }
  | { kind: 'closed'; closed: PartClosed }
  | { kind: 'placed'; placed: PartPlaced }
  | { kind: 'error'; message: string };

/** A message channel to a part in another thread (a worker_threads Worker, a Web Worker). */
export interface PartPort {
  send(req: PartRequest): void;
  /** `onReply` gets every message; `onGone` once if the thread fails or stops. */
  listen(onReply: (reply: PartReply) => void, onGone: (why: string) => void): void;
  stop(): void;
}

/**
 * The part's side of the channel: reads its range with `feed` (which pushes into the reader and
 * may send progress), then answers close and place requests. Returns the request handler.
 */
export async function servePart(
  makeReader: () => Promise<PartReader>,
  send: (reply: PartReply, transfer?: ArrayBuffer[]) => void,
): Promise<(req: PartRequest) => void> {
  let reader: PartReader;
  try {
    reader = await makeReader();
    send({ kind: 'read', read: reader.read() });
  } catch (err) {
    send({ kind: 'error', message: (err as Error).message });
    return () => undefined;
  }
  return (req) => {
    try {
      if (req.kind === 'close') send({ kind: 'closed', closed: reader.close(req.lineAtStart) });
      else {
        const placed = reader.place(req.arrays, req.placement);
        send({ kind: 'placed', placed }, [placed.times.buffer as ArrayBuffer]);
      }
    } catch (err) {
      send({ kind: 'error', message: (err as Error).message });
    }
  };
}

/** The reading thread's side of a PartPort; `onProgress` gets the part's bytes read so far. */
export function portPart(port: PartPort, onProgress: (bytes: number) => void = () => undefined): PartHandle {
  const replies: PartReply[] = [];
  const waiting: Array<(r: PartReply) => void> = [];
  let gone: string | null = null;
  port.listen(
    (reply) => {
      if (reply.kind === 'progress') return onProgress(reply.bytes);
      const w = waiting.shift();
      if (w) w(reply);
      else replies.push(reply);
    },
    (why) => {
      gone ??= why;
      while (waiting.length) waiting.shift()!({ kind: 'error', message: why });
    },
  );
  const next = <K extends PartReply['kind']>(kind: K): Promise<Extract<PartReply, { kind: K }>> =>
    new Promise((resolve, reject) => {
      const take = (r: PartReply) => (r.kind === kind ? resolve(r as Extract<PartReply, { kind: K }>) : reject(new Error(r.kind === 'error' ? r.message : `unexpected ${r.kind}`)));
      const early = replies.shift();
      if (early) take(early);
      else if (gone !== null) reject(new Error(gone));
      else waiting.push(take);
    });
  return {
    read: async () => (await next('read')).read,
    close: async (lineAtStart) => {
      port.send({ kind: 'close', lineAtStart });
      return (await next('closed')).closed;
    },
    place: async (arrays, placement) => {
      port.send({ kind: 'place', arrays, placement });
      return (await next('placed')).placed;
    },
    dispose: () => port.stop(),
  };
}

/**
 * Threads to read a file of `size` bytes with, on `cores` cores: one per two cores, at most 4, so
 * the engine's own compiler and collector threads keep a core. On a 2-core machine two reading
 * threads measured 0.9–1.1× one thread on 50–100 MB and 0.95–1.4× on 500 MB, with more memory
 * (npm run bench, section parse), so 2 and 3 cores read in one piece. Files below
 * PARTS_FROM_BYTES are always read in one piece.
 */
export function readingThreads(size: number, cores: number): number {
  if (size < PARTS_FROM_BYTES) return 1;
  return Math.max(1, Math.min(MAX_READING_THREADS, Math.floor(cores / 2)));
}

/** Files smaller than this are read in one piece: starting threads would cost more than it saves. */
export const PARTS_FROM_BYTES = 32 * 1024 * 1024;
export const MAX_READING_THREADS = 4;
/** Bytes searched for a timestamp line after each cut's target. */
export const CUT_WINDOW = 1024 * 1024;

/** A PartReader in this thread (tests; hosts without threads). */
export function localPart(reader: PartReader): PartHandle {
  return {
    read: async () => reader.read(),
    close: async (line) => reader.close(line),
    place: async (arrays, placement) => reader.place(arrays, placement),
    dispose: () => undefined,
  };
}

/** Offset of the first `#<digit>` that begins a line in bytes[from..], or -1. */
export function firstTimestampLine(bytes: Uint8Array, from: number): number {
  for (let i = Math.max(from, 1); i + 1 < bytes.length; i++) {
    if (bytes[i] === 35 && bytes[i - 1] === 10) {
      const d = bytes[i + 1] - 48;
      if (d >= 0 && d <= 9) return i;
    }
  }
  return -1;
}

/** Where to look for the cuts that split a body [bodyStart, size) into `parts` ranges of about equal size. */
export function cutTargets(bodyStart: number, size: number, parts: number): number[] {
  const out: number[] = [];
  for (let j = 1; j < parts; j++) out.push(Math.floor(bodyStart + ((size - bodyStart) * j) / parts));
  return out;
}

/** A dump file to read in parts, and how to reach its bytes and start its parts. */
export interface PartsSource {
  source: string;
  size: number;
  /** The file's next bytes from its start, at most `max` (empty only at the end); valid until the next call. */
  next(max: number): Promise<Uint8Array>;
  /** Bytes [offset, offset + length) to look for a cut in; fewer only at the end of the file. */
  window(offset: number, length: number): Promise<Uint8Array>;
  /** Starts a part that reads the header (its first `headerEnd` bytes) and then [start, end). */
  spawn(job: { headerEnd: number; start: number; end: number }): PartHandle;
  /** Told the bytes this thread has read so far, between pieces. */
  progress?(bytes: number): void | Promise<void>;
  /** Asked between pieces; true stops the read (it then returns 'stopped'). */
  stopped?(): boolean;
}

/**
 * Reads `src` in up to `parts` parts: this thread reads the header and the first range, `spawn`ed
 * parts the others. Errors in the first range (read here, with exact line numbers) are thrown;
 * anything that stops a join is returned as the reason to read the file in one piece.
 */
export async function readInParts(src: PartsSource, parts: number, piece: number): Promise<Dump | string> {
  const first = new VcdParser(src.source, {}, { shared: true });
  const handles: PartHandle[] = [];
  try {
    let at = 0;
    while (first.bodyStart < 0 && at < src.size) {
      const bytes = await src.next(piece);
      if (bytes.length === 0) break;
      first.push(bytes);
      at += bytes.length;
    }
    if (first.bodyStart < 0) return 'no end of the header found';
    const cuts: number[] = [];
    for (const target of cutTargets(first.bodyStart, src.size, parts)) {
      const from = Math.max(target, at, cuts.length ? cuts[cuts.length - 1] + 1 : 0) - 1;
      const found = firstTimestampLine(await src.window(from, CUT_WINDOW), 1);
      if (found >= 0) cuts.push(from + found);
    }
    if (cuts.length === 0) return 'no timestamp line to cut at';
    for (let j = 0; j < cuts.length; j++) handles.push(src.spawn({ headerEnd: first.bodyStart, start: cuts[j], end: j + 1 < cuts.length ? cuts[j + 1] : src.size }));
    // The first range, read here while the parts read theirs.
    while (at < cuts[0]) {
      if (src.stopped?.()) return 'stopped';
      const bytes = await src.next(Math.min(piece, cuts[0] - at));
      if (bytes.length === 0) break;
      first.push(bytes);
      at += bytes.length;
      await src.progress?.(at);
    }
    const joined = await joinParts(first, handles, src.size, true);
    return src.stopped?.() ? 'stopped' : joined;
  } finally {
    for (const h of handles) h.dispose();
  }
}

/**
 * Joins the parts of a dump: `first` has read the header and the first range (up to the first
 * cut), `others` the rest in file order. Returns the Dump, or why the file must be read in one
 * piece instead. `shared` puts the arrays on SharedArrayBuffers (the parts write them at once,
 * so the caller must pass true whenever another thread places changes).
 */
export async function joinParts(first: VcdParser, others: PartHandle[], bytes: number, shared: boolean): Promise<Dump | string> {
  try {
    return await join(first, others, bytes, shared);
  } catch (err) {
    // A part that failed (bad input, a cut in a bad place) is read again in one piece, which
    // reports a real error with its exact place.
    return `a part could not be read: ${(err as Error).message}`;
  }
}

async function join(first: VcdParser, others: PartHandle[], bytes: number, shared: boolean): Promise<Dump | string> {
  const firstEnd = first.endState();
  if (firstEnd !== '') return `the first cut is not between two time steps (${firstEnd})`;
  if (first.sawDumpSwitch) return 'the dump uses $dumpoff/$dumpon';
  const reads = await Promise.all(others.map((p) => p.read()));
  for (let j = 0; j < reads.length; j++) {
    if (reads[j].sawDumpSwitch) return 'the dump uses $dumpoff/$dumpon';
    if (j < reads.length - 1 && reads[j].endState !== '') return `a cut is not between two time steps (${reads[j].endState})`;
  }
  // Line numbers follow from the parts before; the first part's parser has counted its own.
  const lineAt: number[] = [];
  let line = first.lineNumber;
  for (const r of reads) {
    lineAt.push(line);
    line += r.lines;
  }
  const firstTruncated = first.closeInput();
  const closed = await Promise.all(others.map((p, j) => p.close(lineAt[j])));
  const b: DumpBuilder = first.builder;
  const totals = [b.partTotals(), ...closed.map((c) => c.totals)];
  let lastTick = totals[0].timeCount > 0 ? totals[0].lastTick : Number.NEGATIVE_INFINITY;
  for (const t of totals.slice(1)) {
    if (t.timeCount > 0 && t.firstTick < lastTick) return 'time goes backwards across a cut';
    if (t.timeCount > 0) lastTick = t.lastTick;
  }
  const layout = planLayout(b.kindCodes, b.planeWords, b.signalCount, totals);
  const arrays = allocateArrays(layout, shared);
  // Every part places its changes at once; the first in this thread meanwhile.
  const placing = Promise.all(others.map((p, j) => p.place(arrays, layout.parts[j + 1])));
  const times = new Float64Array(allocateBuffer(layout.timeCount * 8, shared));
  b.timesInto(times, 0, 0);
  const texts = b.scatterInto(arrays, layout.parts[0]);
  const placed = await placing;
  placed.forEach((p, j) => {
    const place = layout.parts[j + 1];
    times.set(p.times.subarray(place.timeFrom), place.stepBase + place.timeFrom);
    for (const t of p.texts) texts.push(t);
  });
  const last = closed[closed.length - 1];
  const rest: AssembledRest = {
    changes: layout.regions.written.reduce((a, c) => a + c, 0),
    bytes,
    truncated: last ? last.truncated : firstTruncated,
    endTick: last ? last.endTick : b.endTick,
    warnings: [...b.warnings, ...closed.flatMap((c) => c.warnings)],
    dumpOff: [],
  };
  return b.assemble(layout, arrays, texts, times, rest);
}
