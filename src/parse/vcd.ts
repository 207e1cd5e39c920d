// Streaming four-state VCD parser (IEEE 1364-2005 clause 18).
// Input arrives as byte chunks split anywhere. A tokenizer finds whitespace-separated tokens
// (§18.2.1: line breaks carry no meaning) and hands each one to a small state machine. Only a
// token that straddles two chunks is copied; everything else is read in place. Pure TypeScript
// with no DOM or Node APIs, so the same code runs in a Web Worker and in the CLI.

import { DumpBuilder } from '../model/builder';
import { type Dump, LOGIC_CHARS, Logic, wordsFor } from '../model/dump';
import { CodeTable } from './codes';
import { DEFAULT_LIMITS, VcdError, type VcdLimits } from './errors';
import { readTimescale, readVar, signalKindFor } from './header';

const enum Mode {
  /** Between declaration commands. */
  Header,
  /** Collecting the tokens of a declaration command until $end. */
  Command,
  /** Simulation commands and value changes. */
  Body,
}

/** Scalar value characters → Logic code (-1 = not a value character). */
const SCALAR = new Int8Array(256).fill(-1);
SCALAR[48] = Logic.L0; // 0
SCALAR[49] = Logic.L1; // 1
SCALAR[120] = SCALAR[88] = Logic.X; // x X
SCALAR[122] = SCALAR[90] = Logic.Z; // z Z
SCALAR[117] = SCALAR[85] = Logic.U; // u U
SCALAR[119] = SCALAR[87] = Logic.W; // w W
SCALAR[108] = SCALAR[76] = Logic.WeakL; // l L
SCALAR[104] = SCALAR[72] = Logic.WeakH; // h H
SCALAR[45] = Logic.DontCare; // -

const MAX_EXACT_TICK = 2 ** 53;
/** The hot loop starts no token closer than this to a chunk's end (see bodyRun). */
const RUN_MARGIN = 64;
const TEXT = new TextDecoder('utf-8');

/** What the hot loop may store for a signal by itself. */
const enum HotKind {
  Other,
  /** 1-bit nets and events: Logic codes. */
  Logic,
  /** Vectors of up to 32 bits. */
  NarrowVector,
  Real,
}

/** Body keywords, compared as bytes after the `$`. */
const enum BodyBlock {
  None,
  DumpVars,
  DumpAll,
  DumpOn,
  DumpOff,
  Comment,
  Unknown,
}

export class VcdParser {
  private readonly b: DumpBuilder;
  private readonly codes = new CodeTable();
  private readonly limits: VcdLimits;
  private mode = Mode.Header;

  // Position bookkeeping.
  private base = 0; // bytes consumed before the current chunk
  private line = 1;
  private lineStart = 0; // absolute offset of the current line's first byte
  private tokenLine = 1;
  private tokenOffset = 0;

  // A token cut by a chunk boundary.
  private carry = new Uint8Array(256);
  private carryLen = 0;
  private carryOffset = 0;
  private carryLine = 1;

  // Header state.
  private command = '';
  private commandTokens: string[] = [];
  private commandLine = 1;
  private commandOffset = 0;
  private scopeStack: number[] = [];
  private sawTimescale = false;

  // Body state.
  private block = BodyBlock.None;
  private blockLine = 0;
  private sawTime = false;
  private lastTimeLine = 0;
  private dumpOffStart = -1;
  private dumpOffMarks: Uint32Array | null = null;
  /** A vector/real/string value waiting for its identifier code: 'b', 'r' or 's'. */
  private pendingKind = 0;
  private pendingDigits = new Uint8Array(64);
  private pendingLen = 0;
  private pendingText = '';
  private pendingReal = 0;
  private pendingLine = 0;
  private pendingOffset = 0;
  private valuePlane = new Uint32Array(4);
  /** Per signal, what the hot loop may store without asking the builder (see HotKind), and widths. */
  private hotKinds = new Uint8Array(64);
  private hotWidths = new Int32Array(64);
  private unknownPlane = new Uint32Array(4);
  /** Second result of packWord, and whether it met states beyond 0/1/x/z. */
  private packUnknown = 0;
  private packExotic = false;

  /**
   * `storage.shared` puts the finished arrays on SharedArrayBuffers; `storage.slabShift` sets the
   * change-log slab size (tests only; see DumpBuilder).
   */
  constructor(
    readonly source: string,
    limits: Partial<VcdLimits> = {},
    storage: { shared?: boolean; slabShift?: number } = {},
  ) {
    this.b = new DumpBuilder(source, storage);
    this.limits = { ...DEFAULT_LIMITS, ...limits };
  }

  /** Bytes consumed so far. */
  get bytesRead(): number {
    return this.base;
  }

  /** Byte offset just past `$enddefinitions $end`, once the header is read (else -1). */
  bodyStart = -1;
  private headerWarnings = 0;
  /** Whether $dumpoff or $dumpon appeared (a dump read in parts must not carry that state across). */
  sawDumpSwitch = false;

  /** Line the next byte is on. */
  get lineNumber(): number {
    return this.line;
  }

