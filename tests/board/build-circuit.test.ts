import { describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { loadBoard } from '../../src/board/validate.js';
import { buildCircuit } from '../../src/board/build-circuit.js';
import { TIE_OHMS } from '../../src/board/floating-nodes.js';
import { DEFAULT_OHMMETER } from '../../src/board/ohmmeter.js';
import { UserInputError } from '../../src/errors.js';
import type { Element } from '../../src/circuit/netlist.js';

const board = loadBoard(join(import.meta.dirname, '../fixtures/boards/small-amp.json'));
const el = (elements: Element[], name: string) => elements.find((e) => e.name === name)!;

describe('buildCircuit', () => {
  it('names elements after designators; a dual op-amp is two amplifiers sharing the supply pins', () => {
    const { circuit, partElements } = buildCircuit(board, 'quiescent');
    expect(partElements.R1).toEqual(['r1']);
    expect(partElements.U1).toEqual(['u1a', 'u1b']);
    const a = el(circuit.elements, 'u1a');
    const b = el(circuit.elements, 'u1b');
    // Standard dual pinout: A is +IN 3, -IN 2, OUT 1; B is +IN 5, -IN 6, OUT 7; V+ 8, V- 4.
    expect(a.nodes).toEqual(['in', 'buf', 'buf', '+12v', '-12v']);
    expect(b.nodes).toEqual(['0', 'inv-', 'inv', '+12v', '-12v']);
    // TL072: 1.4 mA typical supply current per amplifier (ST datasheet), so each element draws it.
    expect(a.kind === 'opamp' && a.params.iq).toBe(1.4e-3);
    expect(b.kind === 'opamp' && b.params.headroom).toBe(1.5);
  });
  it('maps the ground net to "0" and other nets to lower case', () => {
    const { netNode } = buildCircuit(board, 'quiescent');
    expect(netNode('gnd')).toBe('0');
    expect(netNode('+12v')).toBe('+12v');
  });
  it('leaves connectors out', () => {
    const { circuit, partElements } = buildCircuit(board, 'quiescent');
    expect(partElements.J1).toEqual([]);
    expect(circuit.elements.some((e) => e.name.startsWith('j'))).toBe(false);
  });
  it('parses values once into SI numbers; pins map in the kind\'s order', () => {
    const { circuit } = buildCircuit(board, 'quiescent');
    expect(el(circuit.elements, 'r4')).toEqual({ kind: 'resistor', name: 'r4', nodes: ['lvl', 'out'], value: 4700 });
    expect(el(circuit.elements, 'c1')).toEqual({ kind: 'capacitor', name: 'c1', nodes: ['+12v', '0'], value: 10e-6 });
    expect(el(circuit.elements, 'd1')).toEqual({ kind: 'diode', name: 'd1', nodes: ['+12v-in', '+12v'], model: '1n4148' });
    // D2 names no model and gets the built-in small-signal diode.
    expect(el(circuit.elements, 'd2')).toMatchObject({ model: '1n4148' });
    // NXP 1N4148 SPICE model figures (REFERENCES.md).
    expect(circuit.models['1n4148']).toMatchObject({ type: 'D', params: { IS: 4.352e-9, N: 1.906, RS: 0.6458 } });
  });
  it('sets pots and switches from the part default, or the condition', () => {
    const q = buildCircuit(board, 'quiescent').circuit.elements;
    expect(el(q, 'rv1')).toMatchObject({ kind: 'pot', position: 0.5, value: 10e3, taper: 'linear', nodes: ['inv', 'lvl', '0'] });
    expect(el(q, 'sw1')).toMatchObject({ kind: 'switch', position: 'off', nodes: ['out', 'load'], positions: { off: [], on: [[0, 1]] } });
    const d = buildCircuit(board, 'dc-in').circuit.elements;
    expect(el(d, 'rv1')).toMatchObject({ position: 0 });
    expect(el(d, 'sw1')).toMatchObject({ position: 'on' });
  });
  it('adds the rails only when powered, and the signal behind its source resistance', () => {
    const q = buildCircuit(board, 'quiescent').circuit.elements;
    expect(el(q, 'vrail_pos')).toEqual({ kind: 'vsource', name: 'vrail_pos', nodes: ['+12v-in', '0'], dc: 12 });
    expect(el(q, 'vrail_neg')).toMatchObject({ dc: -12 });
    expect(el(q, 'vsignal')).toBeUndefined();
    const d = buildCircuit(board, 'dc-in').circuit.elements;
    expect(el(d, 'vsignal')).toEqual({ kind: 'vsource', name: 'vsignal', nodes: ['_signal', '0'], dc: 1 });
    expect(el(d, 'rsignal')).toEqual({ kind: 'resistor', name: 'rsignal', nodes: ['_signal', 'in'], value: 1000 });
    const u = buildCircuit(board, 'unpowered');
    expect(u.circuit.elements.some((e) => e.kind === 'vsource')).toBe(false);
    // Unpowered op-amps are left out (see buildCircuit's note).
    expect(u.partElements.U1).toEqual([]);
  });
  it('puts the ohmmeter on one resistance test point', () => {
    const { circuit } = buildCircuit(board, 'unpowered', { ohmmeter: { testPoint: 'TP8' } });
    expect(el(circuit.elements, 'vmeter')).toEqual({ kind: 'vsource', name: 'vmeter', nodes: ['_meter', '0'], dc: DEFAULT_OHMMETER.openCircuitVolts });
    expect(el(circuit.elements, 'rmeter')).toEqual({ kind: 'resistor', name: 'rmeter', nodes: ['_meter', 'rnet'], value: DEFAULT_OHMMETER.sourceResistance });
  });
  it('refuses an ohmmeter on a powered board, and an unknown condition, as the user\'s mistake', () => {
    expect(() => buildCircuit(board, 'quiescent', { ohmmeter: { testPoint: 'TP8' } })).toThrow(UserInputError);
    expect(() => buildCircuit(board, 'quiesent')).toThrow(/no condition "quiesent" — did you mean "quiescent"\?/);
  });
  it('ties each net with no firm DC path to ground (junctions do not count), and only those', () => {
    // Unpowered: the rails reach ground only through capacitors (open at DC) and the protection
    // diodes; D3's anode only through D3.
    const tied = (c: { elements: Element[] }) =>
      c.elements
        .filter((e) => e.name.startsWith('rtie_'))
        .map((t) => {
          expect(t).toMatchObject({ kind: 'resistor', value: TIE_OHMS });
          return t.nodes[0];
        })
        .sort();
    expect(tied(buildCircuit(board, 'unpowered').circuit)).toEqual(['+12v', '+12v-in', '-12v', '-12v-in', 'probe']);
    // The meter on TP5 is a path from +12v to ground.
    expect(tied(buildCircuit(board, 'unpowered', { ohmmeter: { testPoint: 'TP5' } }).circuit)).toEqual(['+12v-in', '-12v', '-12v-in', 'probe']);
    // Powered, the rail sources drive the header side; D1/D2 and D3 still leave +12v, -12v and probe to a tie.
    expect(tied(buildCircuit(board, 'quiescent').circuit)).toEqual(['+12v', '-12v', 'probe']);
  });
  it('returns fresh elements each call, so a caller may edit them', () => {
    const a = buildCircuit(board, 'quiescent').circuit;
    (el(a.elements, 'r1') as { value: number }).value = 1;
    a.models['1n4148'].params.IS = 1;
    const b = buildCircuit(board, 'quiescent').circuit;
    expect(el(b.elements, 'r1')).toMatchObject({ value: 100e3 });
    expect(b.models['1n4148'].params.IS).toBe(4.352e-9);
  });
});
