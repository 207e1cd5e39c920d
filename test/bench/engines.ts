/// <reference types="vite/client" />
// The midrail code under test, found at build time with import.meta.glob so the benchmark still
// builds (and says what is missing) while a module has not landed yet. The shapes below are
// only the parts the benchmark calls.

import type { Dump } from '../../src/model/dump';

export interface StreamingParser {
  push(chunk: Uint8Array): void;
  finish(): Dump;
}
export type ParserClass = new (source: string) => StreamingParser;

const parserModules = import.meta.glob('../../src/parse/vcd.ts');
const measureModules = import.meta.glob('../../src/measure/index.ts');

export async function loadParser(): Promise<ParserClass | null> {
  const load = Object.values(parserModules)[0];
  if (!load) return null;
  const mod = (await load()) as { VcdParser?: ParserClass };
  return typeof mod.VcdParser === 'function' ? mod.VcdParser : null;
}

/** The measurement module's exports, untyped here; sections/measure*.ts adapt to them. */
export async function loadMeasure(): Promise<Record<string, unknown> | null> {
  const load = Object.values(measureModules)[0];
  if (!load) return null;
  return (await load()) as Record<string, unknown>;
}