  /** The builder holding what has been read (for a dump read in parts; see parts.ts). */
  get builder(): DumpBuilder {
    return this.b;
  }

  private fail(problem: string, expected: string, line = this.tokenLine, offset = this.tokenOffset): never {
    throw new VcdError(this.source, line, offset, problem, expected);
  }

  push(chunk: Uint8Array): void {
    const n = chunk.length;
    let i = 0;
    if (this.carryLen > 0) {
      while (i < n && chunk[i] > 32) i++;
      this.appendCarry(chunk, 0, i);
      if (i === n) {
        this.base += n;
        return;
      }
      this.tokenLine = this.carryLine;
      this.tokenOffset = this.carryOffset;
      const len = this.carryLen;
      this.carryLen = 0;
      this.token(this.carry, 0, len);
    }
    const base = this.base;
    const maxLine = this.limits.maxLineBytes;
    const runEnd = n - RUN_MARGIN;
    while (i < n) {
      // Most of a dump is plain value changes and timestamps: a tight loop takes those, and
      // this general path takes one token at a time wherever that loop stops.
      if (i < runEnd && this.mode === Mode.Body && this.pendingKind === 0 && this.block < BodyBlock.Comment) {
        i = this.bodyRun(chunk, i, n, runEnd);
        if (i >= n) break;
      }
      let c = chunk[i];
      // Skip whitespace, counting lines.
      while (c <= 32) {
        if (c === 10) {
          this.line++;
          this.lineStart = base + i + 1;
        } else if (c !== 32 && c !== 13 && c !== 9 && c !== 11 && c !== 12) {
          this.tokenLine = this.line;
          this.tokenOffset = base + i;
          this.fail(`unexpected byte 0x${c.toString(16).padStart(2, '0')} (binary data?)`, 'VCD text');
        }
        if (++i === n) break;
        c = chunk[i];
      }
      if (i === n) break;
      const start = i;
      while (i < n && chunk[i] > 32) i++;
      this.tokenLine = this.line;
      this.tokenOffset = base + start;
      if (base + i - this.lineStart > maxLine) {
        this.fail(`line is longer than ${maxLine} bytes`, 'shorter lines (is this a VCD file?)');
      }
      if (i === n) {
        this.carryLen = 0;
        this.carryOffset = base + start;
        this.carryLine = this.line;
        this.appendCarry(chunk, start, n);
        break;
      }
      this.token(chunk, start, i);
    }
    this.base += n;
  }

  /**
   * The hot loop: whitespace, scalar changes of 1-bit nets, `b<digits> <code>`, `r<number> <code>`
   * and timestamps, with line bookkeeping in locals. It returns where it stopped: at `runEnd`, or
   * at the first token it does not take (keywords, errors, anything unusual), which the general
   * path then reads and reports exactly as it always has. Tokens are only started before
   * `runEnd`, so short ones need no bounds checks; long ones are checked against `n`.
   */
  private bodyRun(p: Uint8Array, i: number, n: number, runEnd: number): number {
    const base = this.base;
    const maxLine = this.limits.maxLineBytes;
    const one = this.codes.one;
    const two = this.codes.two;
    const hotKinds = this.hotKinds;
    const hotWidths = this.hotWidths;
    const b = this.b;
    let line = this.line;
    let lineStart = this.lineStart;
    while (i < runEnd) {
      const c = p[i];
      if (c <= 32) {
        if (c === 10) {
          line++;
          lineStart = base + i + 1;
        } else if (c !== 32 && c !== 13 && c !== 9) break;
        i++;
        continue;
      }
      if (base + i - lineStart > maxLine - RUN_MARGIN) break;
      const code = SCALAR[c];
      if (code >= 0) {
        // `0!`: the identifier code runs to the next whitespace.
        const a = p[i + 1];
        if (a <= 32) break;
        const a2 = p[i + 2];
        let sig: number;
        let e: number;
        if (a2 <= 32) {
          sig = one[a];
          e = i + 2;
        } else if (p[i + 3] <= 32) {
          sig = two[(a << 8) | a2];
          e = i + 3;
        } else {
          e = i + 3;
          while (e < n && p[e] > 32) e++;
          if (e >= n) break;
          sig = this.codes.lookup(p, i + 1, e);
        }
        if (sig < 0 || hotKinds[sig] !== HotKind.Logic) break;
        b.pushLogic(sig, code);
        i = e;
        continue;
      }
      if (c === 35) {
        // `#<digits>`; anything odd (too long, not digits, backwards, inside a section) is left
        // to the general path, which reports it.
        let t = 0;
        let e = i + 1;
        let d = p[e] - 48;
        if (d < 0 || d > 9) break;
        do {
          t = t * 10 + d;
          d = p[++e] - 48;
        } while (d >= 0 && d <= 9 && e - i < 16);
        if (p[e] > 32 || (this.sawTime && t < b.currentTick) || (this.block !== BodyBlock.None && this.block !== BodyBlock.DumpOff)) break;
        this.sawTime = true;
        this.lastTimeLine = line;
        b.setTime(t);
        i = e;
        continue;
      }
      if (c === 98 || c === 66 || c === 114 || c === 82) {
        // `b1010 <code>` or `r1.5 <code>`: value, one space, code, all inside this chunk. Binary
        // digits are packed while they are scanned; `plain` stays true while they are all 0 or 1.
        let de = i + 1;
        let v = 0;
        let plain = true;
        for (; de < n; de++) {
          const d = p[de] - 48;
          // One unsigned compare takes both 0 and 1; whitespace (≤ 32) ends the value.
          if (d >>> 0 < 2) v = (v << 1) | d;
          else if (d <= -16) break;
          else plain = false;
        }
        if (de + 1 >= n || p[de] !== 32 || p[de + 1] <= 32 || de === i + 1) break;
        let ce = de + 1;
        while (ce < n && p[ce] > 32) ce++;
        if (ce >= n || base + ce - lineStart > maxLine) break;
        if (plain && (c === 98 || c === 66)) {
          // A vector of up to 32 bits written in 0s and 1s: left-extension is with 0 (Table 18-1),
          // so the packed digits are the value and nothing is unknown.
          const sig = ce - de === 2 ? one[p[de + 1]] : ce - de === 3 ? two[(p[de + 1] << 8) | p[de + 2]] : this.codes.lookup(p, de + 1, ce);
          if (sig >= 0 && hotKinds[sig] === HotKind.NarrowVector && de - i - 1 <= hotWidths[sig]) {
            b.pushVectorWord(sig, v >>> 0, 0, null);
            i = ce;
            continue;
          }
        }
        this.pendingLine = this.tokenLine = line;
        this.pendingOffset = base + i;
        this.tokenOffset = base + de + 1;
        if (c === 98 || c === 66) {
          this.vectorChange(p, i + 1, de, de + 1, ce);
        } else {
          const sig = this.codes.lookup(p, de + 1, ce);
          const real = sig >= 0 && hotKinds[sig] === HotKind.Real ? decimalReal(p, i + 1, de) : null;
          if (real === null) break;
          b.pushReal(sig, real);
        }
        i = ce;
        continue;
      }
      break;
    }
    this.line = line;
    this.lineStart = lineStart;
    return i;
  }

