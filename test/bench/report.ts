// Printing: figures as they come, and every target with whether it was met, gathered again in a
// summary at the end. Figures are ratios taken in the same run, since the machine is shared.

export interface TargetResult {
  section: string;
  name: string;
  value: number | null;
  limit: number;
  /** 'min': value must be at least limit; 'max': at most. */
  bound: 'min' | 'max';
  unit: string;
  note: string;
}

const targets: TargetResult[] = [];

export function heading(text: string): void {
  process.stdout.write(`\n== ${text}\n`);
}

export function info(text: string): void {
  process.stdout.write(`   ${text}\n`);
}

export function verdict(t: TargetResult): string {
  if (t.value === null || !Number.isFinite(t.value)) return 'NOT MEASURED';
  const ok = t.bound === 'min' ? t.value >= t.limit : t.value <= t.limit;
  return ok ? 'MET' : 'NOT MET';
}

function describe(t: TargetResult): string {
  const v = t.value === null || !Number.isFinite(t.value) ? '—' : fixed(t.value);
  const op = t.bound === 'min' ? '≥' : '≤';
  return `${t.name}: ${v}${t.unit} (target ${op} ${t.limit}${t.unit}) ${verdict(t)}${t.note ? `  [${t.note}]` : ''}`;
}

export function target(t: TargetResult): void {
  targets.push(t);
  process.stdout.write(`   TARGET ${describe(t)}\n`);
}

export function summary(): number {
  heading('Targets');
  if (targets.length === 0) info('(no targets were measured)');
  for (const t of targets) info(`${verdict(t).padEnd(12)} ${t.section}: ${describe(t)}`);
  return targets.filter((t) => verdict(t) === 'NOT MET').length;
}

export function allTargets(): readonly TargetResult[] {
  return targets;
}

export function fixed(n: number): string {
  const a = Math.abs(n);
  if (a >= 100) return n.toFixed(0);
  if (a >= 10) return n.toFixed(1);
  if (a >= 1) return n.toFixed(2);
  return n.toPrecision(2);
}

export function mb(bytes: number): string {
  return `${fixed(bytes / 1e6)} MB`;
}

export function rate(perSecond: number, unit: string): string {
  if (perSecond >= 1e6) return `${fixed(perSecond / 1e6)} M${unit}/s`;
  if (perSecond >= 1e3) return `${fixed(perSecond / 1e3)} k${unit}/s`;
  return `${fixed(perSecond)} ${unit}/s`;
}

/** A plain fixed-width table. */
export function table(header: string[], rows: string[][]): void {
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? '').length)));
  const fmt = (r: string[]) => r.map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join('  ');
  info(fmt(header));
  for (const r of rows) info(fmt(r));
}
