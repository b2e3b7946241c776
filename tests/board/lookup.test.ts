import { describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { loadBoard } from '../../src/board/validate.js';
import { roleCondition, roleParts, roleStage, roleTestPoint, testPointsFor, stagesOf } from '../../src/board/lookup.js';
import { neighbourPins } from '../../src/board/neighbours.js';
import { withSubstitutions } from '../../src/board/substitutions.js';
import { partTolerance, partValue } from '../../src/board/values.js';
import { buildCircuit } from '../../src/board/build-circuit.js';
import { UserInputError } from '../../src/errors.js';

const board = loadBoard(join(import.meta.dirname, '../fixtures/boards/small-amp.json'));

describe('role lookups', () => {
  it('find what the board maps each role to, and nothing for a role it lacks', () => {
    expect(roleTestPoint(board, 'input-stage-output')?.id).toBe('TP3');
    expect(roleTestPoint(board, 'detector-output')).toBeUndefined();
    expect(roleParts(board, 'input-opamp').map((p) => p.ref)).toEqual(['U1']);
    expect(roleParts(board, 'gr-led')).toEqual([]);
    expect(roleCondition(board, 'unpowered')?.powered).toBe(false);
    expect(roleStage(board, 'power-entry')?.label).toBe('Power entry');
  });
  it('testPointsFor: voltages when powered, resistances when not', () => {
    expect(testPointsFor(board, 'quiescent').map((t) => t.id)).toEqual(['TP1', 'TP2', 'TP3', 'TP4', 'TP6']);
    expect(testPointsFor(board, 'unpowered').map((t) => t.id)).toEqual(['TP5', 'TP7', 'TP8']);
  });
  it('stagesOf', () => {
    expect(stagesOf(board, 'U1').map((s) => s.id)).toEqual(['input']);
  });
});

describe('part values', () => {
  it('parses letter code once into SI (IEC 60062: 4K7 = 4.7 kΩ)', () => {
    expect(partValue(board, 'R4')).toBe(4700);
    expect(partValue(board, 'C3')).toBe(100e-9);
  });
  it('tolerance: the file\'s, else the kind\'s default', () => {
    expect(partTolerance(board, 'R3')).toBe(0.05);
    expect(partTolerance(board, 'R4')).toBe(0.01);
    expect(partTolerance(board, 'C1')).toBe(0.2);
  });
  it('a part without a value, or an unknown part, is the user\'s mistake', () => {
    expect(() => partValue(board, 'U1')).toThrow(UserInputError);
    expect(() => partValue(board, 'R99')).toThrow(UserInputError);
  });
});

describe('withSubstitutions', () => {
  it('changes the named values only, leaving the board as it was', () => {
    const changed = withSubstitutions(board, { R4: '47k', C3: 220e-9 });
    expect(partValue(changed, 'R4')).toBe(47e3);
    expect(partValue(changed, 'C3')).toBe(220e-9);
    expect(partValue(board, 'R4')).toBe(4700);
    expect(changed.parts.find((p) => p.ref === 'R1')).toBe(board.parts.find((p) => p.ref === 'R1'));
    const r4 = buildCircuit(changed, 'quiescent').circuit.elements.find((e) => e.name === 'r4');
    expect(r4).toMatchObject({ value: 47e3 });
  });
  it('a value in IEC 60062 form with a tolerance letter carries that tolerance (J = 5 %)', () => {
    expect(partTolerance(withSubstitutions(board, { R4: '4k7J' }), 'R4')).toBe(0.05);
  });
  it('refuses impossible values naming the designator and the accepted form, all at once', () => {
    let error: UserInputError | undefined;
    try {
      withSubstitutions(board, { R4: '100nF', C3: '1k', U1: '4k7', R99: '1k' });
    } catch (e) {
      error = e as UserInputError;
    }
    expect(error).toBeInstanceOf(UserInputError);
    const byPath = Object.fromEntries(error!.problems.map((p) => [p.path, p]));
    expect(byPath['substitution R4'].message).toContain('R4: "100nF" is not a value: the unit is F but Ω is expected');
    expect(byPath['substitution C3'].message).toBe('C3: 1 kF is not a value a capacitor can have');
    expect(byPath['substitution C3'].accepted).toBe('0.1 pF to 1 mF');
    expect(byPath['substitution U1'].code).toBe('board.no-value');
    expect(byPath['substitution R99'].code).toBe('board.unknown-part');
  });
});

describe('neighbourPins', () => {
  it('DIP-8: adjacent numbers on each side, not across the ends (1-8, 4-5)', () => {
    expect(neighbourPins(board, 'U1')).toEqual([
      ['1', '2'],
      ['2', '3'],
      ['3', '4'],
      ['5', '6'],
      ['6', '7'],
      ['7', '8'],
    ]);
  });
  it('adds the file\'s own list, each pair once', () => {
    const edited = { ...board, parts: board.parts.map((p) => (p.ref === 'U1' ? { ...p, neighbours: [['2', '1'], ['4', '8']] as Array<[string, string]> } : p)) };
    const pairs = neighbourPins(edited, 'U1');
    expect(pairs).toHaveLength(7);
    expect(pairs.at(-1)).toEqual(['4', '8']);
    expect(neighbourPins(board, 'R1')).toEqual([]);
  });
});
