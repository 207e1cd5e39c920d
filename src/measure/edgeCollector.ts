// Records what the settled-state rule finds on the bits of vectors (settle.ts) as EdgeLists, one per
// slot. Edge ticks and directions go into typed arrays that grow by doubling, and are handed out as
// views, never copied.

import { type BitEvents, NO_STATE, closeSpans, spanChange } from './settle';
import { type EdgeList, edgeListOf } from './types';

const FIRST_CAPACITY = 16;
const EMPTY_TICKS = new Float64Array(0);
const EMPTY_DIR = new Uint8Array(0);

export class EdgeCollector implements BitEvents {
  readonly count: Int32Array;
  readonly ticks: Float64Array[];
  readonly dir: Uint8Array[];
  readonly zeroWidths: number[][];
  /** Unknown spans per slot in the EdgeList form, made only for slots that have one. */
  private readonly unknown: Array<number[] | undefined>;
  private readonly unknownState: Array<number[] | undefined>;

  /** keepEdges false: unknown spans and zero-width glitches only. */
  constructor(
    slots: number,
    private readonly times: Float64Array,
    private readonly keepEdges = true,
  ) {
    this.unknown = new Array<number[] | undefined>(slots).fill(undefined);
    this.unknownState = new Array<number[] | undefined>(slots).fill(undefined);
    this.count = new Int32Array(slots);
    this.ticks = new Array<Float64Array>(slots).fill(EMPTY_TICKS);
    this.dir = new Array<Uint8Array>(slots).fill(EMPTY_DIR);
    this.zeroWidths = Array.from({ length: slots }, () => []);
  }

  edges(slotOf: Int32Array, w: number, bits: number, value: number, at: number): void {
    if (!this.keepEdges) return;
    const tick = this.times[at];
    for (let m = bits; m !== 0; ) {
      const b = 31 - Math.clz32(m);
      m ^= 1 << b;
      const slot = slotOf[(w << 5) + b];
      const k = this.count[slot];
      if (k === this.ticks[slot].length) this.resize(slot, Math.max(FIRST_CAPACITY, 2 * k));
      this.ticks[slot][k] = tick;
      this.dir[slot][k] = (value >>> b) & 1; // EdgeDir.Rise into 1, EdgeDir.Fall into 0
      this.count[slot] = k + 1;
    }
  }

  other(slot: number, at: number, prev: number, state: number, code: number): void {
    if (state <= 1 && prev === NO_STATE) return; // the first value: nothing to record
    let u = this.unknown[slot];
    if (u === undefined) {
      u = this.unknown[slot] = [];
      this.unknownState[slot] = [];
    }
    spanChange(u, this.unknownState[slot]!, this.times[at], prev, state, code);
  }

  zeroWidth(slot: number, at: number): void {
    this.zeroWidths[slot].push(this.times[at]);
  }

  private resize(slot: number, n: number): void {
    const k = this.count[slot];
    const t = new Float64Array(n);
    t.set(this.ticks[slot].subarray(0, k));
    this.ticks[slot] = t;
    const d = new Uint8Array(n);
    d.set(this.dir[slot].subarray(0, k));
    this.dir[slot] = d;
  }

  /** The slot's edges as an EdgeList of a 1-bit net or bit. */
  list(slot: number, label: string): EdgeList {
    const k = this.count[slot];
    const unknown = this.unknown[slot] ?? [];
    closeSpans(unknown);
    const unknownState = this.unknownState[slot] ?? [];
    return edgeListOf({
      label,
      source: 'logic',
      count: k,
      ticks: this.ticks[slot].subarray(0, k),
      dir: this.dir[slot].subarray(0, k),
      transition: null,
      unknown,
      unknownState,
      zeroWidth: this.zeroWidths[slot],
      runts: [],
      levels: null,
    });
  }
}
