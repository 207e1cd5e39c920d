/// <reference types="vite/client" />
// The midrail code under test. The measurement module is found at build time with
// import.meta.glob, so the benchmark still builds (and says what is missing) without it. The
// shapes below are only the parts the benchmark calls.

import type { Dump } from '../../src/model/dump';
import { VcdParser } from '../../src/parse/vcd';

export interface StreamingParser {
  push(chunk: Uint8Array): void;
  finish(): Dump;
}
export type ParserClass = new (source: string) => StreamingParser;

const measureModules = import.meta.glob('../../src/measure/index.ts');

/** The parser (imported statically: the CLI reader the bench also runs imports it anyway). */
export async function loadParser(): Promise<ParserClass | null> {
  return VcdParser;
}

/** The measurement module's exports, untyped here; sections/measure*.ts adapt to them. */
export async function loadMeasure(): Promise<Record<string, unknown> | null> {
  const load = Object.values(measureModules)[0];
  if (!load) return null;
  return (await load()) as Record<string, unknown>;
}
