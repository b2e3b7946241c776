import { describe, expect, it } from 'vitest';
import { GAIN_FREQUENCY_HZ, signalGainDb } from '../../../src/circuit/analysis/index.js';
import { boardFrom } from './fixtures/board-from.js';
import type { BoardInput } from '../../../src/schemas/board.js';

/** A textbook inverting amplifier, 10 kΩ in and 47 kΩ feedback, on ±12 V: made up for this test. */
const INVERTER: BoardInput = {
  format: 'voltwalk-board/1',
  id: 'inverter',
  name: 'Inverter',
  description: 'One inverting stage, for the small-signal gain.',
  rails: [
    { id: 'pos', label: '+12 V', net: 'v+', volts: 12 },
    { id: 'neg', label: '−12 V', net: 'v-', volts: -12 },
  ],
  parts: [
    { ref: 'J1', kind: 'connector', pins: { '1': 'v-', '2': 'gnd', '3': 'v+' }, where: 'header' },
    { ref: 'R1', kind: 'resistor', value: '10k', pins: { '1': 'in', '2': 'inv' }, where: 'left' },
    { ref: 'R2', kind: 'resistor', value: '47k', pins: { '1': 'inv', '2': 'out' }, where: 'top' },
    { ref: 'U1', kind: 'opamp-dual', model: 'TL072', pins: { '1': 'out', '2': 'inv', '3': 'gnd', '4': 'v-', '5': 'gnd', '6': 'ub', '7': 'ub', '8': 'v+' }, where: 'middle' },
  ],
  testPoints: [{ id: 'TP1', label: 'output', net: 'out', quantity: 'voltage', probe: 'U1 pin 1', access: 'ic-pin' }],
  stages: [{ id: 'all', label: 'everything', parts: ['J1', 'R1', 'R2', 'U1'] }],
  conditions: [
    { id: 'rest', label: 'no input', powered: true, instructions: 'power on' },
    { id: 'level', label: '0.1 V in', powered: true, instructions: 'feed 0.1 V', signal: { net: 'in', volts: 0.1, sourceResistance: 0, how: 'a bench supply' } },
  ],
  roles: {},
};

describe('small-signal gain from a condition\'s test signal', () => {
  const board = boardFrom(INVERTER);

  it('is −Rf/Rin for an inverting amplifier: 20·log10(47k/10k) = 13.44 dB (textbook)', () => {
    expect(GAIN_FREQUENCY_HZ).toBe(1000);
    // The op-amp's open-loop gain of 2·10⁵ leaves a loop-gain error of (1 + 4.7)/2·10⁵: under 0.001 dB.
    expect(signalGainDb(board, 'level', 'TP1')!).toBeCloseTo(20 * Math.log10(4.7), 2);
  });

  it('is not defined for a condition with no test signal', () => {
    expect(signalGainDb(board, 'rest', 'TP1')).toBeUndefined();
  });
});
