// The trace canvas: one pixi Application drawn on demand (no ticker). Two layers are rebuilt
// separately so moving a cursor never re-decimates traces: the scene (bands, grid, traces,
// ruler, markers) and the overlay (cursors, the range being dragged, the snap hint).
// Geometry is rebuilt in screen pixels each time the window moves, from decimated spans, so
// a frame costs what the canvas shows, not what the dump holds.

import 'pixi.js/unsafe-eval';
import { Application, type Renderer } from 'pixi.js';
import type { Dump } from '../model/dump';
import { Spans, Trace, type Window, decimateAnalog, decimateSteps } from './decimate';
import { type AnalogScale, type Body, Z, labelAnalogRange, paintAnalog, paintLogic, paintValues } from './paint';
import { formatReal } from './radix';
import { Pen } from './pen';
import { rulerMarks } from './ruler';
import { Sink, charWidth, installFont } from './sink';
import type { Summary } from './summary';
import type { Theme } from './theme';

export const RULER_H = 30;

export interface LaneRow {
  key: string;
  /** Top and height in lane-area coordinates (0 = top of the first lane, before scrolling). */
  top: number;
  height: number;
  /** Height of the caption strip at the top of the lane; the trace body sits below it. */
  caption: number;
  kind: 'steps' | 'values' | 'analog' | 'group';
  summary: Summary | null;
  color: number;
  selected: boolean;
  label?: (changeIndex: number) => string;
  scale?: AnalogScale;
}

export interface SceneCursor {
  tick: number;
  name: string;
  color: number;
  active: boolean;
}

export interface Scene {
  dump: Dump | null;
  /** Tick at x = 0 and ticks per pixel. */
  t0: number;
  tpp: number;
  rows: LaneRow[];
  scrollTop: number;
  cursors: SceneCursor[];
  /** Pixel range being dragged on the ruler. */
  rangeDrag: [number, number] | null;
  /** Where a click would put the cursor (after snapping), in ticks. */
  snapHint: number | null;
  theme: Theme;
}

/** What a marker layer (measurement overlays) gets to draw with. */
export interface MarkerContext {
  pen: Pen;
  dump: Dump;
  theme: Theme;
  width: number;
  height: number;
  t0: number;
  tpp: number;
  xOf(tick: number): number;
  /** Canvas y extent of a shown lane's trace body, or null when it is not on screen. */
  body(rowKey: string): Body | null;
}

export interface MarkerLayer {
  id: string;
  draw(ctx: MarkerContext): void;
}

export interface FrameStats {
  /** Segments and rectangles in the last scene frame. */
  primitives: number;
  /** Rows painted in the last scene frame. */
  rows: number;
}

export class Stage {
  readonly markers: MarkerLayer[] = [];
  readonly stats: FrameStats = { primitives: 0, rows: 0 };
  private readonly scenePen = new Pen();
  private readonly overlayPen = new Pen();
  private readonly sceneSink: Sink;
  private readonly overlaySink: Sink;
  private readonly spans = new Spans();
  private readonly trace = new Trace();
  width = 0;
  height = 0;

  private constructor(
    readonly app: Application,
    readonly rendererName: string,
  ) {
    const webgl = rendererName === 'webgl';
    this.sceneSink = new Sink(webgl);
    this.overlaySink = new Sink(webgl);
    app.stage.addChild(this.sceneSink.container, this.overlaySink.container);
  }

  static async create(host: HTMLElement, background: number): Promise<Stage> {
    const app = new Application();
    await app.init({
      width: Math.max(1, host.clientWidth),
      height: Math.max(1, host.clientHeight),
      preference: 'webgl',
      background,
      antialias: false,
      resolution: window.devicePixelRatio || 1,
      autoDensity: true,
      autoStart: false,
      preserveDrawingBuffer: true,
    });
    installFont(window.devicePixelRatio || 1);
    app.canvas.setAttribute('aria-hidden', 'true');
    host.appendChild(app.canvas);
    const stage = new Stage(app, (app.renderer as Renderer).name);
    stage.width = app.renderer.width;
    stage.height = app.renderer.height;
    return stage;
  }

  get canvas(): HTMLCanvasElement {
    return this.app.canvas;
  }

  resize(width: number, height: number): void {
    this.width = Math.max(1, Math.floor(width));
    this.height = Math.max(1, Math.floor(height));
    this.app.renderer.resize(this.width, this.height);
  }

  setBackground(color: number): void {
    this.app.renderer.background.color = color;
  }

  /** Rebuilds the layers asked for and shows the frame. */
  draw(scene: Scene, rebuildScene: boolean, rebuildOverlay: boolean): void {
    if (rebuildScene) {
      this.paintScene(scene);
      this.sceneSink.commit(this.scenePen);
    }
    if (rebuildOverlay) {
      this.paintOverlay(scene);
      this.overlaySink.commit(this.overlayPen);
    }
    this.app.render();
  }

  /** Canvas y range of a row's trace body, or null when scrolled out of sight. */
  bodyOf(row: LaneRow, scrollTop: number): Body | null {
    const top = RULER_H + row.top - scrollTop + row.caption;
    const bottom = RULER_H + row.top - scrollTop + row.height - 3;
    if (bottom < RULER_H || top > this.height) return null;
    return { top, bottom };
  }

