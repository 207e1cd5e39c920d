// Opening dumps the three ways a person can: the file picker, a drop anywhere on the page, and
// ?dump= for a same-origin sample; and what happens when a dump is broken.
// Expected times come from the hand-written fixture test/e2e/fixtures/pump.vcd (1 ns
// timescale): `enable` rises at #10 and falls at #150.

import { gzipSync } from 'node:zlib';
import { expect, test } from '@playwright/test';
import { caption, expectEnableEdgeAt10ns, loadFile, loadPump, openViewer, pumpVcd } from './helpers';

test('a dump opened with the file picker draws its traces, with the enable edge at 10 ns', async ({ page }) => {
  await loadPump(page);
  await expect(page.locator('#dump-info')).toContainText('1 ns timescale');
  await expect(page.locator('#dump-info')).toContainText('9 nets');
  for (const name of ['clk', 'enable', 'duty', 'state', 'coolant_temp']) await expect(caption(page, name)).toBeVisible();
  await expect(page.locator('#renderer-name')).toHaveText('WebGL');
  await expectEnableEdgeAt10ns(page);
});

test('a gzip-compressed dump dropped anywhere on the page opens', async ({ page }) => {
  await openViewer(page);
  const gz = gzipSync(pumpVcd());
  const dt = await page.evaluateHandle((bytes) => {
    const d = new DataTransfer();
    d.items.add(new File([new Uint8Array(bytes)], 'pump.vcd.gz', { type: 'application/gzip' }));
    return d;
  }, [...gz]);
  await page.dispatchEvent('.toolstrip', 'dragenter', { dataTransfer: dt });
  await expect(page.locator('#drop-veil')).toBeVisible();
  await page.dispatchEvent('.toolstrip', 'dragover', { dataTransfer: dt });
  await page.dispatchEvent('.toolstrip', 'drop', { dataTransfer: dt });
  await expect(page.locator('#file-name')).toHaveText('pump.vcd.gz');
  await expect(page.locator('#drop-veil')).toBeHidden();
  await expectEnableEdgeAt10ns(page);
});

test('?dump= opens a sample from the same site, and refuses other sites without asking them', async ({ page }) => {
  const requested: string[] = [];
  page.on('request', (r) => requested.push(r.url()));
  await openViewer(page, '?dump=samples/sensor_hub.vcd');
  await expect(page.locator('#file-name')).toHaveText('sensor_hub.vcd');
  await expect(caption(page, 'clk_ref')).toBeVisible();
  await openViewer(page, '?dump=' + encodeURIComponent('https://example.com/evil.vcd'));
  await expect(page.locator('#error-panel')).toBeVisible();
  await expect(page.locator('#error-text')).toContainText('only dumps from this site');
  const origin = new URL(page.url()).origin;
  expect(requested.filter((u) => !u.startsWith('data:') && new URL(u).origin !== origin)).toEqual([]);
});

test('a broken dump shows the line in an error panel while the previous traces stay on screen', async ({ page }) => {
  await loadPump(page);
  await expectEnableEdgeAt10ns(page);
  const lines = ['$timescale 1ns $end', '$scope module m $end', '$var wire 1 ! a $end', '$upscope $end', '$enddefinitions $end', '#0', '0!', '#10', '1!', '#5', '0!'];
  // Time going backwards (#10 then #5) is an error in IEEE 1364 §18.2.1: timestamps increase.
  await page.setInputFiles('#file-input', { name: 'broken.vcd', mimeType: 'text/plain', buffer: Buffer.from(lines.join('\n') + '\n') });
  await expect(page.locator('#error-panel')).toBeVisible();
  await expect(page.locator('#error-title')).toHaveText('Could not open broken.vcd');
  await expect(page.locator('#error-where')).toContainText(`line ${lines.indexOf('#5') + 1}`);
  await expect(page.locator('#error-text')).toContainText('broken.vcd');
  // The old dump is still the one shown.
  await expect(page.locator('#file-name')).toHaveText('pump.vcd');
  await expect(caption(page, 'enable')).toBeVisible();
  await expectEnableEdgeAt10ns(page);
  await page.click('#error-close');
  await expect(page.locator('#error-panel')).toBeHidden();
});

test('a dump cut off mid-line still opens and says where it stops', async ({ page }) => {
  await openViewer(page);
  const text = pumpVcd().toString('utf8');
  const cut = text.slice(0, text.indexOf('b01111111') + 4); // ends inside the vector value written at #100
  await loadFile(page, 'cut.vcd', Buffer.from(cut));
  await expect(page.locator('#notice')).toContainText('cut off');
  await expect(caption(page, 'enable')).toBeVisible();
});

test('a load in progress shows bytes and rate, and Cancel stops it with the old dump still shown', async ({ page }) => {
  await loadPump(page);
  // A 36 MB dump made in the page: one net rewritten 12 million times at one timestamp
  // (legal VCD), big enough that parsing it takes a while.
  await page.evaluate(() => {
    const head = '$timescale 1ps $end\n$scope module m $end\n$var wire 1 ! a $end\n$upscope $end\n$enddefinitions $end\n#1\n';
    const chunk = new TextEncoder().encode('0!\n1!\n'.repeat(100_000));
    const file = new File([head, ...Array(60).fill(chunk), '#2\n'], 'huge.vcd');
    const dt = new DataTransfer();
    dt.items.add(file);
    window.dispatchEvent(new DragEvent('drop', { dataTransfer: dt, bubbles: true, cancelable: true }));
  });
  await expect(page.locator('#progress')).toBeVisible();
  await expect(page.locator('#progress-text')).toHaveText(/^huge\.vcd: [\d.]+ (B|KiB|MiB) of 34\.3 MiB · [\d.]+ (B|KiB|MiB)\/s$/);
  await page.click('#progress-cancel');
  await expect(page.locator('#notice')).toHaveText('loading huge.vcd cancelled; the dump shown before stays open');
  await expect(page.locator('#progress')).toBeHidden();
  await expect(page.locator('#file-name')).toHaveText('pump.vcd');
  await expectEnableEdgeAt10ns(page);
});

test('a .vcd.gz cut short opens what it holds and says so; a damaged one is refused', async ({ page }) => {
  await openViewer(page);
  const gz = gzipSync(pumpVcd());
  await loadFile(page, 'cut.vcd.gz', gz.subarray(0, gz.length - 40));
  await expect(page.locator('#notice')).toContainText('cut.vcd.gz: the compressed file stops early');
  await expect(caption(page, 'enable')).toBeVisible();
  const damaged = Buffer.from(gz);
  damaged[20] ^= 0xff;
  damaged[30] ^= 0xff;
  await page.setInputFiles('#file-input', { name: 'bad.vcd.gz', mimeType: 'application/gzip', buffer: damaged });
  await expect(page.locator('#error-text')).toContainText('looks gzip-compressed but is damaged');
  await expect(page.locator('#file-name')).toHaveText('cut.vcd.gz');
});
