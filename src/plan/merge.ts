// Combining `midrail check --json` documents from several machines (shards of one regression) into
// one. All must come from the same plan (same SHA-256); dumps are kept in the order given.
// The merged document has the same shape, so merging merged results works too.

import { CHECK_RESULT_FORMAT, CHECK_RESULT_VERSION, type CheckDocument, summarize } from './result';

export class MergeError extends Error {}

/** Checks that a parsed JSON value is a check result this midrail reads; `source` names it in errors. */
export function asCheckDocument(value: unknown, source: string): CheckDocument {
  const v = value as Partial<CheckDocument> | null;
  if (typeof v !== 'object' || v === null || Array.isArray(v)) throw new MergeError(`${source}: $: expected a midrail check result (the output of 'midrail check --json')`);
  if (v.format !== CHECK_RESULT_FORMAT) {
    throw new MergeError(`${source}: $.format: expected "${CHECK_RESULT_FORMAT}" (the output of 'midrail check --json'); got ${JSON.stringify(v.format)}`);
  }
  if (v.format_version !== CHECK_RESULT_VERSION) {
    throw new MergeError(`${source}: $.format_version: this midrail reads check results of version ${CHECK_RESULT_VERSION}; got ${JSON.stringify(v.format_version)}`);
  }
  if (typeof v.plan !== 'object' || v.plan === null || typeof v.plan.sha256 !== 'string') throw new MergeError(`${source}: $.plan.sha256: missing`);
  if (!Array.isArray(v.dumps)) throw new MergeError(`${source}: $.dumps: expected an array of dump results`);
  v.dumps.forEach((d, i) => {
    if (typeof d?.file !== 'string' || !Array.isArray(d?.measurements)) throw new MergeError(`${source}: $.dumps[${i}]: expected a dump result with 'file' and 'measurements'`);
  });
  return v as CheckDocument;
}

export interface MergeOutcome {
  doc: CheckDocument;
  /** Notes for stderr: the same dump reported by two shards. */
  warnings: string[];
}

export function mergeDocuments(docs: CheckDocument[], sources: string[], now: Date, host: string): MergeOutcome {
  if (docs.length === 0) throw new MergeError('name at least one check result to merge');
  const first = docs[0];
  const warnings: string[] = [];
  docs.forEach((d, i) => {
    if (d.plan.sha256 !== first.plan.sha256) {
      throw new MergeError(
        `${sources[i]} was checked against a different plan (${d.plan.file}, SHA-256 ${d.plan.sha256.slice(0, 12)}…) than ${sources[0]} (${first.plan.file}, ${first.plan.sha256.slice(0, 12)}…); merge results of one plan only`,
      );
    }
  });
  const dumps = docs.flatMap((d) => d.dumps);
  const seen = new Map<string, number>();
  dumps.forEach((d, i) => {
    const key = d.sha256 ?? d.file;
    const before = seen.get(key);
    if (before !== undefined) warnings.push(`${d.file} appears twice (dumps ${before + 1} and ${i + 1}${d.sha256 ? ', same SHA-256' : ''}); both are kept`);
    else seen.set(key, i);
  });
  const versions = [...new Set(docs.map((d) => d.tool_version))];
  if (versions.length > 1) warnings.push(`the results come from different midrail versions (${versions.join(', ')})`);
  return {
    doc: {
      ...first,
      generated_at: now.toISOString(),
      hostname: host,
      tool_version: versions.join(', '),
      dumps,
      summary: summarize(dumps),
    },
    warnings,
  };
}
