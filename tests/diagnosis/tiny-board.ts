import { validateBoard } from '../../src/board/validate.js';
import type { Board, BoardInput } from '../../src/schemas/board.js';

/**
 * A small board for the fault models, invented for these tests: a divider with a diode clamp, an
 * op-amp follower, a transistor switch with an LED, and a bipolar supply. Not any real kit.
 * The 2N3904 figures are the widely circulated SPICE model's IS and BF (from memory).
 */
export const TINY_BOARD_INPUT: BoardInput = {
  format: 'voltwalk-board/1',
  id: 'tiny',
  name: 'Tiny test board',
  description: 'Divider, clamp diode, follower and an LED switch, for fault-model tests.',
  rails: [
    { id: 'pos12', label: '+12 V', net: '+12v', volts: 12 },
    { id: 'neg12', label: '−12 V', net: '-12v', volts: -12 },
  ],
  models: {
    '2N3904': { type: 'NPN', params: { IS: 6.734e-15, BF: 416.4, VAF: 74.03 }, source: 'from memory' },
    LEDRED: { type: 'D', params: { IS: 1e-20, N: 1.7, RS: 5 }, source: 'demo' },
  },
  parts: [
    { ref: 'J1', kind: 'connector', pins: { '1': '-12v', '2': 'gnd', '3': '+12v' }, where: 'power header' },
    { ref: 'R1', kind: 'resistor', value: '4k7', tolerance: 0.05, pins: { '1': '+12v', '2': 'div' }, where: 'top left' },
    { ref: 'R2', kind: 'resistor', value: '4k7', tolerance: 0.05, pins: { '1': 'div', '2': 'gnd' }, where: 'below R1' },
    { ref: 'D1', kind: 'diode', model: '1N4148', pins: { A: 'div', K: 'clamp' }, where: 'right of R2' },
    { ref: 'R3', kind: 'resistor', value: '10k', tolerance: 0.05, pins: { '1': 'clamp', '2': 'gnd' }, where: 'right of D1' },
    { ref: 'U1', kind: 'opamp-dual', model: 'TL072', pins: { '1': 'out', '2': 'out', '3': 'div', '4': '-12v', '5': 'gnd', '6': 'outb', '7': 'outb', '8': '+12v' }, where: 'middle' },
    { ref: 'R4', kind: 'resistor', value: '10k', tolerance: 0.05, pins: { '1': 'out', '2': 'base' }, where: 'right of U1' },
    { ref: 'Q1', kind: 'npn', model: '2N3904', pins: { C: 'led-k', B: 'base', E: 'gnd' }, where: 'bottom right', neighbours: [['E', 'B'], ['B', 'C']] },
    { ref: 'R5', kind: 'resistor', value: '1k', tolerance: 0.05, pins: { '1': '+12v', '2': 'led-a' }, where: 'above D2' },
    { ref: 'D2', kind: 'led', model: 'LEDRED', pins: { A: 'led-a', K: 'led-k' }, where: 'front edge' },
    { ref: 'C1', kind: 'electrolytic', value: '10u', pins: { '+': '+12v', '-': 'gnd' }, where: 'by the header' },
  ],
  testPoints: [
    { id: 'TP1', label: 'divider', net: 'div', quantity: 'voltage', probe: 'R1/R2 junction', access: 'pad' },
    { id: 'TP2', label: 'follower out', net: 'out', quantity: 'voltage', probe: 'U1 pin 1', access: 'ic-pin' },
    { id: 'TP3', label: 'LED cathode', net: 'led-k', quantity: 'voltage', probe: 'Q1 collector', access: 'leg' },
    { id: 'TP4', label: 'clamp', net: 'clamp', quantity: 'voltage', probe: 'D1 cathode', access: 'leg' },
    { id: 'TP5', label: '+12 V to ground', net: '+12v', quantity: 'resistance', probe: 'J1 pin 3 to pin 2', access: 'header' },
    { id: 'TP6', label: 'divider to ground', net: 'div', quantity: 'resistance', probe: 'R1/R2 junction to ground', access: 'pad' },
  ],
  stages: [{ id: 'all', label: 'everything', parts: ['J1', 'R1', 'R2', 'D1', 'R3', 'U1', 'R4', 'Q1', 'R5', 'D2', 'C1'] }],
  conditions: [
    { id: 'quiescent', label: 'powered', powered: true, instructions: 'power on' },
    { id: 'unpowered', label: 'power off', powered: false, instructions: 'unplug the cable' },
  ],
  roles: { parts: { 'power-header': ['J1'] } },
};

export function tinyBoard(): Board {
  const { board, problems } = validateBoard(structuredClone(TINY_BOARD_INPUT), 'tiny-board');
  if (!board) throw new Error(problems.map((p) => `${p.path}: ${p.message}`).join('\n'));
  return board;
}
