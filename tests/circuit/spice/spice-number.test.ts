import { beforeAll, describe, expect, it } from 'vitest';
import { readSpiceNumber } from '../../../src/circuit/spice/spice-number.js';
import { REFERENCE, ngspiceOperatingPoint, startNgspice } from '../../reference/ngspice.js';

// Scale factors as the ngspice user manual lists them for numbers in a netlist ("T G Meg K mil m u
// n p f", case-insensitive, letters after them ignored) — from memory, and checked against the
// reference simulator below, which reads the same strings.
const CASES: Array<[string, number]> = [
  ['1', 1],
  ['-2.5', -2.5],
  ['1e3', 1e3],
  ['.5', 0.5],
  ['4.7k', 4.7e3],
  ['4.7K', 4.7e3],
  ['100n', 100e-9],
  ['2.2u', 2.2e-6],
  ['10p', 10e-12],
  ['3f', 3e-15],
  ['1meg', 1e6],
  ['1MEG', 1e6],
  ['1Meg', 1e6],
  ['2g', 2e9],
  ['1t', 1e12],
  ['1m', 1e-3],
  ['1M', 1e-3], // the trap: M is milli
  ['2mil', 50.8e-6],
  ['10kohm', 10e3],
  ['1uF', 1e-6],
  ['5V', 5],
  ['4k7', 4e3], // no letter code in SPICE: the 7 is ignored
  ['1.5e3x', 1.5e3],
];

describe('SPICE numbers', () => {
  it.each(CASES)('%s reads as %d', (text, value) => {
    expect(readSpiceNumber(text)?.value).toBeCloseTo(value, 12 - Math.max(0, Math.floor(Math.log10(Math.abs(value)))));
  });

  it('refuses text that does not start with a number', () => {
    expect(readSpiceNumber('k47')).toBeUndefined();
    expect(readSpiceNumber('')).toBeUndefined();
    expect(readSpiceNumber('abc')).toBeUndefined();
  });

  it('reports the suffix and the ignored letters', () => {
    expect(readSpiceNumber('10kohm')).toEqual({ value: 10e3, suffix: 'k', ignored: 'ohm' });
    expect(readSpiceNumber('4k7')).toEqual({ value: 4e3, suffix: 'k', ignored: '7' });
  });
});

describe(`SPICE numbers read as ${REFERENCE} reads them`, () => {
  beforeAll(() => startNgspice(), 30_000);

  it('every case gives the same number in the reference simulator', async () => {
    // Each number is the gain of a voltage-controlled source driven by 1 V, so its node sits at
    // that many volts (a resistor would not do: ngspice raises tiny resistances to a floor).
    const lines = ['numbers', 'vref one 0 1'];
    CASES.forEach(([text], i) => lines.push(`e${i} n${i} 0 one 0 ${text}`));
    lines.push('.op', '.end');
    const nodes = await ngspiceOperatingPoint(lines.join('\n'));
    CASES.forEach(([text], i) => {
      const ours = readSpiceNumber(text)!.value;
      expect(Math.abs(nodes[`n${i}`] - ours), text).toBeLessThanOrEqual(Math.abs(ours) * 1e-12);
    });
  });
});
