import { describe, expect, it } from 'vitest';
import { idleDraw, ledCurrents } from '../../../src/circuit/analysis/index.js';
import type { BoardInput } from '../../../src/schemas/board.js';
import { boardFrom } from './fixtures/board-from.js';

// SI 2019, exact: Boltzmann constant and elementary charge; SPICE's default 27 °C.
const VT = (1.380649e-23 * 300.15) / 1.602176634e-19;

/** Loads on each rail and an LED through 1 kΩ from +12 V: made up for this test, not any kit. */
const LOADS: BoardInput = {
  format: 'voltwalk-board/1',
  id: 'loads',
  name: 'Rail loads',
  description: 'Resistors on each rail and one LED, for the idle draw and the LED current.',
  rails: [
    { id: 'pos', label: '+12 V', net: 'v+', volts: 12 },
    { id: 'neg', label: '−12 V', net: 'v-', volts: -12 },
  ],
  models: { LEDX: { type: 'D', params: { IS: 1e-20, N: 1.7, RS: 5 }, source: 'demo' } },
  parts: [
    { ref: 'J1', kind: 'connector', pins: { '1': 'v-', '2': 'gnd', '3': 'v+' }, where: 'header' },
    { ref: 'R1', kind: 'resistor', value: '12k', pins: { '1': 'v+', '2': 'gnd' }, where: 'left' },
    { ref: 'R2', kind: 'resistor', value: '6k', pins: { '1': 'gnd', '2': 'v-' }, where: 'right' },
    { ref: 'R3', kind: 'resistor', value: '1k', pins: { '1': 'v+', '2': 'a' }, where: 'top' },
    { ref: 'D1', kind: 'led', model: 'LEDX', pins: { A: 'a', K: 'gnd' }, where: 'front' },
  ],
  testPoints: [{ id: 'TP1', label: 'LED anode', net: 'a', quantity: 'voltage', probe: 'D1 anode', access: 'leg' }],
  stages: [{ id: 'all', label: 'everything', parts: ['J1', 'R1', 'R2', 'R3', 'D1'] }],
  conditions: [{ id: 'on', label: 'powered', powered: true, instructions: 'power on' }],
  roles: {},
};

/**
 * The LED's current by the diode equation with its series resistances (textbook):
 * 12 V = I·(1 kΩ + RS) + N·Vt·ln(1 + I/IS), solved by bisection.
 */
function ledByHand(): number {
  const drop = (i: number) => i * (1000 + 5) + 1.7 * VT * Math.log1p(i / 1e-20) - 12;
  let lo = 0;
  let hi = 12 / 1000;
  for (let k = 0; k < 200; k++) {
    const mid = (lo + hi) / 2;
    if (drop(mid) > 0) hi = mid;
    else lo = mid;
  }
  return (lo + hi) / 2;
}

describe('figures read off one operating point', () => {
  const board = boardFrom(LOADS);

  it('gives the LED current the diode equation gives, with its series resistance', () => {
    const [led] = ledCurrents(board, ['D1'], 'on');
    // By hand: Vf = 1.7 × 25.86 mV × ln(10.1 mA / 1e-20 A) ≈ 1.82 V, so (12 − 1.82) V / 1005 Ω ≈ 10.13 mA.
    expect(ledByHand() * 1e3).toBeCloseTo(10.13, 1);
    expect(led.amps / ledByHand()).toBeCloseTo(1, 4);
  });

  it("gives what each rail supplies: Ohm's law on the loads, plus the LED branch on +12 V", () => {
    const draw = idleDraw(board, 'on');
    expect(draw.map((d) => d.rail)).toEqual(['+12 V', '−12 V']);
    // +12 V: 12 V / 12 kΩ = 1 mA, and the LED branch; −12 V: 12 V / 6 kΩ = 2 mA. Both as sizes, whatever SPICE's sign.
    expect(draw[0].amps / (1e-3 + ledByHand())).toBeCloseTo(1, 4);
    expect(draw[1].amps / 2e-3).toBeCloseTo(1, 4);
  });
});
