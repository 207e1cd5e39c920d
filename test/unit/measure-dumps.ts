// Small hand-built dumps for measurement unit tests (DumpBuilder, no parser involved).

import { DumpBuilder } from '../../src/model/builder';
import { type Dump, LOGIC_CHARS, type TimeUnit, wordsFor } from '../../src/model/dump';

export type NetSpec =
  | { path: string; kind: 'logic'; changes: Array<[number, string]> }
  | { path: string; kind: 'vector'; width: number; changes: Array<[number, string]> }
  | { path: string; kind: 'real'; changes: Array<[number, number]> };

const UNIT_S: Record<TimeUnit, number> = { s: 1, ms: 1e-3, us: 1e-6, ns: 1e-9, ps: 1e-12, fs: 1e-15 };

export function buildDump(nets: NetSpec[], opts: { unit?: TimeUnit; magnitude?: number; end?: number; source?: string } = {}): Dump {
  const unit = opts.unit ?? 'ns';
  const magnitude = opts.magnitude ?? 1;
  const b = new DumpBuilder(opts.source ?? 'hand.vcd');
  b.timescale = { magnitude, unit, seconds: magnitude * UNIT_S[unit] };
  const scopeIds = new Map<string, number>();
  const scopeFor = (path: string): number => {
    const parts = path.split('.');
    let parent = -1;
    let sofar = '';
    for (const p of parts.slice(0, -1)) {
      sofar = sofar ? `${sofar}.${p}` : p;
      let id = scopeIds.get(sofar);
      if (id === undefined) {
        id = b.addScope(p, 'module', parent);
        scopeIds.set(sofar, id);
      }
      parent = id;
    }
    return parent;
  };
  const events: Array<{ tick: number; order: number; apply: () => void }> = [];
  let order = 0;
  nets.forEach((spec, k) => {
    const width = spec.kind === 'vector' ? spec.width : 1;
    const sig = b.addSignal(spec.kind, spec.kind === 'real' ? 64 : width);
    const name = spec.path.split('.').pop()!;
    b.addNet({
      path: spec.path,
      name,
      type: spec.kind === 'real' ? 'real' : 'wire',
      width: spec.kind === 'real' ? 64 : width,
      msb: spec.kind === 'vector' ? width - 1 : 0,
      lsb: 0,
      ranged: spec.kind === 'vector',
      scope: scopeFor(spec.path),
      signal: sig,
      code: String.fromCharCode(33 + k),
    });
    for (const [tick, value] of spec.changes) {
      let apply: () => void;
      if (spec.kind === 'logic') apply = () => b.pushLogic(sig, LOGIC_CHARS.indexOf(String(value)));
      else if (spec.kind === 'real') apply = () => b.pushReal(sig, Number(value));
      else {
        const text = String(value).padStart(width, '0');
        const words = wordsFor(width);
        const v = new Uint32Array(words);
        const u = new Uint32Array(words);
        let other = false;
        for (let bit = 0; bit < width; bit++) {
          const ch = text[text.length - 1 - bit];
          const m = 1 << (bit & 31);
          if (ch === '1') v[bit >>> 5] |= m;
          else if (ch === 'z') {
            v[bit >>> 5] |= m;
            u[bit >>> 5] |= m;
          } else if (ch !== '0') {
            u[bit >>> 5] |= m;
            if (ch !== 'x') other = true;
          }
        }
        apply = () => b.pushVector(sig, v, u, other ? text : null);
      }
      events.push({ tick, order: order++, apply });
    }
  });
  events.sort((x, y) => x.tick - y.tick || x.order - y.order);
  for (const e of events) {
    b.setTime(e.tick);
    e.apply();
  }
  if (opts.end !== undefined) b.setTime(opts.end);
  return b.finish(0, false);
}
