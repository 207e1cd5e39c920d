// Declaration commands of IEEE 1364-2005 §18.2.3: $timescale, $scope, $var and their pieces.
// These run once per declaration, so clarity beats speed here.

import type { SignalKind, Timescale, TimeUnit } from '../model/dump';

const UNIT_SECONDS: Record<TimeUnit, number> = { s: 1, ms: 1e-3, us: 1e-6, ns: 1e-9, ps: 1e-12, fs: 1e-15 };

export interface TimescaleReading {
  timescale: Timescale;
  /** Set when the number is not 1, 10 or 100 (§18.2.3.5 allows only those). */
  nonStandard: boolean;
}

/** `$timescale` body tokens: `1ns`, `1 ns`, `100ps`, `10 us`, split over lines or not (§18.2.3.5). */
export function readTimescale(tokens: string[]): TimescaleReading | null {
  const m = /^(\d+(?:\.\d+)?)\s*(s|ms|us|ns|ps|fs)$/.exec(tokens.join(''));
  if (!m) return null;
  const magnitude = Number(m[1]);
  const unit = m[2] as TimeUnit;
  if (!(magnitude > 0)) return null;
  return {
    timescale: { magnitude, unit, seconds: magnitude * UNIT_SECONDS[unit] },
    nonStandard: magnitude !== 1 && magnitude !== 10 && magnitude !== 100,
  };
}

export interface VarDeclaration {
  type: string;
  width: number;
  code: string;
  name: string;
  msb: number;
  lsb: number;
  ranged: boolean;
}

const RANGE = /^\[(-?\d+)(?::(-?\d+))?\]$/;
const GLUED_RANGE = /^(.+?)(\[(-?\d+)(?::(-?\d+))?\])$/;

/**
 * `$var var_type size identifier_code reference $end` (§18.2.3.7). The reference may carry a
 * bit-select or range, as a separate token (`bus [7:0]`) or glued to the name (`bus[7:0]`).
 * Returns an error text instead of throwing, so the caller can add the position.
 */
export function readVar(tokens: string[]): VarDeclaration | string {
  if (tokens.length < 4) return `$var needs a type, a size, an identifier code and a name, found ${tokens.length} item(s)`;
  const [type, sizeText, code] = tokens;
  if (!/^\d+$/.test(sizeText)) {
    if (type === 'port') return `$var type 'port' belongs to extended VCD ($dumpports), which midrail does not read`;
    return `$var size '${sizeText}' is not a whole number`;
  }
  const width = Number(sizeText);
  let rest = tokens.slice(3);
  let msb = 0;
  let lsb = 0;
  let ranged = false;
  const last = rest[rest.length - 1];
  const sep = rest.length > 1 ? RANGE.exec(last) : null;
  if (sep) {
    msb = Number(sep[1]);
    lsb = sep[2] === undefined ? msb : Number(sep[2]);
    ranged = true;
    rest = rest.slice(0, -1);
  }
  let name = rest.join(' ');
  if (!ranged) {
    const glued = GLUED_RANGE.exec(name);
    if (glued && !name.startsWith('\\')) {
      name = glued[1];
      msb = Number(glued[3]);
      lsb = glued[4] === undefined ? msb : Number(glued[4]);
      ranged = true;
    }
  }
  if (!ranged && width > 1) {
    msb = width - 1;
    lsb = 0;
  }
  return { type, width, code, name, msb, lsb, ranged };
}

/** Storage kind for a declaration: reals by type, events, strings, then logic by width. */
export function signalKindFor(decl: VarDeclaration): SignalKind {
  if (decl.type === 'real' || decl.type === 'realtime' || decl.type === 'shortreal') return 'real';
  if (decl.type === 'string') return 'string';
  if (decl.type === 'event') return 'event';
  return decl.width === 1 ? 'logic' : 'vector';
}
