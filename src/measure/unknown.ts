// Unknown spans of an EdgeList as result records: nothing is dropped silently.

import { type Dump, LOGIC_CHARS } from '../model/dump';
import { ticksToSeconds } from './ticks';
import type { EdgeList, UnknownSpan } from './types';

function inDumpOff(dump: Dump, tick: number): boolean {
  for (const [start, end] of dump.dumpOff) if (tick === start || (tick >= start && tick < end)) return true;
  return false;
}

/** The spans of an EdgeList, or of anything holding a label and spans in the EdgeList form. */
export function unknownSpans(dump: Dump, list: Pick<EdgeList, 'label' | 'unknown' | 'unknownState'>): UnknownSpan[] {
  const out: UnknownSpan[] = [];
  const ts = dump.timescale;
  for (let k = 0; k + 1 < list.unknown.length; k += 2) {
    const start = list.unknown[k];
    const end = list.unknown[k + 1];
    const span: UnknownSpan = {
      net: list.label,
      start_s: ticksToSeconds(ts, start),
      end_s: Number.isNaN(end) ? null : ticksToSeconds(ts, end),
    };
    const code = list.unknownState[k / 2];
    if (code !== undefined && code >= 0) span.state = LOGIC_CHARS[code];
    if (dump.dumpOff.length > 0 && inDumpOff(dump, start)) span.dumpoff = true;
    out.push(span);
  }
  return out;
}