  private paintScene(scene: Scene): void {
    const pen = this.scenePen;
    pen.reset();
    const { theme, dump } = scene;
    const W = this.width;
    const H = this.height;
    const w: Window = { t0: scene.t0, tpp: scene.tpp, width: W };
    let rows = 0;
    // Lane bands first: alternate shading so a lane's caption and trace read as one.
    const alt = pen.rects(Z.band, theme.laneAlt);
    const sel = pen.rects(Z.band, theme.laneSelected);
    scene.rows.forEach((row, k) => {
      const y = RULER_H + row.top - scene.scrollTop;
      if (y + row.height < RULER_H || y > H) return;
      if (row.selected) sel.rect(0, y, W, row.height);
      else if (k % 2 === 1) alt.rect(0, y, W, row.height);
    });
    const tickSeconds = dump ? dump.timescale.seconds : 1e-9;
    const marks = rulerMarks(scene.t0 * tickSeconds, scene.tpp * tickSeconds, W);
    const grid = pen.lines(Z.grid, theme.grid);
    for (const m of marks) if (m.label) grid.seg(Math.floor(m.x) + 0.5, RULER_H, Math.floor(m.x) + 0.5, H);
    if (dump) {
      // Time outside the dump (before 0, after the end) is dimmed.
      const shade = pen.rects(Z.grid, theme.grid, 0.45);
      const x0 = (0 - scene.t0) / scene.tpp;
      const xe = (dump.endTick - scene.t0) / scene.tpp;
      if (x0 > 0) shade.rect(0, RULER_H, Math.min(W, x0), H - RULER_H);
      if (xe < W) shade.rect(Math.max(0, xe), RULER_H, W - Math.max(0, xe), H - RULER_H);
      for (const row of scene.rows) {
        if (!row.summary) continue;
        const body = this.bodyOf(row, scene.scrollTop);
        if (!body || body.bottom < RULER_H + 2) continue;
        rows++;
        const s = row.summary;
        if (s.kind === 'analog') {
          decimateAnalog(dump, s, w, this.trace);
          const scale = row.scale ?? { lo: s.lo, hi: s.hi, ref: (s.lo + s.hi) / 2 };
          paintAnalog(pen, this.trace, body, row.color, theme, W, scale);
          if (body.bottom - body.top > 40) labelAnalogRange(pen, body, theme, W, scale, formatReal);
        } else {
          decimateSteps(dump, s, w, this.spans);
          if (row.kind === 'values') paintValues(pen, this.spans, body, row.color, theme, W, charWidth, row.label ?? (() => ''));
          else paintLogic(pen, this.spans, body, row.color, theme, W);
        }
      }
      if (this.markers.length) {
        const byKey = new Map(scene.rows.map((r) => [r.key, r]));
        const ctx: MarkerContext = {
          pen,
          dump,
          theme,
          width: W,
          height: H,
          t0: scene.t0,
          tpp: scene.tpp,
          xOf: (tick) => (tick - scene.t0) / scene.tpp,
          body: (key) => {
            const r = byKey.get(key);
            return r ? this.bodyOf(r, scene.scrollTop) : null;
          },
        };
        for (const m of this.markers) m.draw(ctx);
      }
    }
    // Labels of lanes scrolled under the ruler would show through it.
    pen.texts = pen.texts.filter((t) => t.y > RULER_H + 5);
    // The ruler sits on top of everything that scrolls.
    pen.rects(Z.ruler, theme.rulerBg).rect(0, 0, W, RULER_H);
    const ink = pen.lines(Z.rulerInk, theme.rulerInk);
    const minor = pen.lines(Z.rulerInk, theme.rulerMinor);
    ink.seg(0, RULER_H - 0.5, W, RULER_H - 0.5);
    for (const m of marks) {
      const x = Math.floor(m.x) + 0.5;
      if (m.label) {
        ink.seg(x, RULER_H - 11, x, RULER_H);
        pen.text(m.label, x + 4, 10, theme.rulerInk, 0);
      } else minor.seg(x, RULER_H - 5, x, RULER_H);
    }
    this.stats.primitives = pen.primitives;
    this.stats.rows = rows;
  }

  private paintOverlay(scene: Scene): void {
    const pen = this.overlayPen;
    pen.reset();
    const { theme } = scene;
    const W = this.width;
    const H = this.height;
    if (scene.rangeDrag) {
      const [a, b] = scene.rangeDrag;
      const l = Math.min(a, b);
      const r = Math.max(a, b);
      pen.rects(Z.band, theme.span, 0.14).rect(l, 0, r - l, H);
      const edge = pen.lines(Z.trace, theme.span);
      edge.seg(Math.floor(l) + 0.5, 0, Math.floor(l) + 0.5, H);
      edge.seg(Math.floor(r) + 0.5, 0, Math.floor(r) + 0.5, H);
    }
    if (scene.snapHint !== null) {
      const x = Math.floor((scene.snapHint - scene.t0) / scene.tpp) + 0.5;
      if (x >= 0 && x <= W) {
        const hint = pen.lines(Z.marker, theme.muted, 0.8);
        for (let y = RULER_H; y < H; y += 6) hint.seg(x, y, x, Math.min(H, y + 3));
      }
    }
    for (const c of scene.cursors) {
      const x = (c.tick - scene.t0) / scene.tpp;
      if (!(x >= -40 && x <= W + 40)) continue;
      const xl = Math.floor(x);
      if (c.active) pen.rects(Z.trace, c.color).rect(xl, RULER_H, 2, H - RULER_H);
      else {
        const dash = pen.lines(Z.trace, c.color);
        for (let y = RULER_H; y < H; y += 8) dash.seg(xl + 0.5, y, xl + 0.5, Math.min(H, y + 5));
      }
      // A flag in the ruler carries the cursor's name.
      const wText = c.name.length * charWidth + 8;
      pen.rects(Z.ruler, c.color).rect(xl, RULER_H - 14, wText, 14);
      pen.rects(Z.ruler, c.color).rect(xl, RULER_H - 14, 2, 14);
      pen.text(c.name, xl + 4, RULER_H - 7, theme.background, 0);
    }
  }
}