  private appendCarry(buf: Uint8Array, s: number, e: number): void {
    const need = this.carryLen + (e - s);
    if (need > this.limits.maxLineBytes) {
      this.fail(`line is longer than ${this.limits.maxLineBytes} bytes`, 'shorter lines (is this a VCD file?)', this.carryLine, this.carryOffset);
    }
    if (need > this.carry.length) {
      const grown = new Uint8Array(Math.max(need, this.carry.length * 2));
      grown.set(this.carry.subarray(0, this.carryLen));
      this.carry = grown;
    }
    this.carry.set(buf.subarray(s, e), this.carryLen);
    this.carryLen = need;
  }

  private token(buf: Uint8Array, s: number, e: number): void {
    if (this.mode === Mode.Body) this.bodyToken(buf, s, e);
    else this.headerToken(tokenText(buf, s, e));
  }

  // ---- Declarations (§18.2.3) ----

  private headerToken(tok: string): void {
    if (this.mode === Mode.Command) {
      if (tok === '$end') this.endCommand();
      else this.commandTokens.push(tok);
      return;
    }
    if (tok[0] === '#') this.fail(`timestamp '${tok}' before $enddefinitions`, '$enddefinitions $end to close the declarations');
    if (tok[0] !== '$') this.fail(`'${clip(tok)}' outside a declaration command`, 'a declaration keyword such as $scope, $var, $upscope or $enddefinitions');
    this.mode = Mode.Command;
    this.command = tok;
    this.commandTokens = [];
    this.commandLine = this.tokenLine;
    this.commandOffset = this.tokenOffset;
  }

  private endCommand(): void {
    const t = this.commandTokens;
    const at = (problem: string, expected: string): never => this.fail(problem, expected, this.commandLine, this.commandOffset);
    const b = this.b;
    this.mode = Mode.Header;
    switch (this.command) {
      case '$date':
        b.date = t.join(' ');
        break;
      case '$version':
        b.version = t.join(' ');
        break;
      case '$comment':
        break;
      case '$timescale': {
        const r = readTimescale(t);
        if (!r) at(`cannot read $timescale '${t.join(' ')}'`, 'a number (1, 10 or 100) and a unit s, ms, us, ns, ps or fs');
        else {
          b.timescale = r.timescale;
          this.sawTimescale = true;
          if (r.nonStandard) b.warn(this.commandLine, this.commandOffset, `$timescale number ${r.timescale.magnitude} is not 1, 10 or 100 (IEEE 1364 §18.2.3.5); used as written`);
        }
        break;
      }
      case '$scope': {
        if (t.length === 0) at('$scope without a name', '$scope <kind> <name> $end');
        const kind = t.length > 1 ? t[0] : 'module';
        const name = t.length > 1 ? t.slice(1).join(' ') : t[0];
        const parent = this.scopeStack.length ? this.scopeStack[this.scopeStack.length - 1] : -1;
        this.scopeStack.push(b.addScope(name, kind, parent));
        break;
      }
      case '$upscope':
        if (this.scopeStack.length === 0) at('$upscope without an open $scope', 'a matching $scope before it');
        this.scopeStack.pop();
        break;
      case '$var':
        this.declareVar(t, at);
        break;
      case '$enddefinitions':
        this.mode = Mode.Body;
        this.bodyStart = this.tokenOffset + 4;
        this.headerWarnings = b.warnings.length;
        if (!this.sawTimescale) b.warn(this.commandLine, this.commandOffset, 'no $timescale in the header; 1 s per tick assumed');
        if (this.scopeStack.length > 0) b.warn(this.commandLine, this.commandOffset, `${this.scopeStack.length} $scope(s) not closed by $upscope`);
        break;
      default:
        b.warn(this.commandLine, this.commandOffset, `unknown declaration command ${this.command} skipped`);
    }
  }

