// Browser tests of the viewer. Debian's Chromium with software WebGL (SwiftShader) is the CI
// browser; on a laptop without it, Playwright's own Chromium is used instead.
// The full suite runs against `vite` (dev, which also serves samples/ for ?dump=); one smoke
// spec runs against the built page (`vite build` + `vite preview`) to check the shipped CSP.

import { existsSync } from 'node:fs';
import { defineConfig } from '@playwright/test';

function findChromium(): string | undefined {
  if (process.env.CHROMIUM_PATH) return process.env.CHROMIUM_PATH;
  if (existsSync('/usr/bin/chromium')) return '/usr/bin/chromium';
  return undefined; // Playwright's bundled browser
}

export const chromiumPath = findChromium();

export const chromiumArgs = [
  '--no-sandbox',
  '--disable-gpu',
  '--use-angle=swiftshader',
  '--enable-unsafe-swiftshader',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

export default defineConfig({
  testDir: 'test/e2e',
  testIgnore: /bench/,
  timeout: 90_000,
  expect: { timeout: 15_000 },
  workers: 1, // 2 cores, and SwiftShader draws on the CPU
  // One retry on CI absorbs a frame that software WebGL on a busy machine delivers late; a test
  // that fails twice still fails the run.
  retries: process.env.CI ? 1 : 0,
  fullyParallel: false,
  reporter: process.env.CI ? [['list'], ['html', { open: 'never' }]] : 'list',
  use: {
    browserName: 'chromium',
    headless: true,
    viewport: { width: 1280, height: 720 },
    acceptDownloads: true,
    launchOptions: { executablePath: chromiumPath, args: chromiumArgs },
  },
  projects: [
    { name: 'dev', use: { baseURL: 'http://127.0.0.1:5173' }, testIgnore: [/preview\.spec\.ts/, /read-threads\.spec\.ts/, /bench/] },
    // The built page; reading in parts runs here because nested workers are bundled only by a build.
    { name: 'preview', use: { baseURL: 'http://127.0.0.1:4173' }, testMatch: [/preview\.spec\.ts/, /read-threads\.spec\.ts/] },
  ],
  webServer: [
    { command: 'npx vite', url: 'http://127.0.0.1:5173', reuseExistingServer: !process.env.CI, timeout: 60_000 },
    {
      // Built into dist/web so the CLI build in dist/cli is left alone.
      command: 'npx vite build --outDir dist/web --emptyOutDir --logLevel warn && npx vite preview --outDir dist/web',
      url: 'http://127.0.0.1:4173',
      reuseExistingServer: !process.env.CI,
      timeout: 120_000,
    },
  ],
});
