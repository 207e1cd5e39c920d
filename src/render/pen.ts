// A frame's drawing as plain typed arrays, sorted into buckets by layer, colour and alpha.
// Lane drawing code writes here without knowing about pixi; the sink turns each bucket into one
// draw call (a line-list or triangle-list mesh on WebGL, Graphics on the canvas fallback).

export type BucketKind = 'lines' | 'rects';

export class Bucket {
  /** lines: x0 y0 x1 y1 per segment; rects: x y w h per rectangle. */
  data = new Float32Array(256);
  n = 0;
  constructor(
    readonly key: string,
    readonly z: number,
    readonly kind: BucketKind,
    readonly color: number,
    readonly alpha: number,
  ) {}

  private ensure(more: number): void {
    if (this.n + more <= this.data.length) return;
    let cap = this.data.length * 2;
    while (cap < this.n + more) cap *= 2;
    const next = new Float32Array(cap);
    next.set(this.data.subarray(0, this.n));
    this.data = next;
  }

  /** A segment (kind 'lines'). */
  seg(x0: number, y0: number, x1: number, y1: number): void {
    this.ensure(4);
    const d = this.data;
    const k = this.n;
    d[k] = x0;
    d[k + 1] = y0;
    d[k + 2] = x1;
    d[k + 3] = y1;
    this.n = k + 4;
  }

  /** A filled rectangle (kind 'rects'). */
  rect(x: number, y: number, w: number, h: number): void {
    if (w <= 0 || h <= 0) return;
    this.ensure(4);
    const d = this.data;
    const k = this.n;
    d[k] = x;
    d[k + 1] = y;
    d[k + 2] = w;
    d[k + 3] = h;
    this.n = k + 4;
  }

  get count(): number {
    return this.n / 4;
  }
}

export interface TextItem {
  text: string;
  x: number;
  y: number;
  color: number;
  /** 0 = left, 0.5 = centre, 1 = right of x. */
  align: number;
}

export class Pen {
  readonly buckets = new Map<string, Bucket>();
  texts: TextItem[] = [];

  private bucket(z: number, kind: BucketKind, color: number, alpha: number): Bucket {
    const a = Math.round(alpha * 100) / 100;
    const key = `${z}|${kind}|${color}|${a}`;
    let b = this.buckets.get(key);
    if (!b) {
      b = new Bucket(key, z, kind, color, a);
      this.buckets.set(key, b);
    }
    return b;
  }

  lines(z: number, color: number, alpha = 1): Bucket {
    return this.bucket(z, 'lines', color, alpha);
  }

  rects(z: number, color: number, alpha = 1): Bucket {
    return this.bucket(z, 'rects', color, alpha);
  }

  text(text: string, x: number, y: number, color: number, align = 0): void {
    this.texts.push({ text, x, y, color, align });
  }

  /** Empties every bucket but keeps them (and their arrays) for the next frame. */
  reset(): void {
    for (const b of this.buckets.values()) b.n = 0;
    this.texts = [];
  }

  /** Segments plus rectangles: the size of the frame. */
  get primitives(): number {
    let n = 0;
    for (const b of this.buckets.values()) n += b.count;
    return n;
  }
}

/** Diagonal hatch inside a rectangle, anchored to the pixel grid so neighbouring blocks line up. */
export function hatch(b: Bucket, x0: number, y0: number, x1: number, y1: number, spacing = 5): void {
  if (x1 - x0 < 0.5 || y1 - y0 < 0.5) return;
  // Lines x - y = k·spacing, clipped to the rectangle.
  const kLo = Math.ceil((x0 - y1) / spacing);
  const kHi = Math.floor((x1 - y0) / spacing);
  for (let k = kLo; k <= kHi; k++) {
    const c = k * spacing;
    const ya = Math.max(y0, x0 - c);
    const yb = Math.min(y1, x1 - c);
    if (yb - ya < 0.5) continue;
    b.seg(c + ya, ya, c + yb, yb);
  }
}

/** Dashed horizontal line, dashes anchored to the pixel grid. */
export function dashed(b: Bucket, x0: number, x1: number, y: number, on = 4, off = 3): void {
  const period = on + off;
  let x = Math.floor(x0 / period) * period;
  for (; x < x1; x += period) {
    const a = Math.max(x, x0);
    const e = Math.min(x + on, x1);
    if (e > a) b.seg(a, y, e, y);
  }
}
