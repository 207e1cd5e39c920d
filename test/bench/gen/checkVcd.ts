// Synthetic dumps for the `check` section (issue 6): a made-up clocked block whose nets suit a
// timing plan, with every delay placed by the generator, so the plan's figures are known in
// advance (IEEE 1364-2005 §18.2 syntax, timescale 1 ps):
// - bench.clk: 250 MHz root clock, 50 % duty;
// - bench.tree.leaf0..3: the clock buffered with offsets of 80/110/140/175 ps, each edge moved by
//   a seeded ±4 ps, so leaf skew stays within 95 + 8 ps and a leaf's period jitter within 16 ps;
// - bench.core.q0..q7: flops that toggle on about half the rising edges, 200..300 ps after clk;
// - bench.core.bus[15:0]: a register loaded with a random value 250..350 ps after each rising edge;
// - bench.core.strobe_n: high, with a low pulse 40..200 ps wide in about one cycle in 50 (glitches);
// - bench.core.pwm: a free-running pulse train (high 1.5..5 ns, low 1..3 ns);
// - bench.fill.tileN.*: bulk nets (1-bit, every tenth a 16-bit vector), each changing at most once
//   a cycle, 200..1800 ps after the rising edge, so none of them ever holds a pulse under 400 ps.
// Values are seeded, so the same index and size give the same file every time.

import { ByteWriter } from './byteWriter';
import { identifierCode } from './synthVcd';

/** Bump when the file content changes, so cached dumps of an older layout are not reused. */
export const CHECK_SYNTH_VERSION = 1;

export const CLOCK_PERIOD_PS = 4000;
export const LEAF_OFFSETS_PS = [80, 110, 140, 175];
export const LEAF_WOBBLE_PS = 4;
export const DATA_FLOPS = 8;
export const FILL_NETS = 200;
/** Bulk nets changed per clock cycle (at most once each). */
const FILL_PER_CYCLE = 24;

export interface CheckSynthMeta {
  version: number;
  index: number;
  targetBytes: number;
  bytes: number;
  nets: number;
  changes: number;
  cycles: number;
  /** Low pulses written on bench.core.strobe_n, all narrower than 300 ps. */
  strobeGlitches: number;
  /** Toggles of bench.core.q0 and rising edges of bench.core.q5 (delay pairs the plan should find). */
  q0Toggles: number;
  q5Rises: number;
  generatedMs: number;
}

interface NetDecl {
  scope: string;
  name: string;
  width: number;
}

function declarations(): NetDecl[] {
  const d: NetDecl[] = [{ scope: 'bench', name: 'clk', width: 1 }];
  for (let i = 0; i < LEAF_OFFSETS_PS.length; i++) d.push({ scope: 'tree', name: `leaf${i}`, width: 1 });
  for (let i = 0; i < DATA_FLOPS; i++) d.push({ scope: 'core', name: `q${i}`, width: 1 });
  d.push({ scope: 'core', name: 'bus', width: 16 });
  d.push({ scope: 'core', name: 'strobe_n', width: 1 });
  d.push({ scope: 'core', name: 'pwm', width: 1 });
  for (let i = 0; i < FILL_NETS; i++) {
    const tile = `tile${Math.floor(i / 100)}`;
    d.push(i % 10 === 9 ? { scope: tile, name: `word${i}`, width: 16 } : { scope: tile, name: `lane${i}`, width: 1 });
  }
  return d;
}

// Net indices in declaration order.
const CLK = 0;
const LEAF0 = 1;
const Q0 = LEAF0 + LEAF_OFFSETS_PS.length;
const BUS = Q0 + DATA_FLOPS;
const STROBE = BUS + 1;
const PWM = BUS + 2;
const FILL0 = BUS + 3;

/** One cycle's changes, gathered and then written in time order. */
class CycleEvents {
  time: number[] = [];
  net: number[] = [];
  value: number[] = [];
  order: number[] = [];
  add(time: number, net: number, value: number): void {
    this.time.push(time);
    this.net.push(net);
    this.value.push(value);
  }
  clear(): void {
    this.time.length = this.net.length = this.value.length = 0;
  }
  sorted(): number[] {
    const o = this.order;
    o.length = 0;
    for (let i = 0; i < this.time.length; i++) o.push(i);
    // Stable, so same-time changes keep the order they were added in.
    return o.sort((a, b) => this.time[a] - this.time[b] || a - b);
  }
}

