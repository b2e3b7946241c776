import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { bandFigures, formatReading, formatValue, parseReading, parseValue } from '../../src/units/index.js';
import { UserInputError } from '../../src/errors.js';

describe('parseValue: IEC 60062 letter code (RKM)', () => {
  // IEC 60062, letter code for resistance and capacitance values: the letter stands for the decimal point.
  it.each([
    ['R47', 0.47],
    ['0R47', 0.47],
    ['2R2', 2.2],
    ['4R7', 4.7],
    ['470R', 470],
    ['4K7', 4700],
    ['4k7', 4700],
    ['47K3', 47300],
    ['4M7', 4.7e6],
    ['4n7', 4.7e-9],
    ['1µ0', 1e-6],
    ['2u2', 2.2e-6],
    ['3m3', 3.3e-3],
    ['680p', 680e-12],
  ])('%s = %d', (text, value) => {
    expect(parseValue(text).value).toBe(value);
  });

  // IEC 60062 tolerance letters: F 1 %, G 2 %, J 5 %, K 10 %, M 20 %.
  it.each([
    ['4k7F', 0.01],
    ['4k7G', 0.02],
    ['4k7J', 0.05],
    ['4k7K', 0.1],
    ['4k7M', 0.2],
    ['2R2F', 0.01],
  ])('%s carries tolerance %d', (text, tol) => {
    const p = parseValue(text);
    expect(p.value).toBeCloseTo(text.startsWith('2R2') ? 2.2 : 4700, 9);
    expect(p.tolerance).toBe(tol);
  });
});

describe('parseValue: engineering notation and units', () => {
  it.each([
    ['4.7k', 4700, undefined],
    ['4700', 4700, undefined],
    ['1M', 1e6, undefined],
    ['100n', 100e-9, undefined],
    ['10µ', 10e-6, undefined],
    ['10u', 10e-6, undefined],
    ['10kΩ', 10e3, 'Ω'],
    ['10k ohm', 10e3, 'Ω'],
    ['100nF', 100e-9, 'F'],
    ['1.5 V', 1.5, 'V'],
    ['-12V', -12, 'V'],
    ['−12 V', -12, 'V'],
    ['420mV', 0.42, 'V'],
    ['20mA', 0.02, 'A'],
    ['0.25W', 0.25, 'W'],
    ['1kHz', 1000, 'Hz'],
    ['1e3', 1000, undefined],
    ['.5', 0.5, undefined],
  ])('%s = %d %s', (text, value, unit) => {
    const p = parseValue(text);
    expect(p.value).toBe(value);
    expect(p.unit).toBe(unit);
  });

  it('reads a decimal comma as a decimal point (documented choice)', () => {
    expect(parseValue('4,7k').value).toBe(4700);
    expect(parseValue('4,7').value).toBe(4.7);
    expect(parseValue('-11,93 V').value).toBe(-11.93);
  });

  it('reads a percentage tolerance after the value', () => {
    expect(parseValue('4.7k 5%')).toEqual({ value: 4700, tolerance: 0.05 });
    expect(parseValue('10k ±1%').tolerance).toBe(0.01);
  });

  it('keeps case: M is mega, m is milli (unlike SPICE)', () => {
    expect(parseValue('1M').value).toBe(1e6);
    expect(parseValue('1m').value).toBe(1e-3);
  });
});

