// Lane painters: decimated spans and traces → segments and rectangles in a Pen.
// Pure (no pixi), so geometry can be checked in unit tests.

import { DENSE, type Spans, type Trace } from './decimate';
import { type Pen, dashed, hatch } from './pen';
import { Cls } from './summary';
import type { Theme } from './theme';

/** Draw order inside a layer. */
export const Z = {
  band: 0,
  grid: 1,
  fill: 2,
  hatch: 3,
  reference: 4,
  trace: 5,
  marker: 6,
  ruler: 7,
  rulerInk: 8,
} as const;

/** Vertical extent of a lane's trace body in canvas pixels. */
export interface Body {
  top: number;
  bottom: number;
}

const px = (v: number) => Math.floor(v) + 0.5;
const UNKNOWN_BITS = (1 << Cls.Unknown) | (1 << Cls.Z) | (1 << Cls.Partial);

/** A 1-bit (or event) lane: levels, x blocks, z dashes, dense activity blocks. */
export function paintLogic(pen: Pen, spans: Spans, body: Body, color: number, theme: Theme, width: number): void {
  const line = pen.lines(Z.trace, color);
  const busy = pen.rects(Z.fill, color, 0.5);
  const xFill = pen.rects(Z.fill, theme.unknown, 0.16);
  const xHatch = pen.lines(Z.hatch, theme.unknown, 0.85);
  const zLine = pen.lines(Z.trace, theme.z);
  const yHi = px(body.top);
  const yLo = px(body.bottom - 1);
  const yMid = px((body.top + body.bottom) / 2);
  let prevY: number | null = null;
  for (let k = 0; k < spans.n; k++) {
    const a = Math.max(0, spans.x0[k]);
    const b = Math.min(width, spans.x1[k]);
    if (b <= a && spans.cls[k] !== DENSE) {
      continue;
    }
    const xa = px(spans.x0[k]);
    const c = spans.cls[k];
    let y: number | null = null;
    switch (c) {
      case Cls.Low:
      case Cls.High:
        y = c === Cls.High ? yHi : yLo;
        line.seg(a, y, b, y);
        break;
      case Cls.Z:
        y = yMid;
        dashed(zLine, a, b, yMid);
        break;
      case Cls.Event:
        // An event is an instant: an upward tick with a small head.
        if (spans.x0[k] >= 0) {
          line.seg(xa, yLo, xa, yHi);
          line.seg(xa - 2, yHi + 3, xa, yHi);
          line.seg(xa + 2, yHi + 3, xa, yHi);
        }
        break;
      case DENSE: {
        const l = Math.floor(spans.x0[k]);
        const r = Math.max(l + 1, Math.ceil(spans.x1[k]));
        busy.rect(l, body.top, r - l, body.bottom - body.top);
        if (spans.mask[k] & UNKNOWN_BITS) hatch(xHatch, l, body.top, r, body.bottom);
        break;
      }
      default:
        // Unknown: a hatched block over the whole lane height.
        xFill.rect(a, body.top, b - a, body.bottom - body.top);
        hatch(xHatch, a, body.top, b, body.bottom);
        break;
    }
    if (y !== null && prevY !== null && prevY !== y && spans.x0[k] >= 0) line.seg(xa, Math.min(prevY, y) - 0.5, xa, Math.max(prevY, y) + 0.5);
    prevY = c === DENSE || c === Cls.Unknown || c === Cls.Partial ? null : y;
  }
}

