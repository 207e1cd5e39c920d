// JUnit XML writer: the test-result format CI servers already display. Follows the element and
// attribute names of the Apache Ant JUnit XML schema (the widely used JUnit.xsd): <testsuites>
// holding <testsuite id package name timestamp hostname tests failures errors skipped time>, each
// with <properties>, <testcase name classname time> (with an optional <failure>, <error> or
// <skipped>), <system-out> and <system-err>. Pure string building, no DOM or Node APIs.

export interface JUnitProblem {
  /** One line for the CI server's summary. */
  message: string;
  /** A short class of problem (`limit`, `no-data`, `bad-input`). */
  type: string;
  /** Longer detail, shown when the case is opened. */
  detail?: string;
}

export interface JUnitCase {
  name: string;
  classname: string;
  timeS: number;
  failure?: JUnitProblem;
  error?: JUnitProblem;
  skipped?: JUnitProblem;
}

export interface JUnitSuite {
  name: string;
  /** Ant schema: for aggregated documents, derived from the suite name. */
  packageName: string;
  /** ISO 8601 without a zone, as the Ant schema requires (UTC is used). */
  timestamp: string;
  hostname: string;
  timeS: number;
  properties: Array<[string, string]>;
  cases: JUnitCase[];
  systemOut?: string;
  systemErr?: string;
}

/** Characters XML 1.0 forbids (controls other than tab/LF/CR, lone surrogates, U+FFFE/U+FFFF) become U+FFFD. */
const FORBIDDEN = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g;

export function xmlText(s: string): string {
  return s.replace(FORBIDDEN, '\uFFFD').replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

export function xmlAttr(s: string): string {
  return xmlText(s).replace(/"/g, '&quot;').replace(/\t/g, '&#9;').replace(/\n/g, '&#10;').replace(/\r/g, '&#13;');
}

/** `2026-12-01T23:51:11` in UTC: the zone-less form the Ant schema's timestamp pattern allows. */
export function junitTimestamp(date: Date): string {
  return date.toISOString().slice(0, 19);
}

function seconds(t: number): string {
  return Number.isFinite(t) && t >= 0 ? t.toFixed(3) : '0.000';
}

function problem(tag: string, p: JUnitProblem): string {
  return `      <${tag} message="${xmlAttr(p.message)}" type="${xmlAttr(p.type)}">${xmlText(p.detail ?? p.message)}</${tag}>\n`;
}

function testcase(c: JUnitCase): string {
  const head = `    <testcase name="${xmlAttr(c.name)}" classname="${xmlAttr(c.classname)}" time="${seconds(c.timeS)}"`;
  // The schema allows one of failure, error or skipped per case.
  if (c.error) return `${head}>\n${problem('error', c.error)}    </testcase>\n`;
  if (c.failure) return `${head}>\n${problem('failure', c.failure)}    </testcase>\n`;
  if (c.skipped) return `${head}>\n      <skipped message="${xmlAttr(c.skipped.message)}" type="${xmlAttr(c.skipped.type)}"/>\n    </testcase>\n`;
  return `${head}/>\n`;
}

export function junitXml(suites: JUnitSuite[]): string {
  let out = '<?xml version="1.0" encoding="UTF-8"?>\n<testsuites>\n';
  suites.forEach((s, id) => {
    const failures = s.cases.filter((c) => c.failure && !c.error).length;
    const errors = s.cases.filter((c) => c.error).length;
    const skipped = s.cases.filter((c) => c.skipped && !c.error && !c.failure).length;
    out +=
      `  <testsuite id="${id}" package="${xmlAttr(s.packageName)}" name="${xmlAttr(s.name)}" timestamp="${xmlAttr(s.timestamp)}"` +
      ` hostname="${xmlAttr(s.hostname || 'localhost')}" tests="${s.cases.length}" failures="${failures}" errors="${errors}"` +
      ` skipped="${skipped}" time="${seconds(s.timeS)}">\n`;
    out += '    <properties>\n';
    for (const [name, value] of s.properties) out += `      <property name="${xmlAttr(name)}" value="${xmlAttr(value)}"/>\n`;
    out += '    </properties>\n';
    for (const c of s.cases) out += testcase(c);
    out += `    <system-out>${xmlText(s.systemOut ?? '')}</system-out>\n`;
    out += `    <system-err>${xmlText(s.systemErr ?? '')}</system-err>\n`;
    out += '  </testsuite>\n';
  });
  return `${out}</testsuites>\n`;
}
