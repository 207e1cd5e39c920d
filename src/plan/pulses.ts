// Pulse duration, period, frequency, duty cycle and cycle-to-cycle jitter of one net, from its
// edges (IEEE 181-2011 terms, via the edge instants the measurement engine places at the
// reference level, by default the mesial 50 % level):
// - pulse duration: from the leading transition's instant to the trailing one's; a high pulse is
//   a rise then a fall, a low pulse a fall then a rise;
// - period: between successive like transitions (rise to rise by default);
// - duty cycle: the high pulse's duration within the cycle divided by the period (as a percentage);
// - cycle-to-cycle jitter: |period(n+1) − period(n)| over adjacent cycles (common practice).
// A pulse or cycle that contains an unknown span (x, z, ...) is not measured: its timing is not
// defined. Work is in ticks; seconds appear only in the results.

import type { Timescale } from '../model/dump';
import { ticksToSeconds } from '../measure/ticks';
import { EdgeDir, type EdgeList } from '../measure/types';

/** Parallel arrays: when each pulse or cycle starts (the second cycle, for jitter), in seconds, and its value. */
export interface TimedValues {
  time_s: number[];
  value: number[];
}

function timedValues(): TimedValues {
  return { time_s: [], value: [] };
}

function push(t: TimedValues, time: number, value: number): void {
  t.time_s.push(time);
  t.value.push(value);
}

/** True when an unknown span overlaps the open interval (a, b) of ticks. */
function makeUnknownTest(list: EdgeList): (a: number, b: number) => boolean {
  const u = list.unknown;
  let k = 0;
  // Queries come in ascending order of a, so one pointer suffices.
  return (a, b) => {
    while (k + 1 < u.length && !Number.isNaN(u[k + 1]) && u[k + 1] <= a) k += 2;
    for (let m = k; m + 1 < u.length && u[m] < b; m += 2) {
      const end = Number.isNaN(u[m + 1]) ? Infinity : u[m + 1];
      if (end > a) return true;
    }
    return false;
  };
}

/** Durations of every pulse of one polarity. */
export function pulseDurations(list: EdgeList, ts: Timescale, polarity: 'high' | 'low'): TimedValues {
  const lead = polarity === 'high' ? EdgeDir.Rise : EdgeDir.Fall;
  const trail = polarity === 'high' ? EdgeDir.Fall : EdgeDir.Rise;
  const crossesUnknown = makeUnknownTest(list);
  const out = timedValues();
  for (let k = 0; k + 1 < list.count; k++) {
    if (list.dir[k] !== lead || list.dir[k + 1] !== trail) continue;
    const a = list.ticks[k];
    const b = list.ticks[k + 1];
    if (crossesUnknown(a, b)) continue;
    push(out, ticksToSeconds(ts, a), ticksToSeconds(ts, b - a));
  }
  return out;
}

export interface CycleFigures {
  period: TimedValues;
  frequency: TimedValues;
  duty: TimedValues;
  jitter: TimedValues;
}

/** Every complete cycle between like transitions, and the figures derived from it. */
export function cycleFigures(list: EdgeList, ts: Timescale, edge: 'rise' | 'fall'): CycleFigures {
  const like = edge === 'rise' ? EdgeDir.Rise : EdgeDir.Fall;
  const crossesUnknown = makeUnknownTest(list);
  const out: CycleFigures = { period: timedValues(), frequency: timedValues(), duty: timedValues(), jitter: timedValues() };
  let prevEnd = Number.NaN;
  let prevPeriodTicks = Number.NaN;
  let start = -1;
  for (let k = 0; k < list.count; k++) {
    if (list.dir[k] !== like) continue;
    if (start >= 0) {
      const a = list.ticks[start];
      const b = list.ticks[k];
      if (!crossesUnknown(a, b)) {
        const periodTicks = b - a;
        const t = ticksToSeconds(ts, a);
        const period = ticksToSeconds(ts, periodTicks);
        push(out.period, t, period);
        push(out.frequency, t, 1 / period);
        // High time within the cycle: from each rise to the next fall inside [a, b].
        let high = 0;
        let riseAt = like === EdgeDir.Rise ? a : Number.NaN;
        for (let m = start + 1; m < k; m++) {
          if (list.dir[m] === EdgeDir.Rise) riseAt = list.ticks[m];
          else if (list.dir[m] === EdgeDir.Fall && !Number.isNaN(riseAt)) {
            high += list.ticks[m] - riseAt;
            riseAt = Number.NaN;
          }
        }
        if (!Number.isNaN(riseAt)) high += b - riseAt;
        push(out.duty, t, (100 * high) / periodTicks);
        if (prevEnd === a) push(out.jitter, t, ticksToSeconds(ts, Math.abs(periodTicks - prevPeriodTicks)));
        prevEnd = b;
        prevPeriodTicks = periodTicks;
      }
    }
    start = k;
  }
  return out;
}
