// The net drawer's filter: substring (any case), glob (same rules as the CLI's net lists:
// `*` and `?` only, matching a full path or a path suffix after a dot), or a regular expression.

import { globToRegExp } from '../model/netref';

export type FilterMode = 'text' | 'glob' | 'regex';

export type Matcher = (path: string) => boolean;

export class FilterError extends Error {}

export function makeMatcher(query: string, mode: FilterMode): Matcher {
  const q = query.trim();
  if (q === '') return () => true;
  if (mode === 'text') {
    const lower = q.toLowerCase();
    return (p) => p.toLowerCase().includes(lower);
  }
  if (mode === 'glob') {
    const whole = globToRegExp(q);
    const suffix = globToRegExp('*.' + q);
    return (p) => whole.test(p) || suffix.test(p);
  }
  let re: RegExp;
  try {
    re = new RegExp(q);
  } catch (e) {
    throw new FilterError(`not a regular expression: ${(e as Error).message}`);
  }
  return (p) => re.test(p);
}
