// Untrusted names stay text, nothing leaves the page, and the page runs under its CSP.
// pump.vcd declares a net named `<img src=x onerror=alert(1)>` (IEEE 1364 §18.2.3.7 lets a
// reference be any printable text); a viewer that put names into HTML would run it.

import { expect, test } from '@playwright/test';
import { loadPump } from './helpers';

const EVIL = '<img src=x onerror=alert(1)>';

test('a net named like an HTML tag shows as literal text everywhere and runs nothing', async ({ page }) => {
  const dialogs: string[] = [];
  page.on('dialog', (d) => {
    dialogs.push(d.message());
    void d.dismiss();
  });
  await loadPump(page);
  // In the lane caption and in the drawer, as the characters themselves.
  const cap = page.locator('.cap-name', { hasText: EVIL });
  await expect(cap).toHaveText(EVIL);
  await expect(page.locator('.net-row .net-name', { hasText: EVIL })).toHaveText(EVIL);
  // In the lane panel too.
  await cap.click();
  await page.keyboard.press('e');
  await expect(page.locator('#panel-lane .panel-title')).toHaveText(EVIL);
  // Renamed to another tag-like text, still text.
  await cap.dblclick();
  await page.locator('.cap-rename').fill('<b onmouseover=alert(2)>x</b>');
  await page.keyboard.press('Enter');
  await expect(page.locator('.cap-name', { hasText: '<b onmouseover' })).toHaveText('<b onmouseover=alert(2)>x</b>');
  // No element was made from the names and no script ran.
  expect(await page.locator('#captions img, #net-list img, #sheet img, #captions b').count()).toBe(0);
  expect(dialogs).toEqual([]);
});

test('the page ships a CSP without inline script or eval, breaks none of it, and asks no other site', async ({ page }) => {
  const violations: string[] = [];
  const requested: string[] = [];
  page.on('request', (r) => requested.push(r.url()));
  await page.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => {
      (window as unknown as { cspHits: string[] }).cspHits ??= [];
      (window as unknown as { cspHits: string[] }).cspHits.push(`${e.violatedDirective} ${e.blockedURI}`);
    });
  });
  const res = await page.goto('/');
  const csp = res!.headers()['content-security-policy'];
  expect(csp).toContain("script-src 'self'");
  expect(csp).not.toContain('unsafe-eval');
  expect(csp).not.toContain('unsafe-inline');
  await loadPump(page);
  await page.keyboard.press('t'); // both looks draw
  await page.keyboard.press('t');
  violations.push(...(await page.evaluate(() => (window as unknown as { cspHits?: string[] }).cspHits ?? [])));
  expect(violations).toEqual([]);
  const origin = new URL(page.url()).origin;
  expect(requested.filter((u) => !u.startsWith('data:') && !u.startsWith('blob:') && new URL(u).origin !== origin)).toEqual([]);
});
