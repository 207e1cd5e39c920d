// The measurement plan: midrail's own versioned JSON format, saved by the viewer and run by
// `midrail check`. Times, frequencies and percentages are written with their units, as a person
// types them; src/plan/limits.ts turns them into SI numbers. The JSON Schema beside this file
// (midrail-plan.schema.json) describes the same shape for editors and is what validation enforces.

export const PLAN_FORMAT = 'midrail-plan';
export const PLAN_VERSION = 1;

/** Which edges count: for delay, the output (`to`) edge; for skew, every net's edges. */
export type EdgeChoice = 'rise' | 'fall' | 'any';

interface SpecCommon {
  id: string;
  description?: string;
}

export interface DelaySpec extends SpecCommon {
  kind: 'delay';
  from: string;
  to: string;
  edge?: EdgeChoice;
  window?: string;
  level?: string;
  min?: string;
  max?: string;
}

export interface SkewSpec extends SpecCommon {
  kind: 'skew';
  nets: string | string[];
  edge?: EdgeChoice;
  window?: string;
  ref?: string;
  level?: string;
  min?: string;
  max?: string;
}

export interface GlitchSpec extends SpecCommon {
  kind: 'glitch';
  nets?: string | string[];
  max_width: string;
  level?: string;
  /** Limits on the number of glitches found. */
  min?: number;
  max?: number;
}

export interface PulseWidthSpec extends SpecCommon {
  kind: 'pulse-width';
  net: string;
  polarity?: 'high' | 'low';
  level?: string;
  min?: string;
  max?: string;
}

export type PeriodQuantity = 'period' | 'frequency' | 'duty' | 'jitter';

export interface PeriodSpec extends SpecCommon {
  kind: 'period';
  net: string;
  edge?: 'rise' | 'fall';
  quantity?: PeriodQuantity;
  level?: string;
  /** In the unit of `quantity`: a time, a frequency (100MHz) or a percentage (45%). */
  min?: string;
  max?: string;
}

export type MeasurementSpec = DelaySpec | SkewSpec | GlitchSpec | PulseWidthSpec | PeriodSpec;
export type MeasurementKind = MeasurementSpec['kind'];

export interface Plan {
  $schema?: string;
  format: typeof PLAN_FORMAT;
  version: typeof PLAN_VERSION;
  name?: string;
  description?: string;
  /** Reference level per net name or glob: `50%` of the swing or an absolute `1.5V`. */
  levels?: Record<string, string>;
  measurements: MeasurementSpec[];
}
