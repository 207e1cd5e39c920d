// Results of running a plan: the `midrail check --json` document, which `midrail merge` reads
// back. Plain JSON; times in seconds carry an `_s` suffix, other values carry their `unit`.

import type { ValueUnit } from './limits';
import type { MeasurementKind } from './types';

export const CHECK_RESULT_FORMAT = 'midrail-check-result';
export const CHECK_RESULT_VERSION = 1;

/** One edge pair, skew event, glitch, pulse or cycle among the worst of a measurement. */
export interface WorstItem {
  /** When it happened: the `to` edge of a pair, an event's first edge, a pulse's or cycle's start. */
  time_s: number;
  value: number;
  /** Distance to the nearest limit in `unit` (negative: violated); null without limits. */
  margin: number | null;
  /** What it is, for people: `tPHL top.a rise → top.y fall`. */
  what: string;
}

export type OutcomeStatus = 'pass' | 'fail' | 'error';

export interface MeasurementOutcome {
  id: string;
  kind: MeasurementKind;
  quantity: string;
  unit: ValueUnit;
  status: OutcomeStatus;
  /** One line: the verdict with the worst item's value, time and margin, or the error. */
  message: string;
  limit_min: number | null;
  limit_max: number | null;
  /** Items examined (pairs, events, glitches, pulses, cycles). */
  count: number;
  violations: number;
  min: number | null;
  max: number | null;
  mean: number | null;
  /** The value of the item nearest to (or furthest past) a limit; without limits, the largest (smallest for pulse width). */
  worst: number | null;
  worst_time_s: number | null;
  margin: number | null;
  /** Up to WORST_KEPT items, worst first. */
  worst_items: WorstItem[];
  /** Kind-specific figures (tPLH/tPHL statistics, window used, unknown spans, ...). */
  details: Record<string, unknown>;
  elapsed_s: number;
}

export interface DumpCheck {
  /** Path as given on the command line. */
  file: string;
  bytes: number;
  sha256: string | null;
  timescale: string | null;
  end_s: number | null;
  /** Bad input for the whole dump (unreadable, truncated); measurements is then empty. */
  error: string | null;
  warnings: string[];
  elapsed_s: number;
  measurements: MeasurementOutcome[];
}

export interface PlanInfo {
  file: string;
  name: string | null;
  sha256: string;
  measurements: Array<{ id: string; kind: MeasurementKind; quantity: string; unit: ValueUnit }>;
}

export interface CheckSummary {
  dumps: number;
  testcases: number;
  passed: number;
  failed: number;
  errors: number;
  /** `error` if any bad input, else `fail` if any limit was violated, else `pass`. */
  status: OutcomeStatus;
}

export interface CheckDocument {
  format: typeof CHECK_RESULT_FORMAT;
  format_version: typeof CHECK_RESULT_VERSION;
  tool: 'midrail';
  tool_version: string;
  generated_at: string;
  hostname: string;
  plan: PlanInfo;
  dumps: DumpCheck[];
  summary: CheckSummary;
  caution: string;
}

export const WORST_KEPT = 10;

export function summarize(dumps: DumpCheck[]): CheckSummary {
  let testcases = 0;
  let passed = 0;
  let failed = 0;
  let errors = 0;
  for (const d of dumps) {
    if (d.error !== null) {
      testcases++;
      errors++;
      continue;
    }
    for (const m of d.measurements) {
      testcases++;
      if (m.status === 'pass') passed++;
      else if (m.status === 'fail') failed++;
      else errors++;
    }
  }
  const status: OutcomeStatus = errors > 0 ? 'error' : failed > 0 ? 'fail' : 'pass';
  return { dumps: dumps.length, testcases, passed, failed, errors, status };
}

/** Exit code of check and merge: 0 every limit holds, 1 a limit is violated, 2 bad input. */
export function exitCodeOf(summary: CheckSummary): number {
  return summary.status === 'error' ? 2 : summary.status === 'fail' ? 1 : 0;
}
