/**
 * Changing part values of a compiled circuit in place (DcSolver.setValue) and the lean solve.
 * The expected values come from the textbook laws named beside each check; each in-place answer is
 * also compared with a fresh compile of the circuit written with the new value, which must agree
 * to the last digit (same equations, same start, same iterations).
 */
import { describe, expect, it } from 'vitest';
import { createDcSolver, solveDC, thermalVoltage, type Circuit, type DcSolution, type Element, type Model } from '../../src/circuit/index.js';
import { UserInputError } from '../../src/errors.js';
import { circuit, D, I, OPAMP, Q, R, V } from './helpers.js';

const EXACT = { gshunt: 0, reltol: 1e-9 };

/** The same circuit with one element's field (or one model parameter) rewritten. */
function rewritten(c: Circuit, element: string, change: Partial<Record<string, unknown>>): Circuit {
  return { ...c, elements: c.elements.map((e) => (e.name === element ? ({ ...e, ...change } as Element) : e)) };
}

function expectSameNodes(a: DcSolution, b: DcSolution): void {
  expect(Object.keys(a.nodes).sort()).toEqual(Object.keys(b.nodes).sort());
  for (const [node, v] of Object.entries(a.nodes)) expect(b.nodes[node]).toBe(v);
}

describe('setValue on a compiled circuit', () => {
  const divider = circuit([V('v1', 'in', '0', 10), R('r1', 'in', 'mid', 1e3), R('r2', 'mid', '0', 1e3)]);

  it('resistor value: a divider follows R2/(R1 + R2) (voltage-divider rule)', () => {
    const solver = createDcSolver(divider);
    expect(solver.solve(EXACT).nodes.mid).toBeCloseTo(5, 9);
    solver.setValue('r2', 'value', 3e3);
    const changed = solver.solve(EXACT);
    expect(changed.nodes.mid).toBeCloseTo(10 * (3e3 / 4e3), 9);
    expect(changed.elements.r2.current).toBeCloseTo(10 / 4e3, 12); // Ohm's law through the string
    expectSameNodes(changed, solveDC(rewritten(divider, 'r2', { value: 3e3 }), EXACT));
    // The circuit the solver was made from is left alone.
    expect((divider.elements[2] as { value: number }).value).toBe(1e3);
  });

  it('an open resistor (Infinity) and back', () => {
    const solver = createDcSolver(divider);
    solver.setValue('r2', 'value', Infinity);
    expect(solver.solve(EXACT).nodes.mid).toBeCloseTo(10, 9); // no current, no drop across R1
    solver.setValue('r2', 'value', 1e3);
    expect(solver.solve(EXACT).nodes.mid).toBeCloseTo(5, 9);
  });

  it('source dc: a linear circuit scales with its source (superposition)', () => {
    const solver = createDcSolver(divider);
    solver.setValue('v1', 'dc', -4);
    expect(solver.solve(EXACT).nodes.mid).toBeCloseTo(-2, 9);
    const isrc = createDcSolver(circuit([I('i1', '0', 'a', 1e-3), R('r1', 'a', '0', 2e3)]));
    isrc.setValue('i1', 'dc', 2e-3);
    expect(isrc.solve(EXACT).nodes.a).toBeCloseTo(4, 9); // V = I·R
  });

  it('pot value and position: a linear track divides by its position', () => {
    const pot: Element = { kind: 'pot', name: 'vr1', nodes: ['in', 'w', '0'], value: 10e3, position: 0.5, taper: 'linear' };
    const c = circuit([V('v1', 'in', '0', 10), pot]);
    const solver = createDcSolver(c);
    expect(solver.solve(EXACT).nodes.w).toBeCloseTo(5, 9);
    solver.setValue('vr1', 'position', 0.25);
    // Position 0 puts the wiper at a (in): 25 % of the track above the wiper leaves 75 % of 10 V.
    expect(solver.solve(EXACT).nodes.w).toBeCloseTo(7.5, 9);
    solver.setValue('vr1', 'value', 50e3);
    const s = solver.solve(EXACT);
    expect(s.nodes.w).toBeCloseTo(7.5, 9); // an unloaded divider does not depend on the track value
    expect(s.elements.vr1.current).toBeCloseTo(10 / 50e3, 12);
    expectSameNodes(s, solveDC(rewritten(c, 'vr1', { value: 50e3, position: 0.25 }), EXACT));
  });

  it('op-amp vos: a follower shows its offset at the output (vo = A/(1 + A)·vos)', () => {
    const c = circuit([V('vp', 'vcc', '0', 12), V('vn', 'vee', '0', -12), OPAMP('u1', '0', 'out', 'out', 'vcc', 'vee'), R('rl', 'out', '0', 10e3)]);
    const solver = createDcSolver(c);
    solver.setValue('u1', 'vos', 3e-3);
    const s = solver.solve(EXACT);
    // Voltage follower with finite open-loop gain A (textbook non-inverting amplifier, gain 1).
    expect(s.nodes.out).toBeCloseTo(3e-3 * (2e5 / (1 + 2e5)), 6);
    const op = c.elements[2] as Extract<Element, { kind: 'opamp' }>;
    expectSameNodes(s, solveDC({ ...c, elements: c.elements.map((e) => (e === op ? { ...op, params: { ...op.params, vos: 3e-3 } } : e)) }, EXACT));
    expect(op.params.vos).toBe(0);
  });

  it('diode IS ×10 lowers the forward drop by N·Vt·ln 10 at the same current (Shockley equation)', () => {
    const model: Model = { name: 'dx', type: 'D', params: { IS: 1e-14, N: 1 } };
    const c = circuit([I('i1', '0', 'a', 1e-3), D('d1', 'a', '0', 'dx'), D('d2', 'a', 'b', 'dx'), R('rb', 'b', '0', 1e12)], [model]);
    const solver = createDcSolver(c);
    const before = solver.solve(EXACT).nodes.a;
    solver.setValue('d1', 'IS', 1e-13);
    const after = solver.solve(EXACT);
    expect(before - after.nodes.a).toBeCloseTo(thermalVoltage() * Math.log(10), 5);
    expectSameNodes(after, solveDC({ ...c, models: { ...c.models, dx1: { name: 'dx1', type: 'D', params: { IS: 1e-13, N: 1 } } }, elements: c.elements.map((e) => (e.name === 'd1' ? { ...e, model: 'dx1' } as Element : e)) }, EXACT));
    // The model is the part's own: d2 on the same card kept IS = 1e-14.
    expect(model.params.IS).toBe(1e-14);
  });

  it('BJT BF on one transistor only: base current = IC/BF (Gummel–Poon, forward active)', () => {
    const model: Model = { name: 'qn', type: 'NPN', params: { IS: 1e-15, BF: 100 } };
    const c = circuit(
      [
        V('vcc', 'vcc', '0', 10),
        I('ib1', '0', 'b1', 10e-6),
        Q('q1', 'c1', 'b1', '0', 'qn'),
        R('rc1', 'vcc', 'c1', 1e3),
        I('ib2', '0', 'b2', 10e-6),
        Q('q2', 'c2', 'b2', '0', 'qn'),
        R('rc2', 'vcc', 'c2', 1e3),
      ],
      [model],
    );
    const solver = createDcSolver(c);
    solver.setValue('q1', 'bf', 250); // model parameters are case-blind, as in SPICE
    const s = solver.solve(EXACT);
    expect(s.elements.q1.current).toBeCloseTo(250 * 10e-6, 8);
    expect(s.elements.q2.current).toBeCloseTo(100 * 10e-6, 8);
  });

  it('bad changes are one-line UserInputErrors naming the element and field, and change nothing', () => {
    const solver = createDcSolver(divider);
    expect(() => solver.setValue('r9', 'value', 1)).toThrow(UserInputError);
    expect(() => solver.setValue('r1', 'position', 1)).toThrow(/r1/);
    expect(() => solver.setValue('r1', 'value', -5)).toThrow(UserInputError);
    expect(() => solver.setValue('v1', 'dc', NaN)).toThrow(/dc of v1/);
    expect(solver.canSet('r1', 'value')).toBe(true);
    expect(solver.canSet('r1', 'dc')).toBe(false);
    expect(solver.solve(EXACT).nodes.mid).toBeCloseTo(5, 9);

    const model: Model = { name: 'dx', type: 'D', params: { IS: 1e-14 } };
    const diode = createDcSolver(circuit([I('i1', '0', 'a', 1e-3), D('d1', 'a', '0', 'dx')], [model]));
    const forward = diode.solve(EXACT).nodes.a;
    // RS = 0 compiles without an internal node; a series resistance cannot appear in place.
    expect(() => diode.setValue('d1', 'RS', 2)).toThrow(UserInputError);
    expect(() => diode.setValue('d1', 'CJO', 1e-12)).toThrow(/CJO/);
    expect(() => diode.setValue('d1', 'IS', 0)).toThrow(UserInputError);
    // A refused value leaves the part as it was: the next change starts from RS = 0 and IS = 1e-14.
    diode.setValue('d1', 'N', 1);
    expect(diode.solve(EXACT).nodes.a).toBe(forward);

    const amp = createDcSolver(circuit([V('vp', 'vcc', '0', 12), V('vn', 'vee', '0', -12), OPAMP('u1', '0', 'out', 'out', 'vcc', 'vee'), R('rl', 'out', '0', 10e3)]));
    const healthy = amp.solve(EXACT).nodes.out;
    expect(() => amp.setValue('u1', 'gain', 0)).toThrow(/params\.gain of u1/);
    expect(() => amp.setValue('u1', 'headroom', -1)).toThrow(UserInputError);
    expect(() => amp.setValue('u1', 'vos', Infinity)).toThrow(/params\.vos of u1/);
    expect(() => amp.setValue('u1', 'bias', 1)).toThrow(/bias of u1/);
    expect(amp.solve(EXACT).nodes.out).toBe(healthy);
    // An ideal input (rin = ∞) is accepted in place as at compile time.
    amp.setValue('u1', 'rin', Infinity);
    expect(amp.solve(EXACT).nodes.out).toBeCloseTo(healthy, 12);
  });
});

