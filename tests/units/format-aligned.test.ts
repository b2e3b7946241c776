import { describe, expect, it } from 'vitest';
import { formatAligned } from '../../src/units/index.js';

describe('values read against each other share a prefix and decimals', () => {
  it('keeps the trailing zero that lines the edges up', () => {
    expect(formatAligned([-11.8, -11.75, -11.77], 'V', 4)).toEqual(['-11.80 V', '-11.75 V', '-11.77 V']);
    expect(formatAligned([4.65, 4.95, 4.8], 'V', 3)).toEqual(['4.65 V', '4.95 V', '4.80 V']);
  });

  it('takes the prefix and decimals from the largest value', () => {
    // 1.08 mV at three figures: two decimals of a millivolt, so 301 µV shows as 0.30 mV.
    expect(formatAligned([-1.08e-3, -0.301e-3], 'V', 3)).toEqual(['-1.08 mV', '-0.30 mV']);
    expect(formatAligned([76.2e3, 78.1e3], 'Ω', 3)).toEqual(['76.2 kΩ', '78.1 kΩ']);
    // 999.96 kΩ at four figures rounds to 1000 kΩ: shown in the next prefix up.
    expect(formatAligned([999.96e3, 990e3], 'Ω', 4)).toEqual(['1.000 MΩ', '0.990 MΩ']);
  });

  it('shows zero unsigned, and a set below the reading floor as zeros', () => {
    expect(formatAligned([-0.01, 0.01, -1e-9], 'V', 3)).toEqual(['-10.0 mV', '10.0 mV', '0.0 mV']);
    expect(formatAligned([1e-13, 3e-13], 'V', 3)).toEqual(['0 V', '0 V']);
  });

  it('leaves a value that is not finite to the plain form', () => {
    expect(formatAligned([4.7e3, Infinity], 'Ω', 3)).toEqual(['4.70 kΩ', '∞ Ω']);
  });
});