  private declareVar(t: string[], at: (problem: string, expected: string) => never): void {
    const d = readVar(t);
    if (typeof d === 'string') return at(d, '$var <type> <size> <code> <name> [range] $end');
    if (d.code.length > this.limits.maxCodeBytes) at(`identifier code is ${d.code.length} characters long, over the limit of ${this.limits.maxCodeBytes}`, 'a shorter identifier code');
    if (d.width < 1) at(`$var '${d.name}' has size 0`, 'a size of at least 1');
    if (d.width > this.limits.maxVectorWidth) at(`$var '${d.name}' is ${d.width} bits wide, over the limit of ${this.limits.maxVectorWidth}`, 'a narrower vector');
    if (this.b.nets.length >= this.limits.maxNets) at(`more than ${this.limits.maxNets} $var declarations`, `at most ${this.limits.maxNets} nets`);
    const kind = signalKindFor(d);
    let signal = this.codes.get(d.code);
    if (signal >= 0) {
      const prior = this.b.signal(signal);
      if (prior.width !== d.width || prior.kind !== kind) {
        at(`identifier code '${d.code}' is declared again as ${kind} of ${d.width} bit(s), first as ${prior.kind} of ${prior.width}`, 'aliases with the same size and type');
      }
    } else {
      signal = this.b.addSignal(kind, d.width);
      if (signal >= this.hotKinds.length) {
        const kinds = new Uint8Array(this.hotKinds.length * 2);
        kinds.set(this.hotKinds);
        this.hotKinds = kinds;
        const widths = new Int32Array(this.hotWidths.length * 2);
        widths.set(this.hotWidths);
        this.hotWidths = widths;
      }
      this.hotKinds[signal] =
        kind === 'logic' || kind === 'event' ? HotKind.Logic : kind === 'real' ? HotKind.Real : kind === 'vector' && d.width <= 32 ? HotKind.NarrowVector : HotKind.Other;
      this.hotWidths[signal] = d.width;
      if (!this.codes.set(d.code, signal)) at(`identifier code '${d.code}' has characters outside printable ASCII 33..126`, 'an identifier code of printable characters (§18.2.1)');
    }
    if (d.ranged && Math.abs(d.msb - d.lsb) + 1 !== d.width && kind !== 'real') {
      this.b.warn(this.commandLine, this.commandOffset, `$var '${d.name}' declares size ${d.width} but range [${d.msb}:${d.lsb}]`);
    }
    const scope = this.scopeStack.length ? this.scopeStack[this.scopeStack.length - 1] : -1;
    const scopePath = scope >= 0 ? this.b.scopes[scope].path : '';
    this.b.addNet({
      path: scopePath ? `${scopePath}.${d.name}` : d.name,
      name: d.name,
      type: d.type,
      width: d.width,
      msb: d.msb,
      lsb: d.lsb,
      ranged: d.ranged,
      scope,
      signal,
      code: d.code,
    });
  }

  // ---- Simulation commands and value changes (§18.2.1, §18.2.2, §18.2.3.9–12) ----

  private bodyToken(buf: Uint8Array, s: number, e: number): void {
    if (this.pendingKind !== 0) return this.finishPending(buf, s, e);
    const c = buf[s];
    const code = SCALAR[c];
    if (code >= 0 && e - s > 1) {
      if (this.block === BodyBlock.Comment || this.block === BodyBlock.Unknown) return;
      const sig = this.codes.lookup(buf, s + 1, e);
      if (sig < 0) return this.unknownCode(buf, s + 1, e);
      const kind = this.b.signal(sig).kind;
      if (kind === 'logic' || kind === 'event') this.b.pushLogic(sig, code);
      else if (kind === 'vector') {
        this.notePending();
        this.pushVectorDigits(sig, buf, s, s + 1);
      }
      else this.fail(`scalar value for ${kind} net '${this.nameOf(sig)}'`, kind === 'real' ? 'r<number> <code>' : 's<text> <code>');
      return;
    }
    switch (c) {
      case 35: // '#'
        if (this.block === BodyBlock.Comment || this.block === BodyBlock.Unknown) return;
        return this.timestamp(buf, s, e);
      case 98: // 'b'
      case 66: // 'B'
        if (this.block === BodyBlock.Comment || this.block === BodyBlock.Unknown) return;
        return this.startVector(buf, s, e);
      case 114: // 'r'
      case 82: // 'R'
        if (this.block === BodyBlock.Comment || this.block === BodyBlock.Unknown) return;
        return this.startReal(buf, s, e);
      case 115: // 's'
      case 83: // 'S'
        if (this.block === BodyBlock.Comment || this.block === BodyBlock.Unknown) return;
        this.pendingKind = 115;
        this.pendingText = TEXT.decode(buf.subarray(s + 1, e));
        this.notePending();
        return;
      case 36: // '$'
        return this.keyword(TEXT.decode(buf.subarray(s, e)));
      default:
        if (this.block === BodyBlock.Comment || this.block === BodyBlock.Unknown) return;
        if (code >= 0) this.fail(`value '${String.fromCharCode(c)}' without an identifier code`, 'the code right after the value, with no space (§18.2.1)');
        this.fail(describeJunk(buf, s, e), 'a timestamp (#n), a value change (0!, b1010 %, r1.5 %) or a simulation keyword');
    }
  }

