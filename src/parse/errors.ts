// A parse error that names where it happened and what was expected, so a user can open the
// file at that line and see the problem.

export class VcdError extends Error {
  constructor(
    readonly source: string,
    readonly line: number,
    readonly offset: number,
    readonly problem: string,
    readonly expected: string,
  ) {
    super(`${source}: line ${line}, byte ${offset}: ${problem}${expected ? `; expected ${expected}` : ''}`);
    this.name = 'VcdError';
  }
}

/** Caps that keep hostile or broken input from exhausting memory; each has its own error. */
export interface VcdLimits {
  /** Longest line in bytes. */
  maxLineBytes: number;
  /** Longest identifier code in bytes. */
  maxCodeBytes: number;
  /** Widest vector in bits. */
  maxVectorWidth: number;
  /** Most $var declarations. */
  maxNets: number;
}

export const DEFAULT_LIMITS: VcdLimits = {
  maxLineBytes: 4 * 1024 * 1024,
  maxCodeBytes: 256,
  maxVectorWidth: 1 << 20,
  maxNets: 4_000_000,
};
