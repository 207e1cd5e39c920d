// The built page (vite build + vite preview) as shipped: it starts under its CSP (no inline
// script, no eval), parses in its worker and draws with WebGL.

import { expect, test } from '@playwright/test';
import { caption, expectEnableEdgeAt10ns, loadPump } from './helpers';

test('the built page opens a dump and draws it under its content security policy', async ({ page }) => {
  const problems: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error') problems.push(m.text());
  });
  page.on('pageerror', (e) => problems.push(e.message));
  await page.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => console.error(`CSP violation: ${e.violatedDirective} ${e.blockedURI}`));
  });
  const res = await page.goto('/');
  expect(res!.headers()['content-security-policy']).toContain("script-src 'self'");
  await loadPump(page);
  await expect(caption(page, 'coolant_temp')).toBeVisible();
  await expect(page.locator('#renderer-name')).toHaveText('WebGL');
  await expectEnableEdgeAt10ns(page);
  expect(problems).toEqual([]);
});