  private notePending(): void {
    this.pendingLine = this.tokenLine;
    this.pendingOffset = this.tokenOffset;
  }

  private keyword(kw: string): void {
    if (this.block === BodyBlock.Comment || this.block === BodyBlock.Unknown) {
      if (kw === '$end') this.block = BodyBlock.None;
      return;
    }
    switch (kw) {
      case '$end':
        if (this.block === BodyBlock.DumpOff) this.closeDumpOff();
        this.block = BodyBlock.None;
        return;
      case '$dumpvars':
        return this.open(BodyBlock.DumpVars);
      case '$dumpall':
        return this.open(BodyBlock.DumpAll);
      case '$dumpon':
        this.sawDumpSwitch = true;
        if (this.dumpOffStart >= 0) {
          this.b.dumpOff.push([this.dumpOffStart, this.b.currentTick]);
          this.dumpOffStart = -1;
        }
        return this.open(BodyBlock.DumpOn);
      case '$dumpoff':
        this.sawDumpSwitch = true;
        this.open(BodyBlock.DumpOff);
        if (this.dumpOffStart < 0) this.dumpOffStart = this.b.currentTick;
        this.dumpOffMarks = new Uint32Array(this.b.signalCount);
        for (let k = 0; k < this.b.signalCount; k++) this.dumpOffMarks[k] = this.b.countOf(k);
        return;
      case '$comment':
        return this.open(BodyBlock.Comment);
      default:
        if (kw === '$enddefinitions' || kw === '$var' || kw === '$scope' || kw === '$upscope' || kw === '$timescale') {
          this.fail(`declaration command ${kw} after $enddefinitions`, 'value changes and simulation keywords only');
        }
        this.b.warn(this.tokenLine, this.tokenOffset, `unknown simulation command ${clip(kw)} skipped up to its $end`);
        this.open(BodyBlock.Unknown);
    }
  }

  private open(block: BodyBlock): void {
    if (this.block === BodyBlock.DumpOff && block !== BodyBlock.DumpOff) this.closeDumpOff();
    this.block = block;
    this.blockLine = this.tokenLine;
  }

  /** §18.2.3.10: after $dumpoff every variable reads x; add x for any the writer did not list. */
  private closeDumpOff(): void {
    const marks = this.dumpOffMarks;
    if (!marks) return;
    for (let k = 0; k < marks.length; k++) {
      if (this.b.countOf(k) !== marks[k]) continue;
      const kind = this.b.signal(k).kind;
      if (kind === 'logic' || kind === 'event') this.b.pushLogic(k, Logic.X, false);
      else if (kind === 'vector') this.b.pushVectorX(k);
      else if (kind === 'real') this.b.pushReal(k, Number.NaN, false);
    }
    this.dumpOffMarks = null;
  }

  private timestamp(buf: Uint8Array, s: number, e: number): void {
    if (e - s < 2) this.fail(`'#' without a time`, 'a decimal time after #');
    let t = 0;
    for (let i = s + 1; i < e; i++) {
      const d = buf[i] - 48;
      if (d < 0 || d > 9) this.fail(`timestamp '${clip(TEXT.decode(buf.subarray(s, e)))}' is not a whole number`, 'digits after #');
      t = t * 10 + d;
    }
    if (t > MAX_EXACT_TICK) this.fail(`timestamp ${TEXT.decode(buf.subarray(s, e))} is beyond 2^53 ticks`, 'times below 9007199254740992');
    if (this.sawTime && t < this.b.currentTick) {
      this.fail(`time goes backwards from #${this.b.currentTick} to #${t}`, 'timestamps in increasing order');
    }
    if (this.block === BodyBlock.DumpVars || this.block === BodyBlock.DumpAll || this.block === BodyBlock.DumpOn) {
      this.fail(`timestamp inside a ${this.blockName()} section opened at line ${this.blockLine}`, '$end to close the section first');
    }
    this.sawTime = true;
    this.lastTimeLine = this.tokenLine;
    this.b.setTime(t);
  }

