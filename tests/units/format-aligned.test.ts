import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { bandFigures, formatAligned, formatBand, parseValue } from '../../src/units/index.js';

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

  it('a band takes the figures that keep its edges apart, lined up', () => {
    // By hand: 11.74 V to 11.80 V needs four figures (a step of 0.01 V; 0.06 V is 6 steps, ≥ 4).
    expect(formatBand(11.74, 11.8, 11.77, 'V')).toEqual({ min: '11.74 V', max: '11.80 V', nominal: '11.77 V' });
    // An open end (a resistance up to overload) keeps the plain form; three figures at the other.
    expect(formatBand(4.7e3, Infinity, 4.7e3, 'Ω')).toEqual({ min: '4.70 kΩ', max: '∞ Ω', nominal: '4.70 kΩ' });
  });

  it('leaves a value that is not finite to the plain form', () => {
    expect(formatAligned([4.7e3, Infinity], 'Ω', 3)).toEqual(['4.70 kΩ', '∞ Ω']);
  });

  it('for any band: one prefix and one count of decimals, each value read back within half its last digit', () => {
    const magnitude = fc.double({ min: 1e-4, max: 1e7, noNaN: true });
    fc.assert(
      fc.property(magnitude, fc.double({ min: 1e-4, max: 0.5, noNaN: true }), fc.boolean(), (centre, spread, negative) => {
        const nominal = negative ? -centre : centre;
        const [lo, hi] = [nominal - spread * centre, nominal + spread * centre];
        const figures = bandFigures(lo, hi);
        const texts = formatAligned([lo, hi, nominal], 'V', figures);
        const [numbers, suffixes] = [texts.map((t) => t.split(' ')[0]), texts.map((t) => t.split(' ')[1])];
        const decimals = numbers.map((n) => n.split('.')[1]?.length ?? 0);
        expect(new Set(suffixes).size).toBe(1);
        expect(new Set(decimals).size).toBe(1);
        const step = parseValue(`${10 ** -decimals[0]} ${suffixes[0]}`, { unit: 'V' }).value;
        texts.forEach((t, k) => expect(Math.abs(parseValue(t, { unit: 'V' }).value - [lo, hi, nominal][k])).toBeLessThanOrEqual(step / 2 + 1e-9 * Math.abs(hi)));
      }),
      { numRuns: 300 },
    );
  });
});
