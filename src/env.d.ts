/** Package version, injected at build time by vite.config.ts. */
declare const __MIDRAIL_VERSION__: string;
