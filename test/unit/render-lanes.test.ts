// The viewer's lane list, cursors and time window as plain state (no DOM): what moving,
// grouping and removing lanes does, how a saved view comes back on a dump, and the searches
// behind the edge and value buttons. Expected values are worked out by hand from the small
// dump built here.

import { describe, expect, it } from 'vitest';
import { DumpBuilder } from '../../src/model/builder';
import { Logic } from '../../src/model/dump';
import { findEdge, findValue } from '../../src/view/seeking';
import { type NetLane, ViewState } from '../../src/view/state';
import { applyView, viewOf } from '../../src/view/viewio';

/** top.clk (toggles every 5), top.go (rises at 12), top.bus[3:0] (3 at 0, 9 at 20), top.sub.x. */
function smallDump() {
  const b = new DumpBuilder('small.vcd');
  b.timescale = { magnitude: 1, unit: 'ns', seconds: 1e-9 };
  const top = b.addScope('top', 'module', -1);
  const sub = b.addScope('sub', 'module', top);
  const net = (scope: number, name: string, kind: 'logic' | 'vector', width: number) => {
    const signal = b.addSignal(kind, width);
    b.addNet({ path: `${b.scopes[scope].path}.${name}`, name, type: 'wire', width, msb: width - 1, lsb: 0, ranged: width > 1, scope, signal, code: name });
    return signal;
  };
  const clk = net(top, 'clk', 'logic', 1);
  const go = net(top, 'go', 'logic', 1);
  const bus = net(top, 'bus', 'vector', 4);
  const x = net(sub, 'x', 'logic', 1);
  for (let t = 0; t <= 40; t += 5) {
    b.setTime(t);
    b.pushLogic(clk, (t / 5) % 2);
    if (t === 0) {
      b.pushLogic(go, Logic.L0);
      b.pushVector(bus, Uint32Array.of(3), Uint32Array.of(0), null);
      b.pushLogic(x, Logic.X);
    }
    if (t === 20) b.pushVector(bus, Uint32Array.of(9), Uint32Array.of(0), null);
  }
  b.setTime(12);
  b.pushLogic(go, Logic.L1);
  b.setTime(50);
  return b.finish(0, false);
}

function loaded(): ViewState {
  const st = new ViewState();
  st.width = 500;
  st.setDump(smallDump());
  return st;
}

const paths = (st: ViewState) => st.rows().map((r) => (r.kind === 'group' ? `[${st.rowLabel(r)}]` : r.kind === 'bit' ? `${(r.lane as NetLane).path}[${r.bit}]` : (r.lane as NetLane).path));

describe('lanes', () => {
  it('open with the first nets, the whole run in view and cursors A and B', () => {
    const st = loaded();
    expect(paths(st)).toEqual(['top.clk', 'top.go', 'top.bus', 'top.sub.x']);
    expect(st.t0).toBeLessThan(0);
    expect(st.t1).toBeGreaterThan(50);
    expect(st.cursors.map((c) => c.name)).toEqual(['A', 'B']);
  });

  it('move before a row, into a group, and out of it', () => {
    const st = loaded();
    const key = (p: string) => st.rows().find((r) => r.kind === 'net' && (r.lane as NetLane).path === p)!.key;
    st.moveRows([key('top.sub.x')], key('top.clk'));
    expect(paths(st)).toEqual(['top.sub.x', 'top.clk', 'top.go', 'top.bus']);
    st.select(key('top.go'), 'only');
    st.select(key('top.bus'), 'toggle');
    st.groupSelected('data');
    expect(paths(st)).toEqual(['top.sub.x', 'top.clk', '[data]', 'top.go', 'top.bus']);
    st.moveRows([key('top.clk')], key('top.bus'));
    expect(paths(st)).toEqual(['top.sub.x', '[data]', 'top.go', 'top.clk', 'top.bus']);
    expect(st.rows().find((r) => (r.lane as NetLane).path === 'top.clk')!.group).not.toBeNull();
    const g = st.rows().find((r) => r.kind === 'group')!;
    st.toggleCollapsed(g.lane.id);
    expect(paths(st)).toEqual(['top.sub.x', '[data]']);
    // Removing a heading keeps its lanes.
    st.removeRows([g.key]);
    expect(paths(st)).toEqual(['top.sub.x', 'top.go', 'top.clk', 'top.bus']);
  });

  it('show the bits of a bus beneath it, most significant first', () => {
    const st = loaded();
    const bus = st.allNetLanes().find((l) => l.path === 'top.bus')!;
    st.toggleExpanded(bus);
    expect(paths(st)).toEqual(['top.clk', 'top.go', 'top.bus', 'top.bus[3]', 'top.bus[2]', 'top.bus[1]', 'top.bus[0]', 'top.sub.x']);
  });
});

describe('time window', () => {
  it('zooms around a pixel, keeping the time under it', () => {
    const st = loaded();
    const before = st.t0 + 123 * st.tpp;
    st.zoomAt(123, 4);
    expect(st.t0 + 123 * st.tpp).toBeCloseTo(before, 9);
    st.setWindow(10, 20);
    expect(st.t0).toBe(10);
    expect(st.t1).toBeCloseTo(20, 9);
  });
});

describe('saved views', () => {
  it('come back the same on the same dump', () => {
    const st = loaded();
    const bus = st.allNetLanes().find((l) => l.path === 'top.bus')!;
    st.setRadix(bus, 'unsigned');
    st.rename(st.rows().find((r) => (r.lane as NetLane).path === 'top.go')!.key, 'start');
    st.setWindow(5, 30);
    st.moveCursor(0, 12);
    const saved = viewOf(st);
    const again = loaded();
    expect(applyView(again, saved)).toEqual([]);
    expect(viewOf(again)).toEqual(saved);
  });

  it('name the nets a dump does not have, and keep the rest', () => {
    const st = loaded();
    const view = { ...viewOf(st), lanes: [{ net: 'top.clk' }, { net: 'top.gone' }, { net: 'top.bus', bit: 7 }] };
    expect(applyView(st, view)).toEqual(['top.gone', 'top.bus[7]']);
    expect(paths(st)).toEqual(['top.clk']);
  });
});

describe('edge and value searches', () => {
  const rowOf = (st: ViewState, p: string) => st.rows().find((r) => r.kind === 'net' && (r.lane as NetLane).path === p)!;

  it('find the next and previous edges, and say when there is none', () => {
    const st = loaded();
    const go = rowOf(st, 'top.go');
    expect(findEdge(st, go, null, 0, 1)).toEqual({ tick: 12 });
    expect(findEdge(st, go, null, 12, 1)).toEqual({ problem: 'no later edge on go' });
    expect(findEdge(st, rowOf(st, 'top.clk'), null, 12, -1)).toEqual({ tick: 10 });
  });

  it('find a bus value typed in any form, and explain a value that cannot fit', () => {
    const st = loaded();
    const bus = rowOf(st, 'top.bus');
    expect(findValue(st, bus, '9', 0, 1)).toEqual({ tick: 20 }); // hex radix by default
    expect(findValue(st, bus, "4'b1001", 0, 1)).toEqual({ tick: 20 });
    expect(findValue(st, bus, '0x3', 30, -1)).toEqual({ tick: 0 });
    expect(findValue(st, bus, '0x10', 0, 1)).toEqual({ problem: expect.stringContaining("'0x10' is not a value of the 4-bit bus") });
    expect(findValue(st, rowOf(st, 'top.sub.x'), 'x', -1, 1)).toEqual({ tick: 0 });
  });
});
