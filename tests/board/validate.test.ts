import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { checkBoardFile, loadBoard, validateBoard } from '../../src/board/validate.js';
import { UserInputError, formatProblem, type Problem } from '../../src/errors.js';

const dir = join(import.meta.dirname, '../fixtures/boards');
const fixture = (name: string) => join(dir, name);
const good = () => JSON.parse(readFileSync(fixture('small-amp.json'), 'utf8'));
const part = (raw: any, ref: string) => raw.parts.find((p: any) => p.ref === ref);
const only = (problems: Problem[]) => {
  expect(problems).toHaveLength(1);
  return problems[0];
};

describe('loadBoard on the small fixture', () => {
  it('loads, with defaults filled in', () => {
    const board = loadBoard(fixture('small-amp.json'));
    expect(board.parts).toHaveLength(19);
    expect(board.ground).toBe('gnd');
    expect(board.testPoints.find((t) => t.id === 'TP1')?.quantity).toBe('voltage');
    expect(board.conditions.find((c) => c.id === 'quiescent')?.settings).toEqual({});
  });
  it('returns the same object for an unchanged file, so parsed values are shared', () => {
    expect(loadBoard(fixture('small-amp.json'))).toBe(loadBoard(fixture('small-amp.json')));
  });
  it('throws a UserInputError listing every problem, never a bare Error', () => {
    let error: unknown;
    try {
      loadBoard(fixture('broken-bad-value.json'));
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(UserInputError);
    expect((error as UserInputError).problems).toHaveLength(4);
  });
  it('names a missing file', () => {
    const p = only(checkBoardFile(fixture('no-such-board.json')).problems);
    expect(p.code).toBe('board.unreadable');
    expect(p.message).toBe('no such file');
  });
});

describe('deliberately broken fixtures', () => {
  it('JSON syntax: line and column of the missing comma', () => {
    const p = only(checkBoardFile(fixture('broken-syntax.json')).problems);
    expect(p.code).toBe('board.json-syntax');
    // The comma is missing at the end of line 4; the parser notices at the next key, line 5 column 3.
    expect(p.path).toBe('line 5, column 3');
    expect(p.file).toBe(fixture('broken-syntax.json'));
  });
  it('misspelt key and unknown kind: both reported, each with a suggestion and the accepted form', () => {
    const problems = checkBoardFile(fixture('broken-shape.json')).problems;
    const key = problems.find((p) => p.code === 'board.unknown-key')!;
    expect(key.path).toBe('parts[11].tolerence');
    expect(key.message).toContain('did you mean "tolerance"');
    expect(key.accepted).toContain('tolerance');
    const kind = problems.find((p) => p.code === 'board.invalid-value')!;
    expect(kind.path).toBe('parts[16].kind');
    expect(kind.message).toContain('"resistr"');
    expect(kind.message).toContain('did you mean "resistor"');
    expect(kind.accepted).toContain('"opamp-dual"');
    expect(problems).toHaveLength(2);
  });
  it('dangling net: the one pin it reaches and the likely intended net', () => {
    const p = only(checkBoardFile(fixture('broken-dangling-net.json')).problems);
    expect(p.code).toBe('board.dangling-net');
    expect(p.path).toBe('parts[13].pins.2');
    expect(p.message).toBe('net "outt" reaches only R4.2 — did you mean "out"?');
  });
  it('role mapped to a missing test point names the role path', () => {
    const p = only(checkBoardFile(fixture('broken-role-target.json')).problems);
    expect(p.code).toBe('board.unknown-role-target');
    expect(p.path).toBe('roles.testPoints.detector-output');
    expect(p.message).toContain('"TP9"');
    expect(p.accepted).toContain('TP8');
  });
  it('part pin on no net', () => {
    const p = only(checkBoardFile(fixture('broken-pin-no-net.json')).problems);
    expect(p.code).toBe('board.pin-on-no-net');
    expect(p.path).toBe('parts[10].pins');
    expect(p.message).toBe('R2 pin "2" is on no net');
    expect(p.accepted).toContain('"1", "2"');
  });
  it('duplicate designator, and the stage that named the lost one', () => {
    const problems = checkBoardFile(fixture('broken-duplicate-ref.json')).problems;
    expect(problems.map((p) => [p.code, p.path])).toEqual([
      ['board.duplicate-id', 'parts[18].ref'],
      ['board.unknown-part', 'stages[2].parts[6]'],
    ]);
    expect(problems[0].message).toBe('designator R5 is used again (first at parts[16])');
  });
  it('bad values: farads for a resistor, 1 kF, a negative resistance, two multipliers — all at once', () => {
    const problems = checkBoardFile(fixture('broken-bad-value.json')).problems;
    const byPath = Object.fromEntries(problems.map((p) => [p.path, p]));
    expect(Object.keys(byPath).sort()).toEqual(['parts[10].value', 'parts[11].value', 'parts[5].value', 'parts[8].value']);
    expect(byPath['parts[8].value'].message).toContain('the unit is F but Ω is expected');
    expect(byPath['parts[5].value'].message).toBe('C3: 1 kF is not a value a capacitor can have');
    expect(byPath['parts[10].value'].message).toBe('R2: -10 kΩ is not a value a resistor can have');
    expect(byPath['parts[11].value'].message).toContain('more than one multiplier letter');
    for (const p of problems) {
      expect(p.code).toBe('board.bad-value');
      expect(p.accepted).toBeTruthy();
      // One line each, with file and path, as `voltwalk check` prints them.
      expect(formatProblem(p)).toMatch(/^.*broken-bad-value\.json: parts\[\d+\]\.value: .* \(accepted: .+\)$/);
    }
  });
});

describe('meaning checks on edited copies of the fixture', () => {
  const check = (edit: (raw: any) => void) => {
    const raw = good();
    edit(raw);
    return validateBoard(raw, 'edited.json');
  };

  it('the unedited fixture has no problem', () => {
    const r = check(() => {});
    expect(r.problems).toEqual([]);
    expect(r.board).toBeDefined();
  });
  it('zero resistance and a resistor given a model', () => {
    const r = check((b) => {
      part(b, 'R1').value = 0;
      part(b, 'R2').model = '1N4148';
    });
    expect(r.board).toBeUndefined();
    expect(r.problems.map((p) => p.code).sort()).toEqual(['board.bad-value', 'board.unexpected-model']);
  });
  it('pin names that do not fit the kind', () => {
    const r = check((b) => {
      part(b, 'U1').pins['9'] = 'buf';
      part(b, 'D3').pins = { a: 'probe', K: 'gnd' };
    });
    const paths = r.problems.map((p) => `${p.code} ${p.path}`);
    expect(paths).toContain('board.unknown-pin parts[9].pins.9');
    expect(paths).toContain('board.unknown-pin parts[17].pins.a');
    expect(paths).toContain('board.pin-on-no-net parts[17].pins');
    expect(r.problems.find((p) => p.path === 'parts[17].pins.a')!.message).toContain('did you mean "A"');
  });
  it('unknown model, and a model of the wrong type', () => {
    const r = check((b) => {
      part(b, 'D1').model = '1N4184';
      part(b, 'U1').model = 'TL027';
      b.models = { Q: { type: 'NPN', params: {} } };
      part(b, 'D2').model = 'Q';
    });
    const codes = Object.fromEntries(r.problems.map((p) => [p.path, p]));
    expect(codes['parts[1].model'].message).toBe('no model "1N4184" — did you mean "1N4148"?');
    expect(codes['parts[9].model'].code).toBe('board.unknown-model');
    expect(codes['parts[2].model'].code).toBe('board.model-type');
  });
  it('settings: a pot given a word, a switch given a position it lacks, an unknown part, a resistor', () => {
    const r = check((b) => {
      b.conditions[2].settings = { RV1: 'max', SW1: 'onn', RV9: 0.5, R1: 0.5 };
    });
    const byPath = Object.fromEntries(r.problems.map((p) => [p.path, p]));
    expect(byPath['conditions[2].settings.RV1'].accepted).toContain('0 (pin 1 end) to 1');
    expect(byPath['conditions[2].settings.SW1'].message).toContain('did you mean "on"');
    expect(byPath['conditions[2].settings.RV9'].code).toBe('board.unknown-part');
    expect(byPath['conditions[2].settings.R1'].message).toBe('R1 is a resistor, not a control');
  });
  it('a missing key, a wrong type, and a file that is not an object', () => {
    const r = check((b) => {
      delete part(b, 'R1').where;
      b.rails[0].volts = '12';
      part(b, 'R2').value = true;
    });
    expect(r.problems.map((p) => [p.path, p.message, p.accepted])).toEqual([
      ['rails[0].volts', 'found string "12"', 'a number'],
      ['parts[8].where', 'required but missing', 'a string'],
      ['parts[10].value', 'found boolean true', 'a string or a number'],
    ]);
    const top = only(validateBoard([], 'list.json').problems);
    expect([top.path, top.message, top.accepted]).toEqual([undefined, 'found a list', 'an object']);
  });
  it('a pot setting above 1 is a shape problem with the range', () => {
    const r = check((b) => {
      b.conditions[2].settings.RV1 = 1.5;
    });
    const p = only(r.problems);
    expect(p.path).toBe('conditions[2].settings.RV1');
    expect(p.accepted).toBe('a number ≤ 1');
  });
  it('roles must suit their target: quantity for test points, power for conditions', () => {
    const r = check((b) => {
      b.roles.testPoints['pos-rail'] = 'TP5';
      b.roles.testPoints['neg-rail-resistance'] = 'TP2';
      b.roles.conditions['unpowered'] = 'quiescent';
    });
    const byPath = Object.fromEntries(r.problems.map((p) => [p.path, p]));
    expect(byPath['roles.testPoints.pos-rail'].message).toBe('role pos-rail is a voltage measurement but TP5 is a resistance test point');
    expect(byPath['roles.testPoints.neg-rail-resistance'].code).toBe('board.role-quantity');
    expect(byPath['roles.conditions.unpowered'].code).toBe('board.role-powered');
  });
  it('a role key outside the vocabulary is a shape problem naming the vocabulary', () => {
    const r = check((b) => {
      b.roles.testPoints['detector-outpt'] = 'TP3';
    });
    const p = only(r.problems);
    expect(p.path).toBe('roles.testPoints.detector-outpt');
    expect(p.message).toContain('did you mean "detector-output"');
  });
  it('a test point on a net no pin touches; a signal in an unpowered condition', () => {
    const r = check((b) => {
      b.testPoints[2].net = 'buff';
      b.conditions[0].signal = { net: 'in', volts: 1, how: 'x' };
    });
    const byPath = Object.fromEntries(r.problems.map((p) => [p.path, p]));
    expect(byPath['testPoints[2].net'].message).toBe('net "buff" is touched by no part pin — did you mean "buf"?');
    expect(byPath['conditions[0].signal'].code).toBe('board.signal-unpowered');
  });
  it('duplicate test point and condition ids', () => {
    const r = check((b) => {
      b.testPoints[1].id = 'TP1';
      b.conditions[2].id = 'quiescent';
    });
    // TP2 is gone, so the role that named it is reported too.
    expect(r.problems.map((p) => p.path)).toEqual(['testPoints[1].id', 'conditions[2].id', 'roles.testPoints.neg-rail']);
  });
  it('nets that differ only in case, and a reserved leading underscore', () => {
    const r = check((b) => {
      part(b, 'R7').pins['1'] = 'RNet';
      b.testPoints[7].net = 'RNet';
      part(b, 'R5').pins['1'] = '_load';
      part(b, 'SW1').pins['2'] = '_load';
    });
    expect(r.problems.map((p) => p.code).sort()).toEqual(['board.net-name']);
    const r2 = check((b) => {
      part(b, 'R7').pins['2'] = 'GND';
      part(b, 'D3').pins['K'] = 'GND';
    });
    expect(r2.problems.map((p) => p.code)).toContain('board.net-case');
  });
  it('model cards: an unknown SPICE parameter, a backwards spread, a zener without BV', () => {
    const r = check((b) => {
      b.models = { SIG: { type: 'D', params: { IS: 1e-14, NN: 1.8 }, spread: { IS: [2, 0.5] } }, Z5: { type: 'D', params: { IS: 1e-14 } } };
      part(b, 'D3').model = 'SIG';
      part(b, 'D1').kind = 'zener';
      part(b, 'D1').model = 'Z5';
    });
    expect(r.problems.map((p) => `${p.code} ${p.path}`)).toEqual([
      'board.unknown-model-param models.SIG.params.NN',
      'board.bad-spread models.SIG.spread.IS',
      'board.zener-without-bv parts[1].model',
    ]);
    expect(r.problems[0].message).toBe('D model SIG has no parameter "NN" — did you mean "N"?');
  });
  it('a two-pin part with both pins on one net', () => {
    const p = only(check((b) => {
      part(b, 'C3').pins['2'] = '+12v';
    }).problems);
    expect(p.code).toBe('board.shorted-part');
    expect(p.message).toBe('C3 has both pins on net "+12v"');
  });
  it('a switch default position it does not have', () => {
    const r = check((b) => {
      part(b, 'SW1').position = 'of';
    });
    const p = only(r.problems);
    expect(p.path).toBe('parts[15].position');
    expect(p.accepted).toBe('one of off, on');
  });
  it('a resistance test point with no unpowered condition to measure it in', () => {
    const r = check((b) => {
      b.conditions = b.conditions.filter((c: any) => c.powered);
      delete b.roles.conditions.unpowered;
    });
    expect(r.problems.map((p) => `${p.code} ${p.path}`)).toEqual([
      'board.test-point-unusable testPoints[4].quantity',
      'board.test-point-unusable testPoints[6].quantity',
      'board.test-point-unusable testPoints[7].quantity',
    ]);
  });
});
