// Reference levels per net from a plan's `levels` map (keys are net names or globs), resolved
// against one dump. A key that matches no net is an error naming its JSON path.

import type { Dump } from '../model/dump';
import { type NetRef, resolveNetList } from '../model/netref';
import { type LevelSpec, parseLevel } from '../measure/index';
import { childPath, type PathIssue } from './schemaCheck';
import type { Plan } from './types';

export class LevelMap {
  private readonly byLabel = new Map<string, LevelSpec>();

  /** Later keys override earlier ones for a net that several keys match. */
  constructor(dump: Dump, plan: Plan, issues: PathIssue[]) {
    for (const [key, text] of Object.entries(plan.levels ?? {})) {
      const path = childPath('$.levels', key);
      try {
        const level = parseLevel(text);
        for (const ref of resolveNetList(dump, key)) this.byLabel.set(ref.label, level);
      } catch (err) {
        issues.push({ path, message: (err as Error).message });
      }
    }
  }

  /** The measurement's own level wins; then the net's entry in `levels`; else the engine default (50 %). */
  of(ref: NetRef, own: string | undefined): LevelSpec | undefined {
    if (own !== undefined) return parseLevel(own);
    return this.byLabel.get(ref.label) ?? (ref.bit !== null ? this.byLabel.get(ref.net.path) : undefined);
  }

  /** One level for a group of nets; undefined when none is set; an error if the group disagrees. */
  common(refs: NetRef[], own: string | undefined): LevelSpec | undefined {
    if (own !== undefined) return parseLevel(own);
    let found: LevelSpec | undefined;
    let firstNet = '';
    for (const r of refs) {
      const l = this.of(r, undefined);
      if (l === undefined) continue;
      if (found === undefined) {
        found = l;
        firstNet = r.label;
      } else if (found.text !== l.text) {
        throw new Error(`nets of this group have different reference levels in $.levels (${firstNet}: ${found.text}, ${r.label}: ${l.text}); give the measurement its own 'level'`);
      }
    }
    return found;
  }
}