describe('parseValue: refusals name the problem and the accepted forms', () => {
  it.each(['4k7k', 'k', '1..2', '--5', '4,7,0', '', '   ', '1e999', 'NaN', 'abc', '4,700', '12 V V'])('refuses %j', (text) => {
    let caught: unknown;
    try {
      parseValue(text, { field: 'parts[3].value' });
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(UserInputError);
    const message = (caught as UserInputError).message;
    expect(message).toContain('parts[3].value');
    expect(message).toMatch(/accepted: /);
    expect(message.split('\n')).toHaveLength(1);
  });

  it('refuses a unit that does not fit the field', () => {
    expect(() => parseValue('100nF', { unit: 'Ω', field: 'R1' })).toThrow(/unit is F but Ω is expected/);
  });
});

describe('parseReading', () => {
  it.each([
    ['4.2', 4.2],
    ['4.2 V', 4.2],
    ['420mV', 0.42],
    ['-11,9', -11.9],
    [' 0 ', 0],
  ])('voltage %j = %d', (text, v) => {
    expect(parseReading(text, 'voltage')).toBe(v);
  });

  it('takes ohms for resistance readings', () => {
    expect(parseReading('4k7', 'resistance')).toBe(4700);
    expect(parseReading('1.2 MΩ', 'resistance')).toBe(1.2e6);
  });

  it('refuses a typo with a hint for the quantity', () => {
    expect(() => parseReading('4.2.1', 'voltage', 'TP3')).toThrow(/TP3: "4.2.1" is not a value.*accepted: a voltage reading such as 4.2 or 420mV/);
    expect(() => parseReading('4.2 Ω', 'voltage')).toThrow(/V is expected/);
  });
});

describe('formatValue', () => {
  it.each([
    [4700, 'Ω', '4.7 kΩ'],
    [100e-9, 'F', '100 nF'],
    [-11.93, 'V', '-11.9 V'],
    [0.47, 'Ω', '470 mΩ'],
    [999_960, 'Ω', '1 MΩ'],
    [0, 'V', '0 V'],
    [2.2e-6, 'F', '2.2 µF'],
  ])('%d %s -> %s', (value, unit, text) => {
    expect(formatValue(value, unit)).toBe(text);
  });

  it('round-trips through parseValue to 3 significant figures (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-12, max: 1e9, noNaN: true }), fc.boolean(), (x, negative) => {
        const v = negative ? -x : x;
        const back = parseValue(formatValue(v, 'V')).value;
        expect(Math.abs(back - v)).toBeLessThanOrEqual(Math.abs(v) * 5e-3);
      }),
    );
  });

  it('letter-code text round-trips exactly (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 999 }), fc.integer({ min: 0, max: 9 }), fc.constantFrom('R', 'k', 'M', 'n', 'u', 'p'), (a, b, letter) => {
        const text = `${a}${letter}${b}`;
        const scale = { R: 1, k: 1e3, M: 1e6, n: 1e-9, u: 1e-6, p: 1e-12 }[letter];
        expect(parseValue(text).value / scale).toBeCloseTo(Number(`${a}.${b}`), 9);
      }),
    );
  });
});

describe('formatReading', () => {
  it('shows four figures, as a meter does for a rail', () => {
    expect(formatReading(11.774, 'V')).toBe('11.77 V');
    expect(formatReading(-0.98766, 'V')).toBe('-987.7 mV');
    expect(formatReading(77_140, 'Ω')).toBe('77.14 kΩ');
  });

  it('shows solver residue below 10 µV as zero', () => {
    expect(formatReading(-2.55e-12, 'V')).toBe('0 V');
    expect(formatReading(9e-6, 'V')).toBe('0 V');
    expect(formatReading(2e-5, 'V')).toBe('20 µV');
  });
});

describe('bandFigures', () => {
  it('adds figures until a narrow band spans at least four steps of its last digit', () => {
    // A rail band 11.74 V … 11.80 V: three figures step 0.1 V (both edges would read 11.7/11.8),
    // four figures step 0.01 V, six steps across the band.
    expect(bandFigures(11.7397, 11.7989)).toBe(4);
    expect(formatValue(11.7397, 'V', bandFigures(11.7397, 11.7989))).toBe('11.74 V');
    // A wide band keeps the least asked for.
    expect(bandFigures(4.65, 4.95)).toBe(3);
    expect(bandFigures(-1.08e-3, -301e-6)).toBe(3);
    expect(bandFigures(4.65, 4.95, 4)).toBe(4);
  });

  it('stops at five figures, and leaves empty or unbounded bands alone', () => {
    expect(bandFigures(11.77391, 11.77392)).toBe(5);
    expect(bandFigures(5, 5)).toBe(3);
    expect(bandFigures(1e3, Infinity)).toBe(3);
    expect(bandFigures(0, 0, 4)).toBe(4);
  });
});
