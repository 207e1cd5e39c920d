// The regression the README shows, on the shipped samples: the sample plan holds on the typical
// corner and breaks on the slow one. Limits sit between the corners' delays written in the HDL
// (samples/README.md, samples/hdl/sensor_hub.v): spi_addr follows clk_ref by clk_spi buffer + clock
// to q = 0.75 + 0.15 = 0.90 ns (typ) and 0.98 + 0.20 = 1.18 ns (slow), limit 1 ns; irq_n falls after
// level_hi by or-rise + not-fall = 0.50 + 0.55 = 1.05 ns (typ) and 0.65 + 0.72 = 1.37 ns (slow),
// limit 1.2 ns. Needs `npm run prepare`.
import { execFile } from 'node:child_process';
import { existsSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';

const CLI = resolve(process.env.MIDRAIL_CLI ?? 'dist/cli/main.js');
const ROOT = resolve(import.meta.dirname, '../..');

function check(...dumps: string[]): Promise<{ code: number; doc: { dumps: Array<{ file: string; measurements: Array<{ id: string; status: string; worst: number }> }> } }> {
  if (!existsSync(CLI)) throw new Error(`${CLI} is missing: run 'npm run prepare' to build the CLI first`);
  return new Promise((done) => {
    execFile('node', [CLI, 'check', ...dumps, '--plan', 'samples/plans/sensor_hub.plan.json', '--json'], { cwd: ROOT, maxBuffer: 64 << 20 }, (err, stdout) => {
      done({ code: err ? ((err as { code?: number }).code ?? -1) : 0, doc: JSON.parse(stdout) });
    });
  });
}

describe('the sample regression', () => {
  it('passes every limit on the typical corner', async () => {
    const r = await check('samples/sensor_hub.vcd');
    expect(r.code).toBe(0);
    expect(r.doc.dumps[0].measurements.every((m) => m.status === 'pass')).toBe(true);
  });

  it('breaks the SPI address and interrupt limits on the slow corner, exiting 1', async () => {
    const r = await check('samples/sensor_hub_slow.vcd');
    expect(r.code).toBe(1);
    const failed = r.doc.dumps[0].measurements.filter((m) => m.status !== 'pass');
    expect(failed.map((m) => m.id)).toEqual(['spi_addr_clock_to_out', 'irq_n_response']);
    expect(failed[0].worst).toBeCloseTo(1.18e-9, 15);
    expect(failed[1].worst).toBeCloseTo(1.37e-9, 15);
  });
});
