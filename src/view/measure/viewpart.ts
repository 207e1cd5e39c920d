// The measuring part of a saved view: the measurements as a measurement plan (midrail's plan
// format, so a view's measurements and a plan file are one thing), which one is chosen, the glitch
// width if the user set one, and the worst-case sheet. Checked field by field on load; a problem
// names the field. Pure.

import { parseTime } from '../../model/units';
import { planIssues } from '../../plan/validate';
import type { Plan } from '../../plan/types';
import { ROW_KEYS, type WorstRow } from './worstrows';

export interface MeasurePart {
  /** Omitted when there are no measurements (a plan holds at least one). */
  plan?: Plan;
  chosen?: string;
  /** Glitch width the user typed ('1ns'); omitted = the documented default. */
  glitchWidth?: string;
  sheet: WorstRow[];
}

export const SHEET_ROW_LIMIT = 100_000;

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);

/** Checks the `measure` field of a view file; returns the part or a problem naming the field. */
export function readMeasurePart(v: unknown): { part: MeasurePart } | { problem: string } {
  if (!isObj(v)) return { problem: 'measure must be an object with a sheet (and a plan)' };
  for (const k of Object.keys(v)) {
    if (!['plan', 'chosen', 'glitchWidth', 'sheet'].includes(k)) return { problem: `measure has an unknown field '${k}' (allowed: plan, chosen, glitchWidth, sheet)` };
  }
  const part: MeasurePart = { sheet: [] };
  if (v.plan !== undefined) {
    const issues = planIssues(v.plan);
    if (issues.length > 0) return { problem: `measure.plan${issues[0].path.slice(1)}: ${issues[0].message}` };
    part.plan = v.plan as Plan;
  }
  if (v.chosen !== undefined) {
    if (typeof v.chosen !== 'string') return { problem: 'measure.chosen must be a measurement id' };
    part.chosen = v.chosen;
  }
  if (v.glitchWidth !== undefined) {
    let s = NaN;
    try {
      s = typeof v.glitchWidth === 'string' ? parseTime(v.glitchWidth) : NaN;
    } catch {
      /* reported below */
    }
    if (!(s > 0)) return { problem: `measure.glitchWidth is ${JSON.stringify(v.glitchWidth)}; expected a positive time such as 1ns` };
    part.glitchWidth = v.glitchWidth as string;
  }
  if (!Array.isArray(v.sheet)) return { problem: 'measure.sheet must be a list' };
  if (v.sheet.length > SHEET_ROW_LIMIT) return { problem: `measure.sheet has more than ${SHEET_ROW_LIMIT} rows` };
  for (let i = 0; i < v.sheet.length; i++) {
    const r = v.sheet[i];
    const where = `measure.sheet[${i}]`;
    if (!isObj(r)) return { problem: `${where} must be an object` };
    for (const k of Object.keys(r)) if (!(ROW_KEYS as readonly string[]).includes(k)) return { problem: `${where} has an unknown field '${k}'` };
    for (const k of ['measurement', 'nets', 'edge'] as const) {
      if (typeof r[k] !== 'string' || (r[k] as string).length > 4096) return { problem: `${where}.${k} must be text` };
    }
    if (r.kind !== 'delay' && r.kind !== 'skew' && r.kind !== 'glitch') return { problem: `${where}.kind is ${JSON.stringify(r.kind)}; expected delay, skew or glitch` };
    for (const k of ['time_s', 'value_s', 'start_s', 'end_s'] as const) {
      if (typeof r[k] !== 'number' || !Number.isFinite(r[k])) return { problem: `${where}.${k} must be a finite number (seconds)` };
    }
    for (const k of ['limit_min_s', 'limit_max_s', 'margin_s'] as const) {
      if (r[k] !== null && (typeof r[k] !== 'number' || !Number.isFinite(r[k]))) return { problem: `${where}.${k} must be a number (seconds) or null` };
    }
    part.sheet.push(r as unknown as WorstRow);
  }
  return { part };
}
