// The JUnit XML of a check, parsed back with a general-purpose XML parser (fast-xml-parser) and held
// against the element and attribute names of the Apache Ant JUnit XML schema (Windy Road JUnit.xsd,
// the schema CI servers' JUnit readers follow): which elements may appear where, which attributes
// each may carry, and which are required.
import { XMLParser, XMLValidator } from 'fast-xml-parser';
import { describe, expect, it } from 'vitest';
import { parseVcd } from '../../src/parse/vcd';
import { type CheckDocument, summarize } from '../../src/plan/result';
import { runPlan } from '../../src/plan/run';
import { checkJunitXml } from '../../src/plan/toJunit';
import { toPlan } from '../../src/plan/validate';

// Windy Road JUnit.xsd: allowed attributes (required ones marked) and child elements per element.
const SCHEMA: Record<string, { attrs: string[]; required: string[]; children: string[] }> = {
  testsuites: { attrs: [], required: [], children: ['testsuite'] },
  testsuite: {
    attrs: ['package', 'id', 'name', 'timestamp', 'hostname', 'tests', 'failures', 'errors', 'skipped', 'time'],
    required: ['package', 'id', 'name', 'timestamp', 'hostname', 'tests', 'failures', 'errors', 'time'],
    children: ['properties', 'testcase', 'system-out', 'system-err'],
  },
  properties: { attrs: [], required: [], children: ['property'] },
  property: { attrs: ['name', 'value'], required: ['name', 'value'], children: [] },
  testcase: { attrs: ['name', 'classname', 'time'], required: ['name', 'classname', 'time'], children: ['skipped', 'error', 'failure'] },
  failure: { attrs: ['message', 'type'], required: ['type'], children: [] },
  error: { attrs: ['message', 'type'], required: ['type'], children: [] },
  skipped: { attrs: ['message', 'type'], required: [], children: [] },
  'system-out': { attrs: [], required: [], children: [] },
  'system-err': { attrs: [], required: [], children: [] },
};

type Node = Record<string, unknown>;

/** Walks the preserveOrder tree of fast-xml-parser and returns every deviation from SCHEMA. */
function schemaProblems(nodes: Node[], parent: string | null, out: string[] = []): string[] {
  for (const node of nodes) {
    const name = Object.keys(node).find((k) => k !== ':@');
    if (!name || name === '#text' || name === '?xml') continue;
    const rule = SCHEMA[name];
    if (!rule) {
      out.push(`unknown element <${name}>`);
      continue;
    }
    if (parent !== null && !SCHEMA[parent].children.includes(name)) out.push(`<${name}> is not allowed in <${parent}>`);
    if (parent === null && name !== 'testsuites') out.push(`root is <${name}>`);
    const attrs = Object.keys((node[':@'] as Node | undefined) ?? {}).map((a) => a.replace(/^@_/, ''));
    for (const a of attrs) if (!rule.attrs.includes(a)) out.push(`<${name}> has attribute ${a}`);
    for (const a of rule.required) if (!attrs.includes(a)) out.push(`<${name}> lacks required ${a}`);
    schemaProblems(node[name] as Node[], name, out);
  }
  return out;
}

const VCD = `$timescale 1ns $end
$scope module top $end
$var wire 1 ! a $end
$var wire 1 " y $end
$var wire 1 # =HYPERLINK("x")<&]]> $end
$upscope $end
$enddefinitions $end
#0
0! 0" 0#
#10 1!
#13 1"
#20 0! 1#
#21 0#
#22 0"
#40
`;

function doc(): CheckDocument {
  const dump = parseVcd(VCD, 'a<b>.vcd');
  const plan = toPlan(
    {
      format: 'midrail-plan',
      version: 1,
      name: 'p & q',
      measurements: [
        { id: 'a_to_y', kind: 'delay', from: 'a', to: 'y', max: '2.5ns' },
        { id: 'glitches', kind: 'glitch', max_width: '2ns', max: 5 },
        { id: 'missing', kind: 'pulse-width', net: 'nothere' },
      ],
    },
    'p.json',
  );
  const dumps = [
    { file: 'a<b>.vcd', bytes: 123, sha256: 'ab', timescale: '1ns', end_s: 4e-8, error: null, warnings: ['odd "line"\u0001'], elapsed_s: 0.01, measurements: runPlan(dump, plan) },
    { file: 'gone.vcd', bytes: 0, sha256: null, timescale: null, end_s: null, error: "cannot read dump 'gone.vcd': no such file", warnings: [], elapsed_s: 0, measurements: [] },
  ];
  return {
    format: 'midrail-check-result',
    format_version: 1,
    tool: 'midrail',
    tool_version: '0.1.0',
    generated_at: '2026-12-01T10:00:00.000Z',
    hostname: 'ci-7',
    plan: { file: 'p.json', name: 'p & q', sha256: 'cd', measurements: [] },
    dumps,
    summary: summarize(dumps),
    caution: '',
  };
}

describe('JUnit XML of a check', () => {
  const xml = checkJunitXml(doc());
  const parser = new XMLParser({ ignoreAttributes: false, preserveOrder: true, attributeNamePrefix: '@_' });

  it('is well-formed XML', () => {
    expect(XMLValidator.validate(xml)).toBe(true);
  });

  it('uses only the elements and attributes of the JUnit schema, with the required ones present', () => {
    expect(schemaProblems(parser.parse(xml) as Node[], null)).toEqual([]);
  });

  it('has one testsuite per dump and one testcase per measurement', () => {
    const flat = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '', isArray: (n) => ['testsuite', 'testcase', 'property'].includes(n) }).parse(xml);
    const suites = flat.testsuites.testsuite;
    expect(suites.map((s: Node) => s.name)).toEqual(['a<b>.vcd', 'gone.vcd']);
    expect(suites[0].testcase.map((c: Node) => c.name)).toEqual(['a_to_y', 'glitches', 'missing']);
    expect([suites[0].tests, suites[0].failures, suites[0].errors]).toEqual(['3', '1', '1']);
    // The violated limit is a failure whose message holds the worst edge's time and margin.
    const failure = suites[0].testcase[0].failure;
    expect(failure.type).toBe('limit');
    expect(failure.message).toMatch(/3 ns at 13 ns .*margin -500 ps/);
    // A net the plan names but the dump lacks is an error with the JSON path.
    expect(suites[0].testcase[2].error.message).toMatch(/^\$\.measurements\[2\]\.net: no net named 'nothere'/);
    // An unreadable dump is one errored testcase.
    expect(suites[1].testcase[0].error.message).toMatch(/no such file/);
    expect(suites[1].errors).toBe('1');
    const props = Object.fromEntries(suites[0].properties.property.map((p: Node) => [p.name, p.value]));
    expect(props['dump.sha256']).toBe('ab');
    expect(props['plan.sha256']).toBe('cd');
    expect(suites[0].timestamp).toBe('2026-12-01T10:00:00');
  });

  it('carries hostile net names and control characters as inert text', () => {
    const flat = new XMLParser({ ignoreAttributes: false, attributeNamePrefix: '', isArray: (n) => n === 'testsuite' }).parse(xml);
    const out = flat.testsuites.testsuite[0]['system-out'];
    expect(out).toContain('=HYPERLINK("x")<&]]>');
    expect(flat.testsuites.testsuite[0]['system-err']).toBe('odd "line"\uFFFD');
  });
});