/** A vector or string lane: value tiles with text, x tiles hatched, z dashed, dense blocks. */
export function paintValues(
  pen: Pen,
  spans: Spans,
  body: Body,
  color: number,
  theme: Theme,
  width: number,
  charW: number,
  label: (changeIndex: number) => string,
): void {
  const edge = pen.lines(Z.trace, color);
  const tile = pen.rects(Z.fill, color, 0.13);
  const busy = pen.rects(Z.fill, color, 0.5);
  const xFill = pen.rects(Z.fill, theme.unknown, 0.16);
  const xHatch = pen.lines(Z.hatch, theme.unknown, 0.85);
  const zLine = pen.lines(Z.trace, theme.z);
  const yHi = px(body.top);
  const yLo = px(body.bottom - 1);
  const yMid = (body.top + body.bottom) / 2;
  for (let k = 0; k < spans.n; k++) {
    const c = spans.cls[k];
    if (c === DENSE) {
      const l = Math.floor(spans.x0[k]);
      const r = Math.max(l + 1, Math.ceil(spans.x1[k]));
      busy.rect(l, body.top, r - l, body.bottom - body.top);
      if (spans.mask[k] & UNKNOWN_BITS) hatch(xHatch, l, body.top, r, body.bottom);
      continue;
    }
    const a = Math.max(0, spans.x0[k]);
    const b = Math.min(width, spans.x1[k]);
    if (b <= a) continue;
    const starts = spans.x0[k] >= 0;
    // Tiles are inset by a pixel at each change so neighbouring values read as separate.
    const ta = starts ? px(spans.x0[k]) + 1 : a;
    if (c === Cls.Z) {
      dashed(zLine, a, b, px(yMid));
      if (starts) zLine.seg(px(spans.x0[k]), yHi + 3, px(spans.x0[k]), yLo - 3);
    } else if (c === Cls.Unknown || c === Cls.Partial) {
      xFill.rect(ta, body.top, b - ta, body.bottom - body.top);
      hatch(xHatch, ta, body.top, b, body.bottom);
    } else {
      tile.rect(ta, body.top, b - ta, body.bottom - body.top);
      edge.seg(ta, yHi, b, yHi);
      edge.seg(ta, yLo, b, yLo);
    }
    if (starts) edge.seg(px(spans.x0[k]), yHi - 0.5, px(spans.x0[k]), yLo + 0.5);
    const room = Math.floor((b - ta - 8) / charW);
    if (room >= 1 && c !== Cls.Z) {
      let text = label(spans.index[k]);
      if (text.length > room) text = room >= 2 ? text.slice(0, room - 1) + '…' : '';
      if (text) pen.text(text, ta + 4, yMid, c === Cls.Value ? theme.text : theme.unknown, 0);
    }
  }
}

export interface AnalogScale {
  lo: number;
  hi: number;
  /** Reference level (50 % between lo and hi unless set). */
  ref: number;
}

/** Clips the segment (x0,y0)-(x1,y1) to x in [xa, xb]; returns false when nothing is left. */
function clipX(s: number[], xa: number, xb: number): boolean {
  let [x0, y0, x1, y1] = s;
  if ((x0 < xa && x1 < xa) || (x0 > xb && x1 > xb)) return false;
  if (x0 !== x1) {
    const slope = (y1 - y0) / (x1 - x0);
    if (x0 < xa) {
      y0 += (xa - x0) * slope;
      x0 = xa;
    }
    if (x1 > xb) {
      y1 -= (x1 - xb) * slope;
      x1 = xb;
    }
  }
  s[0] = x0;
  s[1] = y0;
  s[2] = x1;
  s[3] = y1;
  return true;
}

/** A real lane: linear plot, min–max bars in dense columns, dashed reference level. */
export function paintAnalog(pen: Pen, trace: Trace, body: Body, color: number, theme: Theme, width: number, scale: AnalogScale): void {
  const line = pen.lines(Z.trace, color);
  const ref = pen.lines(Z.reference, theme.reference, 0.9);
  const inset = 2;
  const top = body.top + inset;
  const bottom = body.bottom - 1 - inset;
  const span = scale.hi - scale.lo || 1;
  const yOf = (v: number) => bottom - ((v - scale.lo) / span) * (bottom - top);
  if (Number.isFinite(scale.ref)) dashed(ref, 0, width, px(yOf(scale.ref)), 6, 4);
  const s = [0, 0, 0, 0];
  for (let k = 0; k + 1 < trace.n; k++) {
    const v0 = trace.v[k];
    const v1 = trace.v[k + 1];
    if (!Number.isFinite(v0) || !Number.isFinite(v1)) continue;
    s[0] = trace.x[k];
    s[1] = yOf(v0);
    s[2] = trace.x[k + 1];
    s[3] = yOf(v1);
    if (clipX(s, -1, width + 1)) line.seg(s[0], s[1], s[2], s[3]);
  }
  for (let k = 0; k < trace.bars; k++) {
    const x = px(trace.bx[k]);
    line.seg(x, yOf(trace.bmax[k]) - 0.5, x, yOf(trace.bmin[k]) + 0.5);
  }
}

/** The plot's top and bottom values at the lane's right edge, so the range can be read. */
export function labelAnalogRange(pen: Pen, body: Body, theme: Theme, width: number, scale: AnalogScale, format: (v: number) => string): void {
  const top = body.top + 2;
  const bottom = body.bottom - 3;
  // Clear of the lane scroll bar at the right edge.
  pen.text(format(scale.hi), width - 20, top + 5, theme.muted, 1);
  pen.text(format(scale.lo), width - 20, bottom - 5, theme.muted, 1);
}
