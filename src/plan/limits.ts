// What each measurement kind limits, in which unit, and the limit values as SI numbers.

import { parseTime } from '../model/units';
import type { MeasurementSpec, PeriodQuantity } from './types';

/** Units of measured values in results: seconds, hertz, percent of the period, or a count. */
export type ValueUnit = 's' | 'Hz' | '%' | 'count';

export interface Limits {
  /** What the limits apply to, in the trade's words (`delay`, `duty cycle`, ...). */
  quantity: string;
  unit: ValueUnit;
  min: number | null;
  max: number | null;
  /** Limits as written in the plan, for messages. */
  minText: string | null;
  maxText: string | null;
}

const FREQ_UNITS: Record<string, number> = { Hz: 1, kHz: 1e3, MHz: 1e6, GHz: 1e9, THz: 1e12 };

export class LimitSyntaxError extends Error {}

export function parseFrequency(text: string): number {
  const m = /^\s*\+?((?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(Hz|kHz|MHz|GHz|THz)\s*$/.exec(text);
  if (!m) throw new LimitSyntaxError(`cannot read '${text}' as a frequency; expected a number and a unit such as 100MHz`);
  return Number(m[1]) * FREQ_UNITS[m[2]];
}

export function parsePercent(text: string): number {
  const m = /^\s*\+?((?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*%\s*$/.exec(text);
  if (!m) throw new LimitSyntaxError(`cannot read '${text}' as a percentage; expected a number and % such as 45%`);
  return Number(m[1]);
}

const PERIOD_QUANTITY: Record<PeriodQuantity, { quantity: string; unit: ValueUnit }> = {
  period: { quantity: 'period', unit: 's' },
  frequency: { quantity: 'frequency', unit: 'Hz' },
  duty: { quantity: 'duty cycle', unit: '%' },
  jitter: { quantity: 'cycle-to-cycle jitter', unit: 's' },
};

export function quantityOf(spec: MeasurementSpec): { quantity: string; unit: ValueUnit } {
  switch (spec.kind) {
    case 'delay':
      return { quantity: 'delay', unit: 's' };
    case 'skew':
      return { quantity: 'skew', unit: 's' };
    case 'glitch':
      return { quantity: 'glitch count', unit: 'count' };
    case 'pulse-width':
      return { quantity: 'pulse width', unit: 's' };
    case 'period':
      return PERIOD_QUANTITY[spec.quantity ?? 'period'];
  }
}

/** 12 significant digits: `20.01ns` is 2.001e-8, not 2.0010000000000002e-8. */
function decimal(x: number): number {
  return Number.isFinite(x) && x !== 0 ? Number(x.toPrecision(12)) : x;
}

function limitValue(unit: ValueUnit, v: string | number): number {
  if (typeof v === 'number') return v;
  if (unit === 's') return decimal(parseTime(v));
  if (unit === 'Hz') return decimal(parseFrequency(v));
  if (unit === '%') return decimal(parsePercent(v));
  throw new LimitSyntaxError(`a count limit is a whole number, not '${v}'`);
}

/** The limits of a measurement that already passed schema validation. */
export function limitsOf(spec: MeasurementSpec): Limits {
  const { quantity, unit } = quantityOf(spec);
  const min = spec.min ?? null;
  const max = spec.max ?? null;
  return {
    quantity,
    unit,
    min: min === null ? null : limitValue(unit, min),
    max: max === null ? null : limitValue(unit, max),
    minText: min === null ? null : String(min).trim(),
    maxText: max === null ? null : String(max).trim(),
  };
}
