// Result shapes. Every `…Result` is plain JSON-able data whose fields are the CLI's `--json`
// contract (snake_case, times in seconds with an `_s` suffix). EdgeList is the internal form in
// typed arrays and ticks, which the viewer can draw from without measuring again.

/** Direction codes stored in EdgeList.dir. */
export const EdgeDir = { Fall: 0, Rise: 1, Change: 2 } as const;
export type EdgeDirCode = (typeof EdgeDir)[keyof typeof EdgeDir];
export type EdgeName = 'rise' | 'fall' | 'change';
export const EDGE_NAMES: readonly EdgeName[] = ['fall', 'rise', 'change'];

export type StateMethod = 'histogram-mode' | 'min-max' | 'user';

/** IEEE 181 state levels of a real-valued net and the reference levels derived from them. */
export interface RealLevels {
  low: number;
  high: number;
  method: StateMethod;
  /** Reference level (the edge instant), lower and upper reference levels (10 %, 90 %), state-boundary half-width. */
  reference: number;
  lower: number;
  upper: number;
  boundary: number;
  /** Shortest interval between successive samples, in ticks: a held value ramps to the next sample over it. */
  sampleTicks: number;
}

/**
 * Every edge of one net, in ticks. Same-timestamp changes are collapsed to the settled value first.
 * Real-net edge ticks are fractional (interpolated).
 */
export interface EdgeList {
  label: string;
  /** What the edges came from: a 1-bit net (or a bit of a vector), a whole vector, a real, or an event/string net. */
  source: 'logic' | 'vector' | 'real' | 'other';
  count: number;
  ticks: Float64Array;
  dir: Uint8Array;
  /** Real nets: 10–90 % transition duration per edge in ticks (NaN where not measurable). Otherwise null. */
  transition: Float64Array | null;
  /** Unknown spans (x, z, U, W, -, or NaN on a real): [start, end) tick pairs; end is NaN if the dump ends inside. */
  unknown: number[];
  /** Logic code (index into LOGIC_CHARS) that opened each unknown span; -1 for vectors and reals. */
  unknownState: number[];
  /** Ticks at which several changes at one timestamp left the net where it started. */
  zeroWidth: number[];
  /** Real nets: runts as (first reference crossing, last return crossing, direction of the excursion) triples. */
  runts: number[];
  levels: RealLevels | null;
}

/**
 * Every EdgeList is made through here, so all share one object shape: loops that read many of them
 * (glitch search over every net) stay monomorphic in the JIT instead of deoptimising.
 */
class EdgeListData implements EdgeList {
  constructor(
    public label: string,
    public source: EdgeList['source'],
    public count: number,
    public ticks: Float64Array,
    public dir: Uint8Array,
    public transition: Float64Array | null,
    public unknown: number[],
    public unknownState: number[],
    public zeroWidth: number[],
    public runts: number[],
    public levels: RealLevels | null,
  ) {}
}

export function edgeListOf(f: EdgeList): EdgeList {
  return new EdgeListData(f.label, f.source, f.count, f.ticks, f.dir, f.transition, f.unknown, f.unknownState, f.zeroWidth, f.runts, f.levels);
}

export interface UnknownSpan {
  net: string;
  start_s: number;
  /** null: the dump ends inside the span. */
  end_s: number | null;
  /** The state that opened the span (x, z, U, W, -) for 1-bit nets. */
  state?: string;
  /** true when the span is a $dumpoff interval (no data), not an x the simulator produced. */
  dumpoff?: boolean;
}

export interface EdgeRecord {
  time_s: number;
  edge: EdgeName;
  /** Real nets: 10–90 % transition duration (null if the edge has no measurable one). */
  transition_s?: number | null;
}

export interface RuntRecord {
  start_s: number;
  width_s: number;
  /** 'high' = left the low state and fell back, 'low' = left the high state and rose back. */
  polarity: 'high' | 'low';
}

export interface EdgeResult {
  net: string;
  level: string;
  /** Real nets only: the state levels used, and how they were found. */
  low?: number;
  high?: number;
  state_method?: StateMethod;
  reference_value?: number;
  edges: EdgeRecord[];
  runts?: RuntRecord[];
  zero_width_s: number[];
  unknown_spans: UnknownSpan[];
}

export type DelayKind = 'tPLH' | 'tPHL' | 'tPD';

export interface DelayPair {
  kind: DelayKind;
  from_edge: EdgeName;
  from_time_s: number;
  to_edge: EdgeName;
  to_time_s: number;
  delay_s: number;
}

export interface DelayStats {
  count: number;
  min_s: number | null;
  max_s: number | null;
  mean_s: number | null;
  /** Population standard deviation (0 for a single pair). */
  std_s: number | null;
  /** Time of the `to` edge of the longest pair. */
  worst_time_s: number | null;
}

export type UnpairedReason = 'no-from-edge' | 'from-unknown' | 'window';

export interface UnpairedEdge {
  to_edge: EdgeName;
  to_time_s: number;
  reason: UnpairedReason;
}

export interface DelayResult {
  from: string;
  to: string;
  level: string;
  window_s: number | null;
  pairs: DelayPair[];
  unpaired: number;
  unpaired_edges: UnpairedEdge[];
  tPLH: DelayStats;
  tPHL: DelayStats;
  tPD: DelayStats;
  /** max(tPLH max, tPHL max, tPD max). */
  tpd_s: number | null;
  /** Pulse skew tsk(p) = |mean tPHL − mean tPLH|, and the same for the worst (max) values. */
  tskp_s: number | null;
  tskp_worst_s: number | null;
  /** 1 / tpd_s. */
  fmax_hz: number | null;
  caution: string;
  unknown_spans: UnknownSpan[];
}

export type SkewEdge = 'rise' | 'fall' | 'any';

export interface SkewEvent {
  edge: 'rise' | 'fall' | 'change' | 'mixed';
  time_s: number;
  skew_s: number;
  edges: number;
  earliest: string;
  latest: string;
}

export interface SkewOffset {
  net: string;
  /** Mean of (this net's edge − reference net's edge) over events holding both; null if none did. */
  mean_offset_s: number | null;
  events: number;
}

export interface SkewResult {
  nets: string[];
  edge: SkewEdge;
  window_s: number;
  /** Where the window came from: given, or half the shortest edge interval of the busiest net. */
  window_source: 'given' | 'busiest-net' | 'whole-dump';
  ref: string | null;
  events: SkewEvent[];
  max_skew_s: number | null;
  mean_skew_s: number | null;
  offsets: SkewOffset[];
  unknown_spans: UnknownSpan[];
}

export type GlitchPolarity = 'high' | 'low' | 'zero-width' | 'runt';

export interface Glitch {
  net: string;
  start_s: number;
  width_s: number;
  polarity: GlitchPolarity;
}

export interface GlitchResult {
  max_width_s: number;
  nets: number;
  count: number;
  glitches: Glitch[];
  unknown_spans: UnknownSpan[];
}

/** Shown beside every tpd / fmax readout. */
export const TIMING_CAUTION =
  'Measured simulation delays are only as good as the simulation model; they do not replace static timing analysis or sign-off characterization.';
