// Turns a Pen into pixi display objects: one mesh per bucket on WebGL (line-list for
// segments, triangle-list for rectangles, built straight from the typed arrays), or one
// Graphics per bucket on the canvas fallback, where pixi draws no Mesh.

import { BitmapFont, BitmapText, Container, Graphics, Mesh, MeshGeometry, Texture } from 'pixi.js';
import type { Bucket, Pen } from './pen';

let iota = new Uint32Array(0);
let zeros = new Float32Array(0);

function ensureShared(vertices: number): void {
  if (iota.length >= vertices) return;
  let cap = Math.max(1024, iota.length);
  while (cap < vertices) cap *= 2;
  iota = Uint32Array.from({ length: cap }, (_, i) => i);
  zeros = new Float32Array(cap * 2);
}

interface MeshView {
  kind: 'mesh';
  mesh: Mesh;
  geometry: MeshGeometry;
  scratch: Float32Array;
  vertices: number;
}

interface GraphicsView {
  kind: 'graphics';
  g: Graphics;
}

type View = MeshView | GraphicsView;

function meshFor(b: Bucket): MeshView {
  ensureShared(4);
  const geometry = new MeshGeometry({
    positions: new Float32Array(4),
    uvs: new Float32Array(4),
    indices: new Uint32Array([0, 1]),
    topology: b.kind === 'lines' ? 'line-list' : 'triangle-list',
  });
  geometry.batchMode = 'no-batch';
  const mesh = new Mesh({ geometry, texture: Texture.WHITE });
  mesh.tint = b.color;
  mesh.alpha = b.alpha;
  mesh.zIndex = b.z;
  return { kind: 'mesh', mesh, geometry, scratch: new Float32Array(0), vertices: -1 };
}

function commitMesh(v: MeshView, b: Bucket): void {
  let positions: Float32Array;
  if (b.kind === 'lines') positions = b.data.subarray(0, b.n);
  else {
    const rects = b.count;
    const need = rects * 12;
    if (v.scratch.length < need) v.scratch = new Float32Array(Math.max(need, v.scratch.length * 2));
    const s = v.scratch;
    const d = b.data;
    for (let r = 0, o = 0; r < rects; r++, o += 12) {
      const x = d[r * 4];
      const y = d[r * 4 + 1];
      const x2 = x + d[r * 4 + 2];
      const y2 = y + d[r * 4 + 3];
      s[o] = x;
      s[o + 1] = y;
      s[o + 2] = x2;
      s[o + 3] = y;
      s[o + 4] = x2;
      s[o + 5] = y2;
      s[o + 6] = x;
      s[o + 7] = y;
      s[o + 8] = x2;
      s[o + 9] = y2;
      s[o + 10] = x;
      s[o + 11] = y2;
    }
    positions = s.subarray(0, need);
  }
  const vertices = positions.length / 2;
  ensureShared(vertices);
  if (vertices !== v.vertices) {
    v.geometry.uvs = zeros.subarray(0, positions.length);
    v.geometry.indices = iota.subarray(0, vertices);
    v.vertices = vertices;
  }
  v.geometry.positions = positions;
}

function commitGraphics(v: GraphicsView, b: Bucket): void {
  const g = v.g;
  g.clear();
  const d = b.data;
  if (b.kind === 'lines') {
    for (let k = 0; k < b.n; k += 4) {
      g.moveTo(d[k], d[k + 1]);
      g.lineTo(d[k + 2], d[k + 3]);
    }
    g.stroke({ width: 1, color: b.color, alpha: b.alpha, pixelLine: true });
  } else {
    for (let k = 0; k < b.n; k += 4) g.rect(d[k], d[k + 1], d[k + 2], d[k + 3]);
    g.fill({ color: b.color, alpha: b.alpha });
  }
}

export const FONT = 'midrail-mono';
export const FONT_SIZE = 11;
const FONT_STACK = 'DejaVu Sans Mono, Menlo, Consolas, Liberation Mono, monospace';

let fontReady = false;
/** Width of one character of the value font, in CSS pixels. */
export let charWidth = 7;

export function installFont(resolution: number): void {
  if (fontReady) return;
  BitmapFont.install({
    name: FONT,
    style: { fontFamily: FONT_STACK, fontSize: FONT_SIZE, fill: 0xffffff },
    chars: [[' ', '~'], '…·−µ'],
    resolution: Math.max(1, Math.ceil(resolution)),
    dynamicFill: true,
  });
  const ctx = document.createElement('canvas').getContext('2d');
  if (ctx) {
    ctx.font = `${FONT_SIZE}px ${FONT_STACK}`;
    charWidth = ctx.measureText('0000000000').width / 10;
  }
  fontReady = true;
}

/** One layer: the pen's buckets as display objects plus a pool of text labels above them. */
export class Sink {
  readonly container = new Container();
  private readonly shapes = new Container();
  private readonly labels = new Container();
  private readonly views = new Map<string, View>();
  private pool: BitmapText[] = [];

  constructor(private readonly webgl: boolean) {
    this.shapes.sortableChildren = true;
    this.container.addChild(this.shapes, this.labels);
  }

  commit(pen: Pen): void {
    for (const b of pen.buckets.values()) {
      let v = this.views.get(b.key);
      if (b.n === 0) {
        if (v) (v.kind === 'mesh' ? v.mesh : v.g).visible = false;
        continue;
      }
      if (!v) {
        if (this.webgl) v = meshFor(b);
        else {
          const g = new Graphics();
          g.zIndex = b.z;
          v = { kind: 'graphics', g };
        }
        this.views.set(b.key, v);
        this.shapes.addChild(v.kind === 'mesh' ? v.mesh : v.g);
      }
      if (v.kind === 'mesh') {
        commitMesh(v, b);
        v.mesh.visible = true;
      } else {
        commitGraphics(v, b);
        v.g.visible = true;
      }
    }
    this.commitTexts(pen);
  }

  private commitTexts(pen: Pen): void {
    const items = pen.texts;
    while (this.pool.length < items.length) {
      const t = new BitmapText({ text: '', style: { fontFamily: FONT, fontSize: FONT_SIZE } });
      this.pool.push(t);
      this.labels.addChild(t);
    }
    for (let k = 0; k < this.pool.length; k++) {
      const t = this.pool[k];
      const it = items[k];
      if (!it) {
        t.visible = false;
        continue;
      }
      if (t.text !== it.text) t.text = it.text;
      t.tint = it.color;
      t.anchor.set(it.align, 0.5);
      t.x = Math.round(it.x);
      t.y = Math.round(it.y);
      t.visible = true;
    }
  }
}
