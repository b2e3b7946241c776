import { describe, expect, it } from 'vitest';
import { ConvergenceError, solveDC, createDcSolver, StampError } from '../../src/circuit/index.js';
import { Stamper } from '../../src/circuit/stamper.js';
import { criticalVoltage, limitJunction } from '../../src/circuit/junction.js';
import { circuit, D, OPAMP, Q, R, V } from './helpers.js';

const diodeModel = { name: 'd', type: 'D' as const, params: { IS: 1e-14 } };

describe('strategy list', () => {
  // Circuit: two cross-coupled transistors (a bistable) plus a diode string — hard for plain Newton from zero.
  const hard = circuit(
    [
      V('vcc', 'vcc', '0', 15),
      R('r1', 'vcc', 'c1', 1000),
      R('r2', 'vcc', 'c2', 1200),
      R('rb1', 'c2', 'b1', 10e3),
      R('rb2', 'c1', 'b2', 10e3),
      Q('q1', 'c1', 'b1', '0', 'q'),
      Q('q2', 'c2', 'b2', '0', 'q'),
      R('rd', 'vcc', 'a1', 100),
      D('d1', 'a1', 'a2', 'd'),
      D('d2', 'a2', 'a3', 'd'),
      D('d3', 'a3', '0', 'd'),
    ],
    [diodeModel, { name: 'q', type: 'NPN', params: { IS: 1e-15, BF: 100 } }],
  );

  it('plain Newton, gmin stepping and source stepping each reach a valid answer', () => {
    const newton = solveDC(hard);
    const gmin = solveDC(hard, { skip: ['newton'] });
    const source = solveDC(hard, { skip: ['newton', 'gmin'] });
    expect(gmin.strategy).toBe('gmin');
    expect(source.strategy).toBe('source');
    for (const s of [newton, gmin, source]) {
      // The diode string: three forward drops, each about 0.7–0.8 V at ~12 mA with IS = 1e-14.
      expect(s.nodes.a1).toBeGreaterThan(2.0);
      expect(s.nodes.a1).toBeLessThan(2.5);
    }
    // The diode string has one answer whichever strategy found it.
    expect(gmin.nodes.a1).toBeCloseTo(newton.nodes.a1, 2);
    expect(source.nodes.a1).toBeCloseTo(newton.nodes.a1, 2);
  });

  it('running out of work ends in ConvergenceError naming the unsettled nodes', () => {
    const c = circuit([V('v1', 'a', '0', 50), R('r1', 'a', 'k', 10), D('d1', 'k', '0', 'd')], [diodeModel]);
    let caught: unknown;
    try {
      solveDC(c, { maxIterations: 2, maxGminSteps: 1, maxSourceSteps: 1 });
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(ConvergenceError);
    expect((caught as ConvergenceError).nodes).toContain('k');
    expect((caught as ConvergenceError).message).toMatch(/did not converge/);
  });

  it('a loop of voltage sources that disagree is a ConvergenceError, not NaN', () => {
    const c = circuit([V('v1', 'a', '0', 1), V('v2', 'a', '0', 2), R('r1', 'a', '0', 1000)]);
    expect(() => solveDC(c)).toThrow(ConvergenceError);
  });

  it('an op-amp with no supplies at all still gives a finite answer', () => {
    const s = solveDC(circuit([V('vin', 'in', '0', 1), R('ri', 'in', 'm', 10e3), R('rf', 'm', 'out', 100e3), OPAMP('u1', '0', 'm', 'out', 'vp', 'vn')]));
    for (const v of Object.values(s.nodes)) expect(Number.isFinite(v)).toBe(true);
  });

  it('a reusable solver gives the same answer again, and warm solves take fewer iterations', () => {
    const solver = createDcSolver(hard);
    const first = solver.solve();
    const again = solver.solve();
    expect(again.nodes).toEqual(first.nodes);
    const warm = solver.solve({ initial: first });
    expect(warm.iterations).toBeLessThan(first.iterations);
  });
});

describe('Stamper', () => {
  it('skips ground and refuses non-finite numbers, naming the element', () => {
    const s = new Stamper(2);
    s.owner = 'r9';
    s.conductance(0, -1, 2);
    expect(Array.from(s.a)).toEqual([2, 0, 0, 0]);
    s.current(-1, 1, 1e-3);
    expect(Array.from(s.b)).toEqual([0, 1e-3]);
    expect(() => s.conductance(0, 1, Number.NaN)).toThrow(StampError);
    expect(() => s.rhs(1, Infinity)).toThrow(/r9/);
  });
});

describe('junction limiting (SPICE pnjlim)', () => {
  const nvt = 0.025865;
  const vcrit = criticalVoltage(1e-14, nvt);

  it('vcrit = nVt·ln(nVt/(√2·IS))', () => {
    // REFERENCES.md (ngspice DEVpnjlim): vcrit = nVt·ln(nVt/(√2·Is)); ≈ 0.73 V for IS = 1e-14 at 27 °C.
    expect(vcrit).toBeCloseTo(nvt * Math.log(nvt / (Math.SQRT2 * 1e-14)), 12);
    expect(vcrit).toBeGreaterThan(0.7);
    expect(vcrit).toBeLessThan(0.76);
  });

  it('a large forward step above vcrit is taken on a log scale', () => {
    const v = limitJunction(5, 0.6, nvt, vcrit);
    expect(v).toBeCloseTo(0.6 + nvt * Math.log(1 + (5 - 0.6) / nvt), 12);
    expect(v).toBeLessThan(0.8);
  });

  it('small steps and steps below vcrit pass unchanged', () => {
    expect(limitJunction(0.65, 0.64, nvt, vcrit)).toBe(0.65);
    expect(limitJunction(0.5, 0, nvt, vcrit)).toBe(0.5);
  });

  it('a large reverse step is held to one volt below the last value', () => {
    expect(limitJunction(-20, 0.5, nvt, vcrit)).toBeCloseTo(-1.5, 12);
  });
});
