import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { E_SERIES, bandsFor, decodeBands, encodeBands } from '../../src/units/index.js';

describe('IEC 60062 colour code: decoding', () => {
  // IEC 60062: digits black 0 … white 9; the third band of a 4-band code is the power of ten.
  it('yellow violet red gold = 4.7 kΩ ±5 %', () => {
    expect(decodeBands(['yellow', 'violet', 'red', 'gold'])).toMatchObject({ value: 4700, tolerance: 0.05 });
  });

  // IEC 60062: gold multiplier ×0.1, silver ×0.01.
  it('gold and silver multipliers', () => {
    expect(decodeBands(['yellow', 'violet', 'gold', 'gold']).value).toBe(4.7);
    expect(decodeBands(['yellow', 'violet', 'silver', 'silver'])).toMatchObject({ value: 0.47, tolerance: 0.1 });
  });

  // IEC 60062: three significant figures on 5-band codes; brown tolerance band = 1 %.
  it('5-band: brown black black red brown = 10 kΩ ±1 %', () => {
    expect(decodeBands(['brown', 'black', 'black', 'red', 'brown'])).toMatchObject({ value: 10000, tolerance: 0.01 });
  });

  // IEC 60062 tolerance bands: brown 1, red 2, green 0.5, blue 0.25, violet 0.1, grey 0.05, gold 5, silver 10 (%).
  it.each([
    ['brown', 0.01],
    ['red', 0.02],
    ['green', 0.005],
    ['blue', 0.0025],
    ['violet', 0.001],
    ['grey', 0.0005],
    ['gold', 0.05],
    ['silver', 0.1],
  ])('tolerance band %s = %d', (colour, tol) => {
    expect(decodeBands(['red', 'red', 'black', 'red', colour]).tolerance).toBe(tol);
  });

  // IEC 60062: no tolerance band means ±20 %.
  it('3 bands: no tolerance band = ±20 %', () => {
    expect(decodeBands(['brown', 'black', 'orange'])).toMatchObject({ value: 10000, tolerance: 0.2 });
  });

  // IEC 60062: sixth band = temperature coefficient (brown 100 ppm/K, from memory).
  it('6-band code carries the temperature coefficient', () => {
    expect(decodeBands(['orange', 'orange', 'black', 'brown', 'brown', 'brown'])).toMatchObject({
      value: 3300,
      tolerance: 0.01,
      tempcoPpm: 100,
    });
  });

  it('accepts grey/gray and violet/purple, any case', () => {
    expect(decodeBands(['Grey', 'RED', 'brown', 'gold']).value).toBe(820);
    expect(decodeBands(['gray', 'red', 'brown', 'gold']).value).toBe(820);
    expect(decodeBands(['yellow', 'purple', 'red', 'gold']).value).toBe(4700);
  });

  it.each([
    [['yellow', 'violet'], /2 bands/],
    [['yellow', 'pink', 'red', 'gold'], /"pink" is not a band colour/],
    [['gold', 'violet', 'red', 'gold'], /band 1 is gold/],
    [['yellow', 'violet', 'red', 'black'], /band 4 is black, which is not a tolerance colour/],
  ])('refuses %j', (bands, message) => {
    expect(() => decodeBands(bands as string[])).toThrow(message);
  });
});

describe('IEC 60062 colour code: encoding', () => {
  it('bands a person should see', () => {
    expect(bandsFor(4700, 0.05)).toEqual(['yellow', 'violet', 'red', 'gold']);
    expect(bandsFor(4700, 0.01)).toEqual(['yellow', 'violet', 'black', 'brown', 'brown']);
    expect(bandsFor(0.47, 0.05)).toEqual(['yellow', 'violet', 'silver', 'gold']);
    expect(bandsFor(12100, 0.01)).toEqual(['brown', 'red', 'brown', 'red', 'brown']);
  });

  it('refuses what the code cannot hold', () => {
    expect(encodeBands(4750, 0.05)).toBeUndefined();
    expect(encodeBands(-1)).toBeUndefined();
    expect(encodeBands(0.001, 0.05)).toBeUndefined();
  });

  it('encode then decode returns the value, tolerance and tempco (property, E24 and E96)', () => {
    fc.assert(
      fc.property(
        fc.constantFrom('E24', 'E96'),
        fc.nat(),
        fc.integer({ min: -1, max: 7 }),
        fc.constantFrom(0.05, 0.1, 0.01, 0.02, 0.005),
        (series, k, exp, tol) => {
          const table = E_SERIES[series as 'E24' | 'E96'];
          const value = Number(((table[k % table.length] / 100) * Math.pow(10, exp)).toPrecision(6));
          const bands = encodeBands(value, tol);
          if (series === 'E96' && tol >= 0.05 && bands === undefined) return; // 3 figures do not fit 4 bands
          // With three figures the smallest multiplier (silver, ×0.01) gives 1.00 Ω at the least.
          if (tol < 0.05 && value < 1) {
            expect(bands).toBeUndefined();
            return;
          }
          expect(bands).toBeDefined();
          const back = decodeBands(bands!);
          expect(back.value).toBeCloseTo(value, 9);
          expect(back.tolerance).toBe(tol);
        },
      ),
    );
  });

  it('6-band round trip keeps the temperature coefficient', () => {
    const bands = encodeBands(3300, 0.01, 50)!;
    expect(bands).toHaveLength(6);
    expect(decodeBands(bands)).toMatchObject({ value: 3300, tolerance: 0.01, tempcoPpm: 50 });
  });
});
