// Reading a plan: JSON syntax (with line and column), the shipped JSON Schema, then the checks a
// schema cannot express (unique ids, min not above max, windows above zero). Every problem names
// the JSON path of the field at fault. Nets are checked later, against each dump (bind.ts).

import schemaJson from './midrail-plan.schema.json';
import { findJsonSyntaxError } from './jsonSyntax';
import { limitsOf } from './limits';
import { type PathIssue, type SchemaNode, SchemaChecker, childPath } from './schemaCheck';
import { type Plan, PLAN_VERSION } from './types';
import { parseTime } from '../model/units';
import { parseLevel } from '../measure/index';

export const PLAN_SCHEMA = schemaJson as SchemaNode;
const checker = new SchemaChecker(PLAN_SCHEMA);

/** A plan that cannot be used; `issues` lists every problem with its JSON path. */
export class PlanError extends Error {
  constructor(
    readonly source: string,
    readonly issues: PathIssue[],
  ) {
    const n = issues.length;
    const lines = issues.map((i) => `  ${i.path}: ${i.message}`);
    super(`${source}: ${n === 1 ? 'a problem' : `${n} problems`} in the measurement plan:\n${lines.join('\n')}`);
  }
}

function parseJson(text: string, source: string): unknown {
  try {
    return JSON.parse(text);
  } catch (err) {
    const at = findJsonSyntaxError(text);
    const message = at
      ? `not valid JSON at line ${at.line}, column ${at.column} (character ${at.offset + 1}): expected ${at.expected}`
      : `not valid JSON: ${(err as Error).message}`;
    throw new PlanError(source, [{ path: '$', message }]);
  }
}

function levelIssue(path: string, text: string, out: PathIssue[]): void {
  try {
    parseLevel(text);
  } catch (err) {
    out.push({ path, message: (err as Error).message });
  }
}

function semanticIssues(plan: Plan): PathIssue[] {
  const out: PathIssue[] = [];
  for (const [net, level] of Object.entries(plan.levels ?? {})) levelIssue(childPath('$.levels', net), level, out);
  const firstAt = new Map<string, number>();
  plan.measurements.forEach((m, i) => {
    const at = childPath('$.measurements', i);
    const seen = firstAt.get(m.id);
    if (seen !== undefined) out.push({ path: `${at}.id`, message: `duplicate id '${m.id}' (also at $.measurements[${seen}].id)` });
    else firstAt.set(m.id, i);
    if ('window' in m && m.window !== undefined && parseTime(m.window) <= 0) {
      out.push({ path: `${at}.window`, message: `a window must be longer than zero; got '${m.window}'` });
    }
    if (m.kind === 'glitch' && parseTime(m.max_width) <= 0) {
      out.push({ path: `${at}.max_width`, message: `max_width must be longer than zero; got '${m.max_width}'` });
    }
    if ('level' in m && m.level !== undefined) levelIssue(`${at}.level`, m.level, out);
    const lim = limitsOf(m);
    if (lim.min !== null && lim.max !== null && lim.min > lim.max) {
      out.push({ path: `${at}.min`, message: `min ${lim.minText} is above max ${lim.maxText}` });
    }
  });
  return out;
}

/** Every problem of a parsed JSON value as a plan (empty when it is a valid plan). */
export function planIssues(value: unknown): PathIssue[] {
  if (typeof value === 'object' && value !== null && !Array.isArray(value)) {
    const v = (value as Record<string, unknown>).version;
    if (typeof v === 'number' && v > PLAN_VERSION) {
      return [{ path: '$.version', message: `this plan is format version ${v}; this midrail reads version ${PLAN_VERSION}, so update midrail` }];
    }
  }
  const issues = checker.check(value);
  if (issues.length > 0) return issues;
  return semanticIssues(value as Plan);
}

/** A checked plan from a parsed JSON value; throws PlanError listing every problem. */
export function toPlan(value: unknown, source: string): Plan {
  const issues = planIssues(value);
  if (issues.length > 0) throw new PlanError(source, issues);
  return value as Plan;
}

/** A checked plan from the text of a plan file; throws PlanError listing every problem. */
export function parsePlan(text: string, source: string): Plan {
  return toPlan(parseJson(text.replace(/^\uFEFF/, ''), source), source);
}

/** The text of a plan file, as the viewer's "Save plan" writes it; refuses a plan that would not load back. */
export function formatPlan(plan: Plan, source = 'plan'): string {
  toPlan(plan, source);
  return `${JSON.stringify(plan, null, 2)}\n`;
}
