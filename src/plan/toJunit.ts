// A check result as JUnit XML: one testsuite per dump, one testcase per measurement. A violated
// limit is a <failure> whose message gives the worst item's value, time and margin; a missing net
// or an unreadable dump is an <error>.

import { type JUnitCase, type JUnitSuite, junitTimestamp, junitXml } from '../report/junit';
import { formatValue } from './format';
import type { CheckDocument, DumpCheck, MeasurementOutcome } from './result';

function worstLines(m: MeasurementOutcome): string {
  if (m.worst_items.length === 0) return '';
  const rows = m.worst_items.map((w) => {
    const margin = w.margin === null ? '' : `, margin ${formatValue(w.margin, m.unit === 'count' ? 's' : m.unit)}`;
    return `  ${formatValue(w.value, m.unit === 'count' ? 's' : m.unit)} at ${formatValue(w.time_s, 's')}${margin}: ${w.what}`;
  });
  return `\nworst ${m.kind === 'glitch' ? 'glitches (width)' : 'items'}:\n${rows.join('\n')}`;
}

function testcase(d: DumpCheck, m: MeasurementOutcome): JUnitCase {
  const c: JUnitCase = { name: m.id, classname: d.file, timeS: m.elapsed_s };
  if (m.status === 'error') c.error = { message: m.message, type: 'bad-input' };
  else if (m.status === 'fail') {
    c.failure = { message: m.message, type: m.count === 0 ? 'no-data' : 'limit', detail: `${m.message}${worstLines(m)}` };
  }
  return c;
}

export function checkSuites(doc: CheckDocument): JUnitSuite[] {
  return doc.dumps.map((d) => {
    const properties: Array<[string, string]> = [
      ['dump', d.file],
      ['dump.bytes', String(d.bytes)],
      ['dump.sha256', d.sha256 ?? ''],
      ['dump.timescale', d.timescale ?? ''],
      ['plan', doc.plan.file],
      ['plan.sha256', doc.plan.sha256],
      ['tool', `midrail ${doc.tool_version}`],
    ];
    const cases = d.error !== null ? [{ name: 'read dump', classname: d.file, timeS: d.elapsed_s, error: { message: d.error, type: 'bad-input' } }] : d.measurements.map((m) => testcase(d, m));
    return {
      name: d.file,
      packageName: doc.plan.name ?? doc.plan.file,
      timestamp: junitTimestamp(new Date(doc.generated_at)),
      hostname: doc.hostname,
      timeS: d.elapsed_s,
      properties,
      cases,
      systemOut: d.measurements.map((m) => `${m.status.toUpperCase()} ${m.id}: ${m.message}`).join('\n'),
      systemErr: d.warnings.join('\n'),
    };
  });
}

export function checkJunitXml(doc: CheckDocument): string {
  return junitXml(checkSuites(doc));
}
