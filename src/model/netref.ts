// Naming nets on the command line and in plans: full path or unique suffix, a bit as `top.bus[3]`,
// globs where only `*` and `?` are wildcards (brackets are literal).

import type { Dump, Net, Signal } from './dump';
import { bitCode } from './lookup';

/** A net, or one bit of a vector net, as a measurement target. */
export interface NetRef {
  net: Net;
  /** Bit index in the declared range, or null for the whole net. */
  bit: number | null;
  /** Display name: the net's path, plus `[bit]` for a bit. */
  label: string;
}

export class NetLookupError extends Error {}

const BIT_SUFFIX = /^(.*)\[(-?\d+)\]$/;

function candidatesByName(dump: Dump, name: string): Net[] {
  const exact = dump.nets.filter((n) => n.path === name);
  if (exact.length > 0) return exact;
  return dump.nets.filter((n) => n.path.endsWith('.' + name));
}

/**
 * Several $var lines may be one net seen from several scopes (a port and the wire it connects
 * share one identifier code); they hold the same data, so a name matching only those is not
 * ambiguous and resolves to the shortest path.
 */
function single(dump: Dump, name: string, found: Net[]): Net | null {
  if (found.length === 0) return null;
  const paths = new Set(found.map((n) => n.path));
  const signals = new Set(found.map((n) => n.signal));
  if (signals.size === 1) return found.reduce((a, b) => (b.path.length < a.path.length ? b : a));
  if (paths.size > 1) {
    const list = [...paths].slice(0, 5).join(', ');
    throw new NetLookupError(`net name '${name}' is ambiguous: it matches ${paths.size} nets (${list}${paths.size > 5 ? ', …' : ''}); give more of the path`);
  }
  return found[0];
}

/** Resolves a full path or unique suffix, with an optional `[bit]` in the net's declared range. */
export function resolveNet(dump: Dump, name: string): NetRef {
  const whole = single(dump, name, candidatesByName(dump, name));
  if (whole) return { net: whole, bit: null, label: whole.path };
  const m = BIT_SUFFIX.exec(name);
  if (m) {
    const net = single(dump, name, candidatesByName(dump, m[1]));
    if (net) {
      const bit = Number(m[2]);
      const lo = Math.min(net.msb, net.lsb);
      const hi = Math.max(net.msb, net.lsb);
      if (!net.ranged || bit < lo || bit > hi) {
        throw new NetLookupError(`bit ${bit} is outside net '${net.path}' (declared ${net.ranged ? `[${net.msb}:${net.lsb}]` : 'without a range'})`);
      }
      return { net, bit, label: `${net.path}[${bit}]` };
    }
  }
  throw new NetLookupError(`no net named '${name}' in ${dump.source} (give a full path such as top.u1.q or a unique suffix)`);
}

/** Position of a declared bit index counted from the rightmost character (0 = rightmost). */
export function bitPosition(net: Net, bit: number): number {
  return net.msb >= net.lsb ? bit - net.lsb : net.lsb - bit;
}

export function globToRegExp(glob: string): RegExp {
  let re = '';
  for (const ch of glob) {
    if (ch === '*') re += '.*';
    else if (ch === '?') re += '.';
    else re += ch.replace(/[.+^${}()|[\]\\/-]/g, '\\$&');
  }
  return new RegExp(`^${re}$`);
}

export function isGlob(text: string): boolean {
  return text.includes('*') || text.includes('?');
}

/**
 * Expands a comma-separated list whose items are names or globs. A glob matches full paths or
 * path suffixes (after a dot). Each distinct path appears once, in dump order for globs.
 */
export function resolveNetList(dump: Dump, list: string): NetRef[] {
  const out: NetRef[] = [];
  const seen = new Set<string>();
  const push = (r: NetRef) => {
    if (!seen.has(r.label)) {
      seen.add(r.label);
      out.push(r);
    }
  };
  for (const raw of list.split(',')) {
    const item = raw.trim();
    if (item === '') continue;
    if (!isGlob(item)) {
      push(resolveNet(dump, item));
      continue;
    }
    const re = globToRegExp(item);
    const suffix = globToRegExp('*.' + item);
    let matched = 0;
    for (const net of dump.nets) {
      if (re.test(net.path) || suffix.test(net.path)) {
        push({ net, bit: null, label: net.path });
        matched++;
      }
    }
    if (matched === 0) throw new NetLookupError(`the pattern '${item}' matches no net in ${dump.source}`);
  }
  if (out.length === 0) throw new NetLookupError('the net list is empty');
  return out;
}

/**
 * A 1-bit view of one bit of a vector signal: keeps the changes where that bit's state differs
 * from the one before (the first change always), plus repeated writes at one timestamp, so
 * zero-width glitches on the bit stay visible.
 */
export function bitSignal(dump: Dump, ref: NetRef): Signal {
  const sig = dump.signals[ref.net.signal];
  if (ref.bit === null) return sig;
  const pos = bitPosition(ref.net, ref.bit);
  const idx = new Uint32Array(sig.count);
  const codes = new Uint8Array(sig.count);
  let n = 0;
  let prev = -1;
  for (let i = 0; i < sig.count; i++) {
    const c = bitCode(sig, i, pos);
    const sameStep = n > 0 && idx[n - 1] === sig.timeIndex[i];
    if (c !== prev || sameStep) {
      idx[n] = sig.timeIndex[i];
      codes[n] = c;
      n++;
      prev = c;
    }
  }
  return {
    kind: 'logic',
    width: 1,
    count: n,
    timeIndex: idx.slice(0, n),
    logic: codes.slice(0, n),
    planes: new Uint32Array(0),
    reals: new Float64Array(0),
    texts: new Map(),
    written: n,
  };
}

/**
 * One net per signal: where several $var lines share an identifier code (a port and the wire it
 * connects), the shortest path stands for all of them, as in resolveNet. In declaration order.
 */
export function distinctNets(dump: Dump): Net[] {
  const best = new Map<number, Net>();
  for (const net of dump.nets) {
    const prior = best.get(net.signal);
    if (!prior || net.path.length < prior.path.length) best.set(net.signal, net);
  }
  return dump.nets.filter((n) => best.get(n.signal) === n);
}

/** Every 1-bit target in a dump: 1-bit nets and each bit of each vector, once per signal. */
export function allBitRefs(dump: Dump): NetRef[] {
  const out: NetRef[] = [];
  for (const net of distinctNets(dump)) {
    const sig = dump.signals[net.signal];
    if (sig.kind === 'logic') out.push({ net, bit: null, label: net.path });
    else if (sig.kind === 'vector') {
      const step = net.msb >= net.lsb ? -1 : 1;
      for (let b = net.msb; ; b += step) {
        out.push({ net, bit: b, label: `${net.path}[${b}]` });
        if (b === net.lsb) break;
      }
    }
  }
  return out;
}
