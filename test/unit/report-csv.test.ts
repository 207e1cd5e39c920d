// CSV export: RFC 4180 layout (CRLF records, quoted fields with doubled quotes, same field count on
// every line) and formula-injection safety (OWASP CSV Injection) on a dump with a hostile net name.

import { describe, expect, it } from 'vitest';
import { findGlitches, measureDelay } from '../../src/measure';
import { resolveNet } from '../../src/model/netref';
import { delaySheet, glitchSheet, toCsv } from '../../src/report';
import { buildDump } from './measure-dumps';

/** Minimal RFC 4180 reader for checking what was written. */
function readCsv(text: string): string[][] {
  const rows: string[][] = [];
  let row: string[] = [];
  let field = '';
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') {
        field += '"';
        i++;
      } else if (c === '"') quoted = false;
      else field += c;
    } else if (c === '"') quoted = true;
    else if (c === ',') {
      row.push(field);
      field = '';
    } else if (c === '\r' && text[i + 1] === '\n') {
      row.push(field);
      rows.push(row);
      row = [];
      field = '';
      i++;
    } else field += c;
  }
  return rows;
}

const HOSTILE = '=HYPERLINK("x")';

describe('toCsv', () => {
  const dump = buildDump([
    { path: HOSTILE, kind: 'logic', changes: [[0, '0'], [10, '1'], [30, '0']] },
    { path: 'top.y', kind: 'logic', changes: [[0, '1'], [12, '0'], [33, '1']] },
  ]);
  const delay = measureDelay(dump, { from: resolveNet(dump, HOSTILE), to: resolveNet(dump, 'top.y') });

  it('writes one record per pair (worst first) plus summary rows, with the same field count on every CRLF line', () => {
    const text = toCsv([delaySheet(delay)]);
    expect(text.endsWith('\r\n')).toBe(true);
    expect(text.replace(/\r\n/g, '')).not.toMatch(/[\r\n]/);
    const rows = readCsv(text);
    const width = rows[0].length;
    for (const r of rows) expect(r).toHaveLength(width);
    const head = rows[0];
    expect(head.slice(0, 9)).toEqual(['row', 'kind', 'from', 'from_edge', 'from_time_s', 'to', 'to_edge', 'to_time_s', 'delay_s']);
    const pairs = rows.filter((r) => r[0] === 'pair');
    expect(pairs.map((r) => [r[1], Number(r[head.indexOf('delay_s')])])).toEqual([
      ['tPLH', 3e-9],
      ['tPHL', 2e-9],
    ]);
    const tpd = rows.find((r) => r[0] === 'summary' && r[head.indexOf('item')] === 'tpd')!;
    expect(Number(tpd[head.indexOf('value')])).toBe(3e-9);
    expect(tpd[head.indexOf('unit')]).toBe('s');
  });

  it('exports a net named =HYPERLINK("x") as inert quoted text with a leading apostrophe', () => {
    const text = toCsv([delaySheet(delay)]);
    expect(text).toContain(`"'=HYPERLINK(""x"")"`);
    const rows = readCsv(text);
    for (const r of rows) for (const f of r) expect(f.startsWith('=')).toBe(false);
    expect(rows[1][2]).toBe(`'${HOSTILE}`);
  });

  it('puts several measurements in one table with a measurement column', () => {
    const g = findGlitches(dump, { maxWidthS: 5e-9 });
    const rows = readCsv(toCsv([delaySheet(delay), glitchSheet(g)]));
    expect(rows[0][0]).toBe('measurement');
    expect(new Set(rows.slice(1).map((r) => r[0]))).toEqual(new Set([`delay ${HOSTILE} → top.y`, 'glitches < 5e-9 s']));
  });
});
