import { describe, expect, it } from 'vitest';
import { DBU_REFERENCE_VOLTS, fromDbu, parseHissReading, toDbu } from '../../src/units/index.js';
import { UserInputError } from '../../src/errors.js';

const problemOf = (text: string) => {
  try {
    parseHissReading(text);
  } catch (error) {
    if (error instanceof UserInputError) return error.problems[0];
    throw error;
  }
  throw new Error(`"${text}" was accepted`);
};

describe('a hiss level as an audio interface or millivoltmeter shows it', () => {
  it('reads volts rms with any prefix', () => {
    expect(parseHissReading('390uV')).toBeCloseTo(390e-6, 15);
    expect(parseHissReading('390 µV')).toBeCloseTo(390e-6, 15);
    expect(parseHissReading('0,39 mV')).toBeCloseTo(390e-6, 15);
  });

  it('reads dBu against 0.7746 V and dBV against 1 V', () => {
    // 0 dBu = √0.6 V ≈ 0.7746 V rms: 1 mW into 600 Ω (common practice in audio).
    expect(DBU_REFERENCE_VOLTS).toBeCloseTo(Math.sqrt(0.6), 4);
    expect(parseHissReading('0 dBu')).toBeCloseTo(0.7746, 12);
    // −20 dB is a tenth of the voltage.
    expect(parseHissReading('-20 dBu')).toBeCloseTo(0.07746, 12);
    expect(parseHissReading('−66,0dBu')).toBeCloseTo(0.7746 * 10 ** (-66 / 20), 12);
    expect(parseHissReading('-60 dBV')).toBeCloseTo(1e-3, 15);
    expect(toDbu(fromDbu(-66.1))).toBeCloseTo(-66.1, 12);
  });

  it('refuses a level with no voltage reference, zero, a negative level and a typo, naming the accepted forms', () => {
    expect(problemOf('-20 dBFS').message).toContain("dBFS is relative to the interface's own full scale");
    expect(problemOf('12 dB').message).toContain('plain dB is a ratio');
    expect(problemOf('0').message).toContain('an rms level is above zero');
    expect(problemOf('-3uV').message).toContain('an rms level is above zero');
    for (const text of ['abc', '12 dB', '0', '4x2uV']) expect(problemOf(text).accepted).toMatch(/^a hiss level in volts rms, .* or in dBu or dBV/);
    // A stray letter before a level in dB is a typo, never a sign: it must not come back as a number.
    for (const text of ['x66 dBu', 'a-66 dBu', '=66 dBu']) expect(problemOf(text).accepted).toMatch(/^a hiss level/);
    expect(parseHissReading('+4 dBu')).toBeCloseTo(0.7746 * 10 ** (4 / 20), 12);
  });
});
