import { describe, expect, it } from 'vitest';
import { LevelSyntaxError, levelValue, parseLevel } from '../../src/measure';

describe('parseLevel', () => {
  it('reads a percentage of the swing and an absolute value in volts', () => {
    expect(parseLevel('50%')).toEqual({ kind: 'percent', percent: 50, text: '50%' });
    expect(parseLevel(' 30 % ')).toMatchObject({ kind: 'percent', percent: 30 });
    expect(parseLevel('1.5V')).toEqual({ kind: 'absolute', value: 1.5, text: '1.5V' });
    expect(parseLevel('1300mV')).toMatchObject({ kind: 'absolute', value: 1.3 });
  });

  it('rejects a bare number, an unknown unit and percentages outside the swing', () => {
    for (const bad of ['50', '1.5', '2ns', '', '0%', '100%', '-5%', 'half']) {
      expect(() => parseLevel(bad), bad).toThrow(LevelSyntaxError);
    }
  });

  it('places a percent level between the state levels (IEEE 181 percent reference level)', () => {
    // y(x%) = low + x/100 · (high − low): IEEE 181-2011 definition of a percent reference level (from memory).
    expect(levelValue(parseLevel('50%'), 0, 3.3)).toBeCloseTo(1.65, 12);
    expect(levelValue(parseLevel('10%'), 1, 3)).toBeCloseTo(1.2, 12);
    expect(levelValue(parseLevel('1.5V'), 0, 3.3)).toBe(1.5);
  });
});
