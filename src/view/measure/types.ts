// What the measuring worker hands the page: every measured item (delay pair, skew event, glitch)
// as parallel typed arrays, so the canvas can binary-search the visible window and the table can
// show a million rows without a million objects. Figures beside them are the engine's own result
// fields (the CLI's --json contract), so the panel shows exactly what `midrail` prints.
// Pure types and constants: shared by the worker and the page.

import type { DelayResult, SkewOffset } from '../../measure/types';
import type { MeasurementOutcome } from '../../plan/result';
import type { ValueUnit } from '../../plan/limits';

/** A measured net as the page finds its lane: the dump's signal index and, for one bit, its index. */
export interface NetPick {
  label: string;
  signal: number;
  bit: number | null;
}

/** Id of the background glitch scan (in sheet rows, and in plans that limit the glitch count). */
export const GLITCH_SCAN_ID = 'glitch-scan';

/** Item flags. */
export const JUDGED = 1; // counts toward the limits (a delay's output edge matches the chosen edge)
export const VIOLATES = 2; // breaks a limit

/**
 * Every item of a measurement. Ticks are for drawing; `time` and `value` are seconds exactly as the
 * engine reports them (the CLI's `to_time_s`/`delay_s`, `time_s`/`skew_s`, `start_s`/`width_s`).
 * Items are in time order; `start` and `end` are both non-decreasing for delay pairs and glitches
 * of one net, which is what the canvas binary-searches.
 */
export interface Items {
  count: number;
  /** Cause edge of a pair, earliest edge of a skew event, start of a glitch (ticks). */
  start: Float64Array;
  /** Effect edge, latest edge, end of a glitch (ticks). */
  end: Float64Array;
  /** Seconds: the time column the CLI prints. */
  time: Float64Array;
  /** Seconds: delay, skew or glitch width. */
  value: Float64Array;
  /** Delay: index into PAIR_KINDS (tPLH, tPHL, tPD); skew: SKEW_KINDS; glitch: GLITCH_KINDS. */
  kind: Uint8Array;
  /** JUDGED | VIOLATES per item. */
  flags: Uint8Array;
}

export const SKEW_KINDS = ['fall', 'rise', 'change', 'mixed'] as const;
export const GLITCH_KINDS = ['low', 'high', 'zero-width', 'runt'] as const;
export const EDGE_WORDS = ['fall', 'rise', 'change'] as const;

export interface LimitValues {
  min: number | null;
  max: number | null;
  unit: ValueUnit;
}

interface ViewBase {
  id: string;
  limits: LimitValues;
  violations: number;
  judged: number;
  /** The plan verdict (as `midrail check` gives it) when the measurement has limits. */
  outcome: MeasurementOutcome | null;
  items: Items;
}

/** The engine's delay figures without its per-item lists; unknown spans as a count. */
export type DelayFigures = Omit<DelayResult, 'from' | 'to' | 'pairs' | 'unpaired_edges' | 'unknown_spans'> & { unknown_spans: number };

export interface DelayView extends ViewBase {
  kind: 'delay';
  from: NetPick;
  to: NetPick;
  figures: DelayFigures;
  /** Direction of each pair's cause edge (EDGE_WORDS index). */
  fromDir: Uint8Array;
}

export interface SkewFigures {
  edge: string;
  window_s: number;
  window_source: string;
  ref: string | null;
  max_skew_s: number | null;
  mean_skew_s: number | null;
  offsets: SkewOffset[];
  unknown_spans: number;
}

export interface SkewView extends ViewBase {
  kind: 'skew';
  nets: NetPick[];
  figures: SkewFigures;
  /** Number of edges in each event, and which nets (indices into `nets`) were earliest and latest. */
  edges: Int32Array;
  earliest: Int32Array;
  latest: Int32Array;
}

/** Where the glitch width came from. */
export interface WidthChoice {
  seconds: number;
  source: 'given' | 'clock' | 'fallback';
  /** The clock-like net and its period, when the width came from one. */
  clock: string | null;
  periodS: number | null;
}

export interface GlitchView {
  kind: 'glitch-scan';
  width: WidthChoice;
  /** Every searched net or bit; `target` of each glitch indexes this. */
  targets: NetPick[];
  /** Net path of each target (bits of one vector share it), for the drawer's counts. */
  paths: string[];
  target: Int32Array;
  items: Items;
  /** Glitch indices grouped by target (CSR): byTarget[targetStart[t] .. targetStart[t+1]) in time order. */
  targetStart: Int32Array;
  byTarget: Int32Array;
  /**
   * Start and end ticks of those glitches in the same order (startByTarget[j] is the start of
   * glitch byTarget[j]): the canvas walks each lane's glitches in order, and reading them from
   * one run of memory instead of through byTarget keeps that walk out of cache misses.
   */
  startByTarget: Float64Array;
  endByTarget: Float64Array;
  elapsedMs: number;
}

/** A plan measurement the viewer has no drawing for (pulse width, period, a glitch count): its verdict only. */
export interface VerdictView {
  kind: 'verdict';
  id: string;
  outcome: MeasurementOutcome;
}

export type MeasureView = DelayView | SkewView | VerdictView;

export type RunResult = { ok: true; view: MeasureView } | { ok: false; error: string };