  private blockName(): string {
    return ['', '$dumpvars', '$dumpall', '$dumpon', '$dumpoff', '$comment', 'command'][this.block];
  }

  private startVector(buf: Uint8Array, s: number, e: number): void {
    const n = e - s - 1;
    if (n === 0) this.fail(`'b' without value digits`, 'binary digits 0, 1, x, z after b');
    if (n > this.limits.maxVectorWidth) this.fail(`vector value of ${n} digits is over the limit of ${this.limits.maxVectorWidth} bits`, 'a narrower vector');
    if (n > this.pendingDigits.length) this.pendingDigits = new Uint8Array(Math.max(n, this.pendingDigits.length * 2));
    this.pendingDigits.set(buf.subarray(s + 1, e));
    this.pendingLen = n;
    this.pendingKind = 98;
    this.notePending();
  }

  private startReal(buf: Uint8Array, s: number, e: number): void {
    const text = TEXT.decode(buf.subarray(s + 1, e));
    const v = readReal(text);
    if (v === null) this.fail(`real value '${clip(text)}' is not a number`, 'a decimal number such as r1.5 or r-1.25e-3');
    this.pendingReal = v;
    this.pendingKind = 114;
    this.notePending();
  }

  /** The identifier code after a vector, real or string value. */
  private finishPending(buf: Uint8Array, s: number, e: number): void {
    const kind = this.pendingKind;
    this.pendingKind = 0;
    // `$` is a legal code character (§18.2.1), so the next token is the code whatever it looks like.
    if (this.block === BodyBlock.Comment || this.block === BodyBlock.Unknown) return;
    const sig = this.codes.lookup(buf, s, e);
    if (sig < 0) return this.unknownCode(buf, s, e);
    const sk = this.b.signal(sig).kind;
    if (kind === 98) {
      if (sk === 'vector' || sk === 'logic' || sk === 'event') return this.pushVectorDigits(sig, this.pendingDigits, 0, this.pendingLen);
      this.fail(`binary value for ${sk} net '${this.nameOf(sig)}'`, sk === 'real' ? 'r<number> <code>' : 's<text> <code>', this.pendingLine, this.pendingOffset);
    } else if (kind === 114) {
      if (sk === 'real') return this.b.pushReal(sig, this.pendingReal);
      this.fail(`real value for ${sk} net '${this.nameOf(sig)}'`, 'b<digits> <code> or a scalar value', this.pendingLine, this.pendingOffset);
    } else {
      this.b.pushText(sig, this.pendingText);
    }
  }

  private vectorChange(buf: Uint8Array, ds: number, de: number, cs: number, ce: number): void {
    if (de - ds > this.limits.maxVectorWidth) this.fail(`vector value of ${de - ds} digits is over the limit of ${this.limits.maxVectorWidth} bits`, 'a narrower vector', this.pendingLine, this.pendingOffset);
    const sig = this.codes.lookup(buf, cs, ce);
    if (sig < 0) return this.unknownCode(buf, cs, ce);
    const sk = this.b.signal(sig).kind;
    if (sk === 'real' || sk === 'string') this.fail(`binary value for ${sk} net '${this.nameOf(sig)}'`, sk === 'real' ? 'r<number> <code>' : 's<text> <code>', this.pendingLine, this.pendingOffset);
    this.pushVectorDigits(sig, buf, ds, de);
  }

  /** Digits [s, e) of a binary value, MSB first, with IEEE left-extension (Table 18-1). */
  private pushVectorDigits(sig: number, buf: Uint8Array, s: number, e: number): void {
    const signal = this.b.signal(sig);
    const width = signal.width;
    const n = e - s;
    if (n > width) {
      // Leading zeros beyond the width carry no information; anything else is an error.
      let lead = s;
      while (lead < e - width && buf[lead] === 48) lead++;
      if (e - lead > width) {
        this.fail(`value of ${n} bits for net '${this.nameOf(sig)}' of ${width} bit(s)`, `at most ${width} value digits`, this.pendingLine || this.tokenLine, this.pendingOffset || this.tokenOffset);
      }
      s = lead;
    }
    if (signal.kind !== 'vector') {
      const code = SCALAR[buf[e - 1]];
      if (code < 0) this.badDigit(buf[e - 1]);
      this.b.pushLogic(sig, code);
      return;
    }
    if (width <= 32) return this.pushNarrowVector(sig, width, buf, s, e);
    const words = wordsFor(width);
    if (this.valuePlane.length < words) {
      this.valuePlane = new Uint32Array(words);
      this.unknownPlane = new Uint32Array(words);
    }
    const val = this.valuePlane;
    const unk = this.unknownPlane;
    // 32 digits per plane word, from the rightmost (bit 0) leftwards.
    this.packExotic = false;
    let to = e;
    for (let w = 0; w < words; w++) {
      const from = to - 32 > s ? to - 32 : s;
      val[w] = from < to ? this.packWord(buf, from, to) : 0;
      unk[w] = from < to ? this.packUnknown : 0;
      to = from;
    }
    const len = e - s;
    const lead = SCALAR[buf[s]];
    if (len < width && (lead === Logic.X || lead === Logic.Z)) {
      for (let bit = len; bit < width; bit++) {
        const w = bit >>> 5;
        const m = 1 << (bit & 31);
        unk[w] |= m;
        if (lead === Logic.Z) val[w] |= m;
      }
    }
    let text: string | null = null;
    if (this.packExotic) {
      const written = writtenStates(buf, s, e);
      const pad = lead === Logic.L0 || lead === Logic.L1 ? '0' : written[0];
      text = pad.repeat(width - len) + written;
    }
    this.b.pushVector(sig, val, unk, text);
  }

