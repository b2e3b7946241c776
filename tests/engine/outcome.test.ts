import { describe, expect, it } from 'vitest';
import { branchFor, classifyReading, meterAllowance } from '../../src/engine/outcome.js';
import { describeBand } from '../../src/engine/step-view.js';

const RAILS = [12, -12];

describe('classifyReading', () => {
  it('widens the band by the meter accuracy: ±(0.5 % + 2 counts) on a 2000-count meter (common practice, REFERENCES.md)', () => {
    // band top 11.80 V on the 20 V range: 0.5 % of 11.8 = 59 mV, 2 counts of 10 mV = 20 mV -> 79 mV of slack
    const band = { nominal: 11.76, min: 11.72, max: 11.8, unit: 'V' as const };
    expect(classifyReading(11.87, band, RAILS)).toBe('in-band');
    expect(classifyReading(11.9, band, RAILS)).toBe('high');
  });

  it('a rail test point reading off its band is low or high, not "stuck at the rail"', () => {
    const band = { nominal: 11.76, min: 11.72, max: 11.8, unit: 'V' as const };
    expect(classifyReading(10.9, band, RAILS)).toBe('low');
  });

  it('an op-amp output meant to rest near 0 V is stuck-at-rail near either rail (saturation ~1.5 V short of each rail: TL072 datasheet)', () => {
    const band = { nominal: 0, min: -0.02, max: 0.02, unit: 'V' as const };
    expect(classifyReading(10.6, band, RAILS)).toBe('stuck-at-rail');
    expect(classifyReading(-10.4, band, RAILS)).toBe('stuck-at-rail');
    expect(classifyReading(0.004, band, RAILS)).toBe('in-band');
    expect(classifyReading(3, band, RAILS)).toBe('high');
  });

  it('near-zero: a missing level, and a shorted resistance', () => {
    expect(classifyReading(0.01, { nominal: 4, min: 3.5, max: 4.5, unit: 'V' }, RAILS)).toBe('near-zero');
    expect(classifyReading(0.3, { nominal: 42e3, min: 40e3, max: 45e3, unit: 'Ω' }, RAILS)).toBe('near-zero');
    expect(classifyReading(12e3, { nominal: 42e3, min: 40e3, max: 45e3, unit: 'Ω' }, RAILS)).toBe('low');
  });

  it('an open circuit (overload) is in band where the board expects an open, high elsewhere', () => {
    expect(classifyReading(Infinity, { nominal: Infinity, min: Infinity, max: Infinity, unit: 'Ω' }, RAILS)).toBe('in-band');
    expect(classifyReading(42e3, { nominal: Infinity, min: Infinity, max: Infinity, unit: 'Ω' }, RAILS)).toBe('low');
    expect(classifyReading(Infinity, { nominal: 42e3, min: 40e3, max: 45e3, unit: 'Ω' }, RAILS)).toBe('high');
  });
});

describe('branchFor', () => {
  const band = { nominal: 1, min: 0.9, max: 1.1, unit: 'V' as const };
  it('takes the outcome branch, else the direction, else the default', () => {
    expect(branchFor({ 'stuck-at-rail': 'a', low: 'b', default: 'c' }, 'stuck-at-rail', 11, band)).toBe('stuck-at-rail');
    expect(branchFor({ high: 'b', default: 'c' }, 'stuck-at-rail', 11, band)).toBe('high');
    expect(branchFor({ high: 'b', default: 'c' }, 'near-zero', 0, band)).toBe('default');
    expect(branchFor({ low: 'b', default: 'c' }, 'near-zero', 0, band)).toBe('low');
  });
});

describe('meterAllowance and the band as worded', () => {
  it('is the slack classifyReading allows at each edge', () => {
    // Same arithmetic as above: 11.80 V on the 20 V range -> 59 mV + 20 mV.
    const band = { nominal: 11.76, min: 11.72, max: 11.8, unit: 'V' as const };
    const { below, above } = meterAllowance(band);
    expect(above).toBeCloseTo(0.005 * 11.8 + 2 * 0.01, 12);
    expect(below).toBeCloseTo(0.005 * 11.72 + 2 * 0.01, 12);
    expect(classifyReading(band.min - below * 0.99, band, RAILS)).toBe('in-band');
    expect(classifyReading(band.min - below * 1.01, band, RAILS)).toBe('low');
    expect(meterAllowance({ nominal: 1e12, min: 1e6, max: Infinity, unit: 'Ω' }).above).toBe(0);
  });

  it('words a narrow band with enough figures to keep its edges apart', () => {
    expect(describeBand({ nominal: 11.7739, min: 11.7397, max: 11.7989, unit: 'V' })).toBe('11.74 V to 11.80 V (nominal 11.77 V)');
    expect(describeBand({ nominal: 4.8, min: 4.65, max: 4.95, unit: 'V' })).toBe('4.65 V to 4.95 V (nominal 4.80 V)');
  });
});
