// Reference levels for real-valued nets: a percentage of the net's own swing (IEEE 181-2011 percent
// reference level: low state = 0 %, high state = 100 %) or an absolute value in volts.

export class LevelSyntaxError extends Error {}

export type LevelSpec =
  | { kind: 'percent'; percent: number; text: string }
  | { kind: 'absolute'; value: number; text: string };

export const MESIAL: LevelSpec = { kind: 'percent', percent: 50, text: '50%' };

const PERCENT = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*%\s*$/;
const VOLTS = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(V|mV|uV|µV)\s*$/;
const VOLT_SCALE: Record<string, number> = { V: 1, mV: 1e-3, uV: 1e-6, 'µV': 1e-6 };

/** `50%`, `30 %`, `1.5V`, `1500mV`. A bare number is an error: percent or volts must be said. */
export function parseLevel(text: string): LevelSpec {
  const p = PERCENT.exec(text);
  if (p) {
    const percent = Number(p[1]);
    if (!(percent > 0 && percent < 100)) {
      throw new LevelSyntaxError(`reference level '${text}' must lie strictly between 0% and 100% of the swing`);
    }
    return { kind: 'percent', percent, text: `${percent}%` };
  }
  const v = VOLTS.exec(text);
  if (v) {
    const value = Number(v[1]) * VOLT_SCALE[v[2]];
    return { kind: 'absolute', value, text: `${Number(v[1])}${v[2]}` };
  }
  throw new LevelSyntaxError(
    `cannot read '${text}' as a reference level; expected a percentage of the swing such as 50% or a value in volts such as 1.5V`,
  );
}

/** The level's value for a net whose state levels are `low` and `high`. */
export function levelValue(spec: LevelSpec, low: number, high: number): number {
  return spec.kind === 'percent' ? low + (spec.percent / 100) * (high - low) : spec.value;
}
