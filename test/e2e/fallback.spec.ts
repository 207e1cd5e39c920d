// Without WebGL (switched off here, as on some remote desktops), pixi falls back to its canvas
// renderer, which draws no Mesh; the viewer then draws with Graphics and says so.

import { expect, test } from '@playwright/test';
import { chromiumArgs, chromiumPath } from '../../playwright.config';
import { PAPER_TRACES, laneBody, loadPump, near, settle, xOfSeconds } from './helpers';

test.use({ launchOptions: { executablePath: chromiumPath, args: [...chromiumArgs, '--disable-webgl'] } });

test('with WebGL switched off the traces are still drawn, and the status line says how', async ({ page }) => {
  await loadPump(page);
  await expect(page.locator('#renderer-name')).toHaveText('canvas drawing (no WebGL)');
  await settle(page);
  const x = Math.floor(await xOfSeconds(page, 10e-9));
  const body = await laneBody(page, 'enable');
  // The rising edge of enable at 10 ns: a vertical run of its colour in that column.
  const column = await page.locator('#canvas-host canvas').evaluate(
    (el, [cx, a, b]) => {
      const ctx = (el as HTMLCanvasElement).getContext('2d')!;
      const d = ctx.getImageData(cx, a, 1, b - a + 1).data;
      const out: number[] = [];
      for (let i = 0; i < d.length; i += 4) out.push((d[i] << 16) | (d[i + 1] << 8) | d[i + 2]);
      return out;
    },
    [x, Math.floor(body.top + 3), Math.floor(body.bottom - 3)] as const,
  );
  expect(column.filter((p) => near(p, PAPER_TRACES[1])).length).toBeGreaterThan(10);
});
