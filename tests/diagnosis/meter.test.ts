import { describe, expect, it } from 'vitest';
import { clampOhms, meterAccuracy } from '../../src/diagnosis/meter.js';

// A handheld DMM's DC-volts accuracy ±(0.5 % + 2 counts) on a 2000-count display: common practice
// (REFERENCES.md). The last digit weighs 0.1 mV on 200 mV, 1 mV on 2 V, 10 mV on 20 V.
describe('meter accuracy window', () => {
  it('5 V on the 20 V range: 25 mV + 2 × 10 mV', () => {
    expect(meterAccuracy(5, 'V')).toBeCloseTo(0.045, 12);
  });
  it('-11.9 V: sign does not matter', () => {
    expect(meterAccuracy(-11.9, 'V')).toBeCloseTo(0.0595 + 0.02, 12);
  });
  it('150 mV on the 200 mV range: 0.75 mV + 0.2 mV', () => {
    expect(meterAccuracy(0.15, 'V')).toBeCloseTo(0.00095, 12);
  });
  it('a 6000-count meter autoranges to 6 V for 5 V (last digit 1 mV)', () => {
    expect(meterAccuracy(5, 'V', { percent: 0.5, counts: 2, fullScale: 6000, maxOhms: 60e6 })).toBeCloseTo(0.027, 12);
  });
  it('4.7 kΩ on the 20 kΩ range: 23.5 Ω + 20 Ω', () => {
    expect(meterAccuracy(4700, 'Ω')).toBeCloseTo(43.5, 9);
  });
  it('anything past the top range reads OL, one and the same reading', () => {
    expect(clampOhms(1e12)).toBe(clampOhms(5e9));
    expect(clampOhms(Infinity)).toBe(20e6);
  });
});

describe('readings as the display shows them', () => {
  it('a few picovolts of simulation residue is 0 V, below a 2000-count meter\'s 0.1 mV digit', async () => {
    const { showReading } = await import('../../src/diagnosis/why.js');
    expect(showReading(-2.55e-12, 'V')).toBe('0 V');
    expect(showReading(0.0102, 'V')).toBe('10.2 mV');
    expect(showReading(Infinity, 'Ω')).toBe('OL (open)');
  });
});
