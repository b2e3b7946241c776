import type { Board } from '../../src/schemas/board.js';
import type { Tree, TreeInput } from '../../src/schemas/tree.js';
import { TreeSchema } from '../../src/schemas/tree.js';
import type { BoardView, Substitutions } from '../../src/engine/board-view.js';

/**
 * A board view with made-up bands, so the engine's routing and guards can be tested without the
 * solver. The band at TP1 is centred on R1's value in kΩ as volts (R1 = 4k7 -> 4.7 V), so a
 * substitution visibly moves it. Demo numbers only: no physics is claimed here.
 */
export function fakeView(options: { lacks?: string[] } = {}): BoardView {
  const board = {
    id: 'fake',
    name: 'Fake board',
    rails: [
      { id: 'pos', label: '+12 V', net: 'p12', volts: 12 },
      { id: 'neg', label: '−12 V', net: 'n12', volts: -12 },
    ],
    parts: [
      { ref: 'R1', kind: 'resistor', value: '4k7', tolerance: 0.01, pins: {}, where: 'by the input jack' },
      { ref: 'U1', kind: 'opamp-dual', pins: {}, where: 'centre', orientation: 'notch = pin 1' },
    ],
  } as unknown as Board;
  const tp = (id: string, quantity: 'voltage' | 'resistance') => ({ id, label: id, net: 'x', quantity, probe: `red on ${id}`, access: 'pad' as const });
  const testPoints: Record<string, ReturnType<typeof tp>> = { 'input-stage-output': tp('TP1', 'voltage'), 'pos-rail-resistance': tp('TP2', 'resistance') };
  const conditions: Record<string, { id: string; label: string; powered: boolean; instructions: string; settings: Record<string, number> }> = {
    quiescent: { id: 'rest', label: 'At rest', powered: true, instructions: 'knobs mid', settings: {} },
    unpowered: { id: 'off', label: 'Off', powered: false, instructions: 'unplug', settings: {} },
  };
  (board as { conditions: unknown[] }).conditions = Object.values(conditions);
  (board as { testPoints: unknown[] }).testPoints = Object.values(testPoints);
  const lacks = new Set(options.lacks ?? []);
  return {
    board,
    testPoint: (role) => (lacks.has(role) ? undefined : testPoints[role]),
    condition: (role) => (lacks.has(role) ? undefined : conditions[role]),
    parts: (role) => (lacks.has(role) ? [] : role === 'input-opamp' ? [board.parts[1]] : role === 'input-gain-pot' ? [board.parts[0]] : []),
    band: (testPoint: string, _condition: string, subs: Substitutions) => {
      if (testPoint === 'TP2') return { nominal: 10e3, min: 9e3, max: 11e3, unit: 'Ω' };
      const kohm = subs.R1 === undefined ? 4.7 : Number(String(subs.R1).replace('k', '.'));
      return { nominal: kohm, min: kohm - 0.2, max: kohm + 0.2, unit: 'V' };
    },
    railVolts: [12, -12],
    time: () => undefined,
    idleDraw: () => undefined,
    ledCurrents: () => undefined,
  };
}

const say = (text: string) => ({ technician: text, customer: `(customer) ${text}` });

/** A small tree: inspect, unpowered resistance, caution, power, a measurement with four branches. */
export function smallTree(overrides: Partial<TreeInput['nodes']> = {}): Tree {
  return TreeSchema.parse({
    format: 'voltwalk-tree/1',
    id: 'small',
    symptom: 'test tree',
    description: 'a tree for engine tests',
    start: 'look',
    nodes: {
      look: { kind: 'inspect', part: 'input-opamp', look: 'orientation', say: say('look at U'), ok: 'ohms', fault: 'end-reversed' },
      ohms: { kind: 'measure', testPoint: 'pos-rail-resistance', condition: 'unpowered', powered: false, say: say('ohms'), branches: { 'near-zero': 'end-short', default: 'warn' } },
      warn: { kind: 'caution', covers: ['rails', 'mains-supply'], say: say('careful'), next: 'power' },
      power: { kind: 'setup', condition: 'quiescent', powered: true, hazards: ['rails', 'mains-supply'], say: say('switch on'), next: 'out' },
      out: {
        kind: 'measure',
        testPoint: 'input-stage-output',
        condition: 'quiescent',
        powered: true,
        hazards: ['rails'],
        say: say('measure TP1'),
        branches: { 'in-band': 'end-ok', low: 'end-low', 'stuck-at-rail': 'end-rail', default: 'end-other' },
      },
      'end-reversed': { kind: 'conclude', title: 'reversed', parts: ['input-opamp'], say: say('turn it') },
      'end-short': { kind: 'conclude', title: 'short', parts: [], say: say('short') },
      'end-ok': { kind: 'conclude', title: 'ok', parts: [], say: say('fine') },
      'end-low': { kind: 'conclude', title: 'low', parts: ['input-gain-pot'], say: say('low') },
      'end-rail': { kind: 'conclude', title: 'rail', parts: ['input-opamp'], say: say('rail') },
      'end-other': { kind: 'conclude', title: 'other', parts: [], say: say('other') },
      ...overrides,
    },
  });
}