describe('solveLean', () => {
  it('leaves in x exactly what solve() reports, from cold and from a warm start', () => {
    const model: Model = { name: 'dx', type: 'D', params: { IS: 4e-9, N: 1.9, RS: 0.6 } };
    const c = circuit(
      [V('vp', 'vcc', '0', 12), V('vn', 'vee', '0', -12), V('vin', 'in', '0', 0.3), R('ri', 'in', 'm', 10e3), R('rf', 'm', 'out', 47e3),
        OPAMP('u1', '0', 'm', 'out', 'vcc', 'vee'), D('d1', 'out', 'r', 'dx'), R('rr', 'r', '0', 22e3)],
      [model],
    );
    const solver = createDcSolver(c);
    const full = solver.solve();
    const start = solver.x.slice();
    const cold = solver.solveLean();
    expect(cold.strategy).toBe(full.strategy);
    expect(cold.iterations).toBe(full.iterations);
    solver.compiled.unknownNames.forEach((name, i) => expect(solver.x[i]).toBe(full.unknowns![name]));

    solver.setValue('rf', 'value', 56e3);
    const warmFull = solver.solve({ initial: full });
    const warmLean = solver.solveLean({ start });
    expect(warmLean.iterations).toBe(warmFull.iterations);
    solver.compiled.unknownNames.forEach((name, i) => expect(solver.x[i]).toBe(warmFull.unknowns![name]));
    // Inverting amplifier, −Rf/Ri·vin with the diode's load on the output (textbook, ideal op-amp).
    expect(solver.x[solver.compiled.nodeIndex.get('out')!]).toBeCloseTo(-0.3 * (56e3 / 10e3), 3);
    expect(() => solver.solveLean({ start: new Float64Array(2) })).toThrow(RangeError);
  });

  it('an options object handed in again is read again: a field changed in it takes effect', () => {
    const model: Model = { name: 'dx', type: 'D', params: { IS: 1e-14 } };
    const solver = createDcSolver(circuit([V('v1', 'in', '0', 5), R('r1', 'in', 'a', 1e3), D('d1', 'a', '0', 'dx')], [model]));
    const options: { maxIterations: number; skip: Array<'gmin' | 'source'> } = { maxIterations: 1, skip: ['gmin', 'source'] };
    // One Newton iteration from zero cannot settle a diode (it needs a step and a check).
    expect(() => solver.solveLean(options)).toThrow(/iteration limit/);
    options.maxIterations = 100;
    expect(solver.solveLean(options).strategy).toBe('newton');
    options.maxIterations = 1;
    options.skip.pop();
    // Source stepping now allowed: the solve gets further than plain Newton's one iteration.
    expect(() => solver.solveLean(options)).toThrow(/source stepping/);
  });
});