  /**
   * Packs up to 32 value digits [s, e) into a value word (returned) and an unknown word
   * (`packUnknown`); Logic codes 0..3 are v + 2u. States beyond 0/1/x/z set `packExotic`.
   */
  private packWord(buf: Uint8Array, s: number, e: number): number {
    let v = 0;
    let u = 0;
    for (let k = s; k < e; k++) {
      const ch = buf[k];
      // 0 and 1 first, in one unsigned compare: nearly every digit of a real dump is one of them.
      const d = ch - 48;
      if (d >>> 0 < 2) {
        v = (v << 1) | d;
        u <<= 1;
        continue;
      }
      const code = SCALAR[ch];
      if (code < 0) this.badDigit(ch);
      if (code > 3) {
        this.packExotic = true;
        v <<= 1;
        u = (u << 1) | 1;
      } else {
        v = (v << 1) | (code & 1);
        u = (u << 1) | (code >> 1);
      }
    }
    this.packUnknown = u >>> 0;
    return v >>> 0;
  }

  /** Vectors of up to 32 bits: both planes fit one word each. */
  private pushNarrowVector(sig: number, width: number, buf: Uint8Array, s: number, e: number): void {
    this.packExotic = false;
    let v = this.packWord(buf, s, e);
    let u = this.packUnknown;
    const len = e - s;
    const lead = SCALAR[buf[s]];
    let text: string | null = null;
    if (len < width) {
      if (lead === Logic.X || lead === Logic.Z) {
        const all = width === 32 ? -1 : (1 << width) - 1;
        const fill = all & ~((1 << len) - 1);
        u |= fill;
        if (lead === Logic.Z) v |= fill;
      }
    }
    if (this.packExotic) {
      const pad = lead === Logic.L0 || lead === Logic.L1 ? '0' : LOGIC_CHARS[lead];
      text = pad.repeat(width - len) + writtenStates(buf, s, e);
    }
    this.b.pushVectorWord(sig, v >>> 0, u >>> 0, text);
  }

  private badDigit(byte: number): never {
    this.fail(`'${String.fromCharCode(byte)}' is not a value digit`, 'one of 0 1 x z (or U W L H - from VHDL tools)', this.pendingLine || this.tokenLine, this.pendingOffset || this.tokenOffset);
  }

  private unknownCode(buf: Uint8Array, s: number, e: number): never {
    this.fail(`unknown identifier code '${clip(TEXT.decode(buf.subarray(s, e)))}'`, 'a code declared by a $var line');
  }

  private nameOf(sig: number): string {
    return this.b.nets.find((n) => n.signal === sig)?.path ?? `#${sig}`;
  }

  /** Why the input read so far does not end cleanly between two time steps ('' when it does). */
  endState(): string {
    if (this.mode !== Mode.Body) return 'it ends before $enddefinitions';
    if (this.carryLen > 0) return 'the file ends in the middle of a line';
    if (this.pendingKind !== 0) return 'the file ends between a value and its identifier code';
    if (this.block !== BodyBlock.None && this.block !== BodyBlock.DumpOff) return `the file ends inside the ${this.blockName()} section opened at line ${this.blockLine}`;
    return '';
  }

  /**
   * Ends the input. A file that stops mid-line or inside a section is taken as cut off (a
   * simulation still running or killed): the last time step may be incomplete, so it is dropped
   * and a warning names the line. A file that ends before $enddefinitions is an error. Returns
   * whether the dump was cut off. For a part of a dump read in parts, `lineDelta` and `byteDelta`
   * turn its own line numbers and offsets into the file's, for the warnings of its body.
   */
  closeInput(lineDelta = 0, byteDelta = 0): boolean {
    const b = this.b;
    const endLine = this.line + lineDelta;
    const endOffset = this.base + byteDelta;
    if (this.mode !== Mode.Body) {
      const open = this.mode === Mode.Command ? ` (inside ${this.command} opened at line ${this.commandLine})` : '';
      this.fail(`file ends before $enddefinitions${open}`, 'the header to finish with $enddefinitions $end', endLine, endOffset);
    }
    for (let w = this.headerWarnings; w < b.warnings.length; w++) {
      const warning = b.warnings[w];
      b.warnings[w] = { ...warning, line: warning.line + lineDelta, offset: warning.offset + byteDelta };
    }
    this.blockLine += lineDelta;
    const cut = this.endState();
    if (this.block === BodyBlock.DumpOff) this.closeDumpOff();
    if (this.dumpOffStart >= 0) b.dumpOff.push([this.dumpOffStart, b.endTick]);
    const truncated = cut !== '';
    if (truncated) {
      // A cut inside a new `#` line means the step before it was complete.
      const cutInTimestamp = this.carryLen > 0 && this.carry[0] === 35;
      if (!cutInTimestamp) b.dropCurrentStep();
      const last = !this.sawTime
        ? ''
        : cutInTimestamp
          ? `; loaded up to #${b.currentTick}`
          : `; loaded up to #${b.currentTick} (line ${this.lastTimeLine + lineDelta}), whose changes were dropped as possibly incomplete`;
      b.warn(endLine, endOffset, `dump is cut off at line ${endLine}: ${cut}${last}`);
    }
    return truncated;
  }

