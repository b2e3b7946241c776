import { describe, expect, it } from 'vitest';
import { solveAC, solveDC, createAcSolver, thermalVoltage } from '../../src/circuit/index.js';
import { circuit, C, L, OPAMP, Q, R, V } from './helpers.js';

describe('small-signal AC against closed forms', () => {
  it('RC low-pass: |H| = 1/√(1 + (ωRC)²), phase −atan(ωRC)', () => {
    // First-order RC low-pass transfer function H = 1/(1 + jωRC) (standard circuit theory).
    const r = 10e3, c = 15.9e-9;
    const circ = circuit([V('vin', 'in', '0', 0, 1), R('r1', 'in', 'out', r), C('c1', 'out', '0', c)]);
    const ac = createAcSolver(circ);
    for (const f of [10, 100, 1000, 1e4, 1e5]) {
      const wrc = 2 * Math.PI * f * r * c;
      const s = ac.solve(f);
      expect(s.nodes.out.mag).toBeCloseTo(1 / Math.sqrt(1 + wrc * wrc), 6);
      expect(s.nodes.out.phaseDeg).toBeCloseTo((-Math.atan(wrc) * 180) / Math.PI, 4);
      expect(s.nodes.in.mag).toBeCloseTo(1, 12);
    }
  });

  it('series RLC: at resonance 1/(2π√(LC)) the resistor sees the whole source', () => {
    // Series resonance: the reactances of L and C cancel at f0 = 1/(2π√(LC)) (standard circuit theory).
    const l = 10e-3, c = 100e-9, r = 50;
    const f0 = 1 / (2 * Math.PI * Math.sqrt(l * c));
    const s = solveAC(circuit([V('vin', 'in', '0', 0, 2), L('l1', 'in', 'a', l), C('c1', 'a', 'b', c), R('r1', 'b', '0', r)]), f0);
    expect(s.nodes.b.mag).toBeCloseTo(2, 6);
    expect(s.nodes.b.phaseDeg).toBeCloseTo(0, 4);
    // The voltage across C alone is Q times the source: Q = (1/R)·√(L/C).
    const q = Math.sqrt(l / c) / r;
    const vc = Math.hypot(s.nodes.a.re - s.nodes.b.re, s.nodes.a.im - s.nodes.b.im);
    expect(vc).toBeCloseTo(2 * q, 4);
  });

  it('op-amp inverting low-pass: −(R2/R1)/(1 + jωR2C)', () => {
    // Inverting amplifier with a capacitor across the feedback resistor (standard op-amp filter).
    const r1 = 10e3, r2 = 100e3, c = 1.59e-9;
    const els = [
      V('vp', 'vp', '0', 12),
      V('vn', 'vn', '0', -12),
      V('vin', 'in', '0', 0, 0.1),
      R('r1', 'in', 'm', r1),
      R('r2', 'm', 'out', r2),
      C('c1', 'm', 'out', c),
      OPAMP('u1', '0', 'm', 'out', 'vp', 'vn'),
    ];
    for (const f of [100, 1000, 10e3]) {
      const wrc = 2 * Math.PI * f * r2 * c;
      const s = solveAC(circuit(els), f);
      expect(s.nodes.out.mag / 0.1).toBeCloseTo(r2 / r1 / Math.sqrt(1 + wrc * wrc), 2);
      expect(s.nodes.out.phaseDeg).toBeCloseTo(180 - (Math.atan(wrc) * 180) / Math.PI, 1);
    }
  });

  it('common-emitter stage: gain −gm·RC with gm = IC/Vt at the operating point', () => {
    // Hybrid-π small-signal model: gm = IC/Vt; with the emitter bypassed and the base driven
    // directly, the collector gain is −gm·RC (standard transistor-amplifier analysis; no Early effect here).
    const els = [
      V('vcc', 'vcc', '0', 12),
      V('vb', 'bias', '0', 2.0),
      V('vsig', 'sig', '0', 0, 1e-3),
      R('rbias', 'bias', 'b', 10e3),
      C('cin', 'sig', 'b', 1),
      R('rc', 'vcc', 'c', 4700),
      R('re', 'e', '0', 1000),
      C('ce', 'e', '0', 10),
      Q('q1', 'c', 'b', 'e', 'q'),
    ];
    const circ = circuit(els, [{ name: 'q', type: 'NPN', params: { IS: 1e-14, BF: 200 } }]);
    const op = solveDC(circ, { reltol: 1e-9 });
    const gm = op.elements.q1.current / thermalVoltage();
    const s = solveAC(circ, 1000, { op });
    expect(s.nodes.c.mag / 1e-3 / (gm * 4700)).toBeCloseTo(1, 3);
    expect(Math.abs(s.nodes.c.phaseDeg)).toBeCloseTo(180, 1);
  });

  it('sources without an ac spec give no excitation', () => {
    const s = solveAC(circuit([V('v1', 'a', '0', 5), R('r1', 'a', 'b', 1e3), R('r2', 'b', '0', 1e3)]), 1000);
    expect(s.nodes.b.mag).toBe(0);
  });
});
