// Measurement engine: pure TypeScript shared by the viewer and the CLI (no DOM, no Node APIs).

export { findEdges, edgeList, edgeLists, type EdgeOptions } from './edges';
export { logicEdges } from './logicEdges';
export { vectorBitEdges, walkVectorBits, declaredBit } from './vectorBitEdges';
export { type BitEvents } from './settle';
export { EdgeCollector } from './edgeCollector';
export { measureDelay, pairEdges, pairListOf, PAIR_KINDS, UNPAIRED_REASONS, type DelayLists, type DelayOptions, type PairList } from './delay';
export { measureSkew, type SkewOptions } from './skew';
export { findGlitches, glitchOrder, glitchResult, glitchTargets, GlitchSink, PulseFinder, scanGlitches, type GlitchOptions, type GlitchScan } from './glitches';
export { parseLevel, levelValue, LevelSyntaxError, MESIAL, type LevelSpec } from './level';
export { histogramStateLevels, HISTOGRAM_BINS, MIN_HISTOGRAM_SAMPLES, type StateLevels } from './stateLevels';
export { BOUNDARY_PERCENT, LOWER_PERCENT, UPPER_PERCENT } from './realEdges';
export { MeasureError } from './errors';
export { secondsOf, ticksToSeconds, secondsToTicks, windowTicks } from './ticks';
export * from './types';
