import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { E_SERIES, SERIES_NAMES, isPreferred, nearestPreferred } from '../../src/units/index.js';

describe('IEC 60063 preferred values', () => {
  // IEC 60063: E12 = 10 12 15 18 22 27 33 39 47 56 68 82.
  it('E12 is the standard list', () => {
    expect(E_SERIES.E12.map((v) => v / 10)).toEqual([10, 12, 15, 18, 22, 27, 33, 39, 47, 56, 68, 82]);
  });

  // IEC 60063: E24 adds 11 13 16 20 24 30 36 43 51 62 75 91 to E12.
  it('E24 is E12 plus the standard in-between values', () => {
    const added = E_SERIES.E24.filter((v) => !E_SERIES.E12.includes(v)).map((v) => v / 10);
    expect(added).toEqual([11, 13, 16, 20, 24, 30, 36, 43, 51, 62, 75, 91]);
  });

  // IEC 60063: E6 is every second E12 value.
  it('E6 is every second value of E12', () => {
    expect(E_SERIES.E6).toEqual(E_SERIES.E12.filter((_, i) => i % 2 === 0));
  });

  // IEC 60063: E96 begins 100 102 105 107 and follows rounding 10^(i/96) to three figures.
  it('E96 follows 10^(i/96) rounded to three figures', () => {
    expect(E_SERIES.E96.slice(0, 4)).toEqual([100, 102, 105, 107]);
    expect(E_SERIES.E96).toHaveLength(96);
    const computed = Array.from({ length: 96 }, (_, i) => Math.round(100 * Math.pow(10, i / 96)));
    const differences = E_SERIES.E96.filter((v, i) => v !== computed[i]);
    // IEC 60063 itself lists 920 as 919 in E192 only; E96 has no exception (common practice).
    expect(differences).toEqual([]);
  });

  it('E48 is every second value of E96 (IEC 60063)', () => {
    expect(E_SERIES.E48).toEqual(E_SERIES.E96.filter((_, i) => i % 2 === 0));
  });

  // IEC 60063 notes E24 is not the rounding of 10^(i/24): rounding would give 26, 29, … 83.
  it('E24 cannot be derived by rounding', () => {
    const rounded = Array.from({ length: 24 }, (_, i) => Math.round(10 * Math.pow(10, i / 24)) * 10);
    expect(rounded).toContain(260);
    expect(rounded).toContain(830);
    expect(E_SERIES.E24).not.toContain(260);
    expect(E_SERIES.E24).not.toContain(830);
  });

  it('every series is ascending within one decade', () => {
    for (const name of SERIES_NAMES) {
      const s = E_SERIES[name];
      expect(s[0]).toBe(100);
      for (let i = 1; i < s.length; i++) expect(s[i]).toBeGreaterThan(s[i - 1]);
      expect(s[s.length - 1]).toBeLessThan(1000);
    }
  });

  it('finds the nearest value across decades', () => {
    expect(nearestPreferred(4600, 'E12')).toMatchObject({ value: 4700, below: 3900, above: 4700 });
    expect(nearestPreferred(9600, 'E24')).toMatchObject({ value: 10000, below: 9100, above: 10000 });
    expect(nearestPreferred(0.5, 'E6').value).toBe(0.47);
    expect(nearestPreferred(4.7e-9, 'E12').value).toBeCloseTo(4.7e-9, 20);
  });

  it('every preferred value is its own nearest (property)', () => {
    fc.assert(
      fc.property(fc.constantFrom(...SERIES_NAMES), fc.nat(), fc.integer({ min: -12, max: 6 }), (name, k, exp) => {
        const table = E_SERIES[name];
        const value = (table[k % table.length] / 100) * Math.pow(10, exp);
        expect(isPreferred(value, name)).toBe(true);
        const near = nearestPreferred(value, name);
        expect(near.value / value).toBeCloseTo(1, 9);
      }),
    );
  });

  it('nearest is always one of the two neighbours and within half a step (property)', () => {
    fc.assert(
      fc.property(fc.constantFrom(...SERIES_NAMES), fc.double({ min: 1e-3, max: 1e7, noNaN: true }), (name, value) => {
        const n = nearestPreferred(value, name);
        expect(n.below).toBeLessThanOrEqual(value * (1 + 1e-9));
        expect(n.above).toBeGreaterThanOrEqual(value * (1 - 1e-9));
        expect([n.below, n.above]).toContain(n.value);
      }),
    );
  });

  it('4k6 is not preferred, 4k7 is (E12)', () => {
    expect(isPreferred(4600, 'E12')).toBe(false);
    expect(isPreferred(4700, 'E12')).toBe(true);
    expect(isPreferred(4750, 'E96')).toBe(true);
    expect(isPreferred(4750, 'E24')).toBe(false);
  });
});
