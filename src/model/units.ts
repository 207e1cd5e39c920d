// Times with SI units: parsing what users type, and formatting for display.

const UNIT_SECONDS: Record<string, number> = { s: 1, ms: 1e-3, us: 1e-6, 'µs': 1e-6, ns: 1e-9, ps: 1e-12, fs: 1e-15 };

export class TimeSyntaxError extends Error {}

/**
 * Parses a time with a unit: `2ns`, `500ps`, `1.5us`, `3e-9s`, `10 ns`. A bare number is an
 * error, since a unitless delay is ambiguous between timescales.
 */
export function parseTime(text: string): number {
  const m = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(s|ms|us|µs|ns|ps|fs)\s*$/.exec(text);
  if (!m) {
    if (/^\s*[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?\s*$/.test(text)) {
      throw new TimeSyntaxError(`time '${text}' has no unit; write it with one of s, ms, us, ns, ps, fs (for example 2ns)`);
    }
    throw new TimeSyntaxError(`cannot read '${text}' as a time; expected a number and a unit such as 2ns, 500ps, 1.5us or 3e-9s`);
  }
  return Number(m[1]) * UNIT_SECONDS[m[2]];
}

const PREFIXES: Array<[number, string]> = [
  [1, 's'],
  [1e-3, 'ms'],
  [1e-6, 'us'],
  [1e-9, 'ns'],
  [1e-12, 'ps'],
  [1e-15, 'fs'],
];

/** Picks the largest SI unit in which |seconds| is at least 1 (fs for anything smaller). */
export function unitFor(seconds: number): [number, string] {
  const a = Math.abs(seconds);
  for (const p of PREFIXES) if (a >= p[0] * 0.9999999) return p;
  return PREFIXES[PREFIXES.length - 1];
}

/** `1.25 ns`, with up to `digits` significant digits and trailing zeros removed. */
export function formatTime(seconds: number, digits = 6): string {
  if (!Number.isFinite(seconds)) return String(seconds);
  if (seconds === 0) return '0 s';
  const [scale, unit] = unitFor(seconds);
  const v = Number((seconds / scale).toPrecision(digits));
  return `${v} ${unit}`;
}

/** `500 MHz` for a frequency in Hz. */
export function formatFrequency(hz: number, digits = 4): string {
  if (!Number.isFinite(hz) || hz <= 0) return '—';
  const units: Array<[number, string]> = [
    [1e12, 'THz'],
    [1e9, 'GHz'],
    [1e6, 'MHz'],
    [1e3, 'kHz'],
    [1, 'Hz'],
  ];
  for (const [scale, unit] of units) if (hz >= scale) return `${Number((hz / scale).toPrecision(digits))} ${unit}`;
  return `${Number(hz.toPrecision(digits))} Hz`;
}
