import { describe, expect, it } from 'vitest';
import { hissBand, HISS_ABOVE_DB, HISS_BELOW_DB } from '../../../src/circuit/analysis/index.js';
import { boardFrom } from './fixtures/board-from.js';
import type { BoardInput } from '../../../src/schemas/board.js';
import { UserInputError } from '../../../src/errors.js';
import { smallBoard } from './fixtures/small-board.js';

// Boltzmann constant, SI 2019 (exact); SPICE's default 27 °C.
const K = 1.380649e-23;
const T = 300.15;

/** Two 10 kΩ resistors from the +12 V rail to ground, the test point between them: made up for this test. */
const DIVIDER: BoardInput = {
  format: 'voltwalk-board/1',
  id: 'divider',
  name: 'Divider',
  description: 'Two resistors, for the hiss band.',
  rails: [{ id: 'pos12', label: '+12 V', net: '+12v', volts: 12 }],
  parts: [
    { ref: 'J1', kind: 'connector', pins: { '1': 'gnd', '2': '+12v' }, where: 'header' },
    { ref: 'R1', kind: 'resistor', value: '10k', tolerance: 0.01, pins: { '1': '+12v', '2': 'mid' }, where: 'left' },
    { ref: 'R2', kind: 'resistor', value: '10k', tolerance: 0.01, pins: { '1': 'mid', '2': 'gnd' }, where: 'right' },
  ],
  testPoints: [
    { id: 'TP1', label: 'middle', net: 'mid', quantity: 'voltage', probe: 'R1/R2 junction', access: 'pad' },
    { id: 'TP2', label: 'rail to ground', net: '+12v', quantity: 'resistance', probe: 'J1', access: 'header' },
  ],
  stages: [{ id: 'all', label: 'everything', parts: ['J1', 'R1', 'R2'] }],
  conditions: [
    { id: 'on', label: 'powered', powered: true, instructions: 'power on' },
    { id: 'off', label: 'power off', powered: false, instructions: 'unplug' },
  ],
  roles: {},
};

const divider = () => boardFrom(DIVIDER);

describe('the hiss a healthy board makes at a test point', () => {
  it('is the Johnson–Nyquist noise of the source resistance on a plain divider: √(4kTRB), R = 10 kΩ ∥ 10 kΩ', () => {
    // Thermal noise of a resistance, e = √(4kTRΔf) (Johnson–Nyquist; any electronics textbook).
    const expected = Math.sqrt(4 * K * T * 5_000 * (20_000 - 20));
    const band = hissBand(divider(), 'TP1', 'on');
    expect(expected * 1e6).toBeCloseTo(1.287, 3); // 1.287 µV rms, by hand: 9.10 nV/√Hz × √19980 Hz
    expect(band.nominal / expected).toBeCloseTo(1, 3);
    // No op-amp: the resistors are every source, so the floor is the nominal less the allowance.
    expect(band.min / band.nominal).toBeCloseTo(10 ** (-HISS_BELOW_DB / 20), 9);
    expect(band.max / band.nominal).toBeCloseTo(10 ** (HISS_ABOVE_DB / 20), 9);
  });

  it('puts the floor at the resistors alone: the op-amp noise is what lies between floor and nominal', () => {
    const band = hissBand(smallBoard(), 'TP7', 'quiescent');
    const opamp = band.noise.contributions.filter((c) => /^u\d/i.test(c.element));
    expect(opamp.length).toBeGreaterThan(0);
    const floor = band.min * 10 ** (HISS_BELOW_DB / 20);
    // Uncorrelated sources add in power: nominal² = resistors² + op-amps².
    expect(band.nominal ** 2 - floor ** 2).toBeCloseTo(opamp.reduce((a, c) => a + c.rms ** 2, 0), 20);
    expect(floor).toBeLessThan(band.nominal);
    expect(band.max).toBeCloseTo(band.nominal * 10 ** (HISS_ABOVE_DB / 20), 15);
  });

  it('is asked only of a voltage test point on a powered board', () => {
    expect(() => hissBand(divider(), 'TP2', 'on')).toThrow(UserInputError);
    expect(() => hissBand(divider(), 'TP1', 'off')).toThrow(/powered/);
  });
});