  /** Ends the input (see closeInput) and builds the dump. */
  finish(): Dump {
    const truncated = this.closeInput();
    return this.b.finish(this.base, truncated);
  }
}

const EXACT_POWERS = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22];

/**
 * A plain decimal real (`-1.25e-3`) read from bytes, or null for anything else (the caller then
 * takes the general path). Exact: a mantissa below 2^53 times or over an exactly representable
 * power of ten (10^0..10^22) is one correctly rounded IEEE 754 operation; other cases go to
 * Number() on the text.
 */
function decimalReal(p: Uint8Array, s: number, e: number): number | null {
  let i = s;
  let negative = false;
  if (p[i] === 45 || p[i] === 43) negative = p[i++] === 45;
  const unsigned = i;
  let mantissa = 0;
  let digits = 0;
  let scale = 0;
  let d = p[i] - 48;
  while (i < e && d >= 0 && d <= 9) {
    mantissa = mantissa * 10 + d;
    digits++;
    d = p[++i] - 48;
  }
  if (i < e && p[i] === 46) {
    d = p[++i] - 48;
    while (i < e && d >= 0 && d <= 9) {
      mantissa = mantissa * 10 + d;
      digits++;
      scale--;
      d = p[++i] - 48;
    }
  }
  if (digits === 0) return null;
  if (i < e && (p[i] === 101 || p[i] === 69)) {
    let ei = i + 1;
    let expNegative = false;
    if (p[ei] === 45 || p[ei] === 43) expNegative = p[ei++] === 45;
    let exp = 0;
    let expDigits = 0;
    d = p[ei] - 48;
    while (ei < e && d >= 0 && d <= 9 && expDigits < 6) {
      exp = exp * 10 + d;
      expDigits++;
      d = p[++ei] - 48;
    }
    if (expDigits === 0 || ei !== e) return null;
    scale += expNegative ? -exp : exp;
    i = ei;
  }
  if (i !== e) return null;
  let v: number;
  if (digits <= 15 && scale >= -22 && scale <= 22) v = scale < 0 ? mantissa / EXACT_POWERS[-scale] : mantissa * EXACT_POWERS[scale];
  else v = Number(String.fromCharCode(...p.subarray(unsigned, e)));
  return negative ? -v : v;
}

function readReal(text: string): number | null {
  if (/^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/.test(text)) return Number(text);
  const low = text.toLowerCase();
  if (low === 'nan' || low === '-nan') return Number.NaN;
  if (low === 'inf' || low === '+inf' || low === 'infinity') return Number.POSITIVE_INFINITY;
  if (low === '-inf' || low === '-infinity') return Number.NEGATIVE_INFINITY;
  return null;
}

/** Value digits as text: 0/1/x/z in lower case, other states (U, W, L, H, -) in upper case. */
function writtenStates(buf: Uint8Array, s: number, e: number): string {
  let out = '';
  for (let i = s; i < e; i++) out += LOGIC_CHARS[SCALAR[buf[i]]];
  return out;
}

/**
 * A token's text. Header tokens are short and nearly always ASCII, where building the string
 * from char codes is several times cheaper than a TextDecoder call; anything else is decoded.
 */
function tokenText(buf: Uint8Array, s: number, e: number): string {
  if (e - s > 64) return TEXT.decode(buf.subarray(s, e));
  let out = '';
  for (let i = s; i < e; i++) {
    const c = buf[i];
    if (c > 126) return TEXT.decode(buf.subarray(s, e));
    out += String.fromCharCode(c);
  }
  return out;
}

function clip(text: string): string {
  return text.length > 40 ? `${text.slice(0, 40)}…` : text;
}

function describeJunk(buf: Uint8Array, s: number, e: number): string {
  const c = buf[s];
  if (c < 32 || c > 126) return `unexpected byte 0x${c.toString(16).padStart(2, '0')} (binary data?)`;
  return `unexpected '${clip(TEXT.decode(buf.subarray(s, e)))}'`;
}

/** Parses a whole dump held in memory (tests, small files). */
export function parseVcd(input: Uint8Array | string, source = 'dump.vcd', limits?: Partial<VcdLimits>): Dump {
  const p = new VcdParser(source, limits);
  p.push(typeof input === 'string' ? new TextEncoder().encode(input) : input);
  return p.finish();
}

export { VcdError } from './errors';
export type { VcdLimits } from './errors';
