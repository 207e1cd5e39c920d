/// <reference types="vitest/config" />
import { readFileSync } from 'node:fs';
import { defineConfig } from 'vite';

const pkg = JSON.parse(readFileSync(new URL('./package.json', import.meta.url), 'utf8')) as { version: string };

// Cross-origin isolation lets workers share memory later; the CSP forbids inline script and eval.
const headers = {
  'Cross-Origin-Opener-Policy': 'same-origin',
  'Cross-Origin-Embedder-Policy': 'require-corp',
  'Content-Security-Policy':
    "default-src 'none'; script-src 'self'; style-src 'self'; img-src 'self' data: blob:; font-src 'self'; " +
    "connect-src 'self'; worker-src 'self' blob:; object-src 'none'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'",
  'X-Content-Type-Options': 'nosniff',
  'Referrer-Policy': 'no-referrer',
};

export default defineConfig({
  server: { host: '127.0.0.1', port: 5173, strictPort: true, headers },
  preview: { host: '127.0.0.1', port: 4173, strictPort: true, headers },
  define: { __MIDRAIL_VERSION__: JSON.stringify(pkg.version) },
  worker: { format: 'es' },
  // exceljs is reached only through the measuring worker's lazy import; bundling it up front spares
  // the dev page a reload the first time a workbook is written.
  optimizeDeps: { include: ['exceljs'] },
  // The page builds into dist/web; the CLI builds into dist/cli (package.json `prepare`).
  build: { target: 'es2022', outDir: 'dist/web' },
  test: {
    environment: 'node',
    include: ['test/unit/**/*.test.ts', 'test/sim/**/*.test.ts', 'test/cli/**/*.test.ts'],
    testTimeout: 60_000,
  },
});
