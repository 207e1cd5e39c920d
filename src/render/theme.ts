// The two looks: "paper" (light) and "slate" (dark). Trace colours come from the Okabe–Ito
// colour-universal-design set (Okabe & Ito, 2008), adjusted in lightness per background.
// Unknown (x) and high-impedance (z) differ in shape as well as hue: x is a hatched block
// across the lane, z a dashed line at mid height, so neither relies on red against green.

export type ThemeName = 'paper' | 'slate';

export interface Theme {
  name: ThemeName;
  background: number;
  laneAlt: number;
  laneSelected: number;
  grid: number;
  rulerBg: number;
  rulerInk: number;
  rulerMinor: number;
  text: number;
  muted: number;
  /** Unknown (x) hatch and block. */
  unknown: number;
  /** High impedance (z) dashed mid line. */
  z: number;
  /** Reference level line on real lanes. */
  reference: number;
  /** Cursor line colours, one per cursor in turn. */
  cursors: number[];
  /** The highlight of a range being dragged on the ruler. */
  span: number;
  /** Trace palette; a lane stores an index into it (or a colour of its own). */
  traces: number[];
  traceNames: string[];
}

const TRACE_NAMES = ['blue', 'orange', 'sky', 'purple', 'teal', 'amber', 'ink'];

export const THEMES: Record<ThemeName, Theme> = {
  paper: {
    name: 'paper',
    background: 0xf7f4ec,
    laneAlt: 0xefeadf,
    laneSelected: 0xe2e9f3,
    grid: 0xdcd5c5,
    rulerBg: 0xe8e2d4,
    rulerInk: 0x3b3934,
    rulerMinor: 0xa49d8c,
    text: 0x2a2925,
    muted: 0x6d685d,
    unknown: 0xc8530a,
    z: 0x7a4aa8,
    reference: 0x8a8270,
    cursors: [0x1c1b19, 0x0061a0, 0xa0560b, 0x6c3d96, 0x256f66],
    span: 0x0072b2,
    traces: [0x0b5fa5, 0xb86e00, 0x2b8cc4, 0x9a3f86, 0x007a62, 0x8a7400, 0x2a2925],
    traceNames: TRACE_NAMES,
  },
  slate: {
    name: 'slate',
    background: 0x1b2130,
    laneAlt: 0x212839,
    laneSelected: 0x2b3650,
    grid: 0x2e3850,
    rulerBg: 0x141925,
    rulerInk: 0xcdd5e4,
    rulerMinor: 0x5b6781,
    text: 0xe2e7f0,
    muted: 0x98a2b6,
    unknown: 0xff8a4c,
    z: 0xc3a2ff,
    reference: 0x7d879c,
    cursors: [0xf3efe4, 0x74c0f0, 0xf2b45a, 0xd9a0ff, 0x6fd6c4],
    span: 0x74c0f0,
    traces: [0x7cc0f2, 0xf0a94a, 0xa9dcff, 0xe59ad0, 0x5fcab4, 0xe8d36a, 0xe2e7f0],
    traceNames: TRACE_NAMES,
  },
};

/** A lane colour: an index into the theme's trace palette, or a fixed '#rrggbb'. */
export type LaneColor = number | string;

export function resolveColor(theme: Theme, c: LaneColor): number {
  if (typeof c === 'number') return theme.traces[((c % theme.traces.length) + theme.traces.length) % theme.traces.length];
  const m = /^#([0-9a-fA-F]{6})$/.exec(c);
  return m ? parseInt(m[1], 16) : theme.traces[0];
}

export function cssColor(n: number): string {
  return '#' + n.toString(16).padStart(6, '0');
}