export function generateCheckVcd(path: string, index: number, targetBytes: number): CheckSynthMeta {
  const started = Date.now();
  let rng = (0xc0ffee ^ (index * 0x9e3779b1)) >>> 0 || 1;
  const next = (): number => {
    rng ^= rng << 13;
    rng >>>= 0;
    rng ^= rng >>> 17;
    rng ^= rng << 5;
    rng >>>= 0;
    return rng;
  };
  const uniform = (lo: number, hi: number) => lo + (next() % (hi - lo + 1));

  const decls = declarations();
  const codes = decls.map((_, i) => Uint8Array.from(identifierCode(i), (c) => c.charCodeAt(0)));
  const w = new ByteWriter(path);
  w.ascii('$date\n  synthetic check benchmark dump\n$end\n$version\n  midrail bench check generator ' + CHECK_SYNTH_VERSION + '\n$end\n');
  w.ascii('$timescale 1ps $end\n$scope module bench $end\n');
  let open = 'bench';
  for (let i = 0; i < decls.length; i++) {
    const d = decls[i];
    if (d.scope !== open) {
      if (open !== 'bench') w.ascii('$upscope $end\n');
      if (d.scope === 'tile0' || d.scope === 'tile1') {
        if (!open.startsWith('tile')) w.ascii('$scope module fill $end\n');
      } else if (open.startsWith('tile')) w.ascii('$upscope $end\n');
      w.ascii(`$scope module ${d.scope} $end\n`);
      open = d.scope;
    }
    const code = identifierCode(i);
    w.ascii(d.width === 1 ? `$var wire 1 ${code} ${d.name} $end\n` : `$var wire ${d.width} ${code} ${d.name} [${d.width - 1}:0] $end\n`);
  }
  w.ascii(`$upscope $end\n${open.startsWith('tile') ? '$upscope $end\n' : ''}$upscope $end\n$enddefinitions $end\n`);

  const value = new Int32Array(decls.length);
  let changes = 0;
  const writeValue = (i: number, v: number): void => {
    w.room();
    if (decls[i].width === 1) {
      w.byte(48 + v);
    } else {
      w.byte(98); // b, written without leading zeros (§18.2.1 left-extension)
      let top = decls[i].width - 1;
      while (top > 0 && ((v >>> top) & 1) === 0) top--;
      for (let b = top; b >= 0; b--) w.byte(48 + ((v >>> b) & 1));
      w.byte(32);
    }
    w.bytes(codes[i]);
    w.byte(10);
    changes++;
  };

  w.ascii('#0\n$dumpvars\n');
  value[STROBE] = 1;
  for (let i = 0; i < decls.length; i++) writeValue(i, value[i]);
  w.ascii('$end\n');

  const ev = new CycleEvents();
  const changedThisCycle = new Uint8Array(decls.length);
  let cycles = 0;
  let strobeGlitches = 0;
  let q0Toggles = 0;
  let q5Rises = 0;
  let pwmNext = uniform(1000, 3000);
  const half = CLOCK_PERIOD_PS / 2;
  while (w.size < targetBytes) {
    const t = (cycles + 1) * CLOCK_PERIOD_PS;
    cycles++;
    ev.clear();
    changedThisCycle.fill(0);
    ev.add(t, CLK, 1);
    ev.add(t + half, CLK, 0);
    for (let k = 0; k < LEAF_OFFSETS_PS.length; k++) {
      const wob = () => uniform(0, 2 * LEAF_WOBBLE_PS) - LEAF_WOBBLE_PS;
      ev.add(t + LEAF_OFFSETS_PS[k] + wob(), LEAF0 + k, 1);
      ev.add(t + half + LEAF_OFFSETS_PS[k] + wob(), LEAF0 + k, 0);
    }
    for (let q = 0; q < DATA_FLOPS; q++) {
      if (next() & 1) {
        const v = value[Q0 + q] ^ 1;
        value[Q0 + q] = v;
        ev.add(t + uniform(200, 300), Q0 + q, v);
        if (q === 0) q0Toggles++;
        if (q === 5 && v === 1) q5Rises++;
      }
    }
    value[BUS] = next() & 0xffff;
    ev.add(t + uniform(250, 350), BUS, value[BUS]);
    if (next() % 50 === 0) {
      const at = t + uniform(500, 1500);
      ev.add(at, STROBE, 0);
      ev.add(at + uniform(40, 200), STROBE, 1);
      strobeGlitches++;
    }
    while (pwmNext < t + CLOCK_PERIOD_PS) {
      value[PWM] ^= 1;
      ev.add(pwmNext, PWM, value[PWM]);
      pwmNext += value[PWM] ? uniform(1500, 5000) : uniform(1000, 3000);
    }
    for (let c = 0; c < FILL_PER_CYCLE; c++) {
      const i = FILL0 + (next() % FILL_NETS);
      if (changedThisCycle[i]) continue;
      changedThisCycle[i] = 1;
      value[i] = decls[i].width === 1 ? value[i] ^ 1 : next() & 0xffff;
      ev.add(t + uniform(20, 180) * 10, i, value[i]);
    }
    let shown = -1;
    for (const e of ev.sorted()) {
      const time = ev.time[e];
      if (time !== shown) {
        w.room();
        w.byte(35); // #
        w.uint(time);
        w.byte(10);
        shown = time;
      }
      writeValue(ev.net[e], ev.value[e]);
    }
  }
  // A last timestamp with no change after it: the dump's end time.
  w.room();
  w.byte(35);
  w.uint((cycles + 1) * CLOCK_PERIOD_PS + half);
  w.byte(10);
  w.close();
  return {
    version: CHECK_SYNTH_VERSION,
    index,
    targetBytes,
    bytes: w.written,
    nets: decls.length,
    changes,
    cycles,
    strobeGlitches,
    q0Toggles,
    q5Rises,
    generatedMs: Date.now() - started,
  };
}
