import { describe, expect, test } from 'vitest';
import fc from 'fast-check';
import { propertySeed } from './property-seed.js';

describe('property-test seed', () => {
  test('fixed unless asked otherwise; "random" leaves fast-check to pick; a typo is refused by name', () => {
    const fixed = propertySeed(undefined);
    expect(Number.isInteger(fixed)).toBe(true);
    expect(propertySeed('')).toBe(fixed);
    expect(propertySeed('42')).toBe(42);
    expect(propertySeed('random')).toBeUndefined();
    expect(() => propertySeed('4x2')).toThrow(/VOLTWALK_PROPERTY_SEED: expected a whole number or "random", got "4x2"/);
  });

  test.skipIf(process.env.VOLTWALK_PROPERTY_SEED === 'random')('the setup file has put the seed in force: two runs of a property draw the same cases', () => {
    const draw = () => {
      const seen: number[] = [];
      fc.assert(fc.property(fc.integer(), (i) => void seen.push(i)), { numRuns: 5 });
      return seen;
    };
    expect(fc.readConfigureGlobal().seed).toBe(propertySeed(process.env.VOLTWALK_PROPERTY_SEED));
    expect(draw()).toEqual(draw());
  });
});
