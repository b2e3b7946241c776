import { describe, expect, it } from 'vitest';
import { solveDC, thermalVoltage } from '../../src/circuit/index.js';
import { circuit, D, Q, R, V, I } from './helpers.js';
import { lambertW, lambertWOfExp } from './lambert-w.js';

// Exact comparisons switch off the solver's 1e-12 S node-to-ground shunt (SPICE has none by default).
const EXACT = { gshunt: 0, reltol: 1e-9 };

describe('linear textbook circuits', () => {
  it('voltage divider: Vout = Vin·R2/(R1+R2)', () => {
    // Voltage divider rule (common practice): 12 V across 4.7 kΩ over 10 kΩ.
    const s = solveDC(circuit([V('v1', 'in', '0', 12), R('r1', 'in', 'out', 4700), R('r2', 'out', '0', 10000)]), EXACT);
    expect(s.nodes.out).toBeCloseTo((12 * 10000) / 14700, 6);
    // SPICE sign: the source delivers current, so its branch current (into +) is negative.
    expect(s.sourceCurrents.v1).toBeCloseTo(-12 / 14700, 12);
    expect(s.elements.r1.current).toBeCloseTo(12 / 14700, 12);
    expect(s.elements.v1.power).toBeCloseTo((-12 * 12) / 14700, 9);
  });

  it('Wheatstone bridge with a meter across it matches the Thevenin closed form', () => {
    // Bridge analysis by Thevenin's theorem (standard circuit-theory worked method):
    // Vth = V·(R3/(R1+R3) − R4/(R2+R4)), Rth = R1‖R3 + R2‖R4, Ig = Vth/(Rth + Rg).
    const v = 10, r1 = 1000, r2 = 1200, r3 = 2200, r4 = 2700, rg = 500;
    const s = solveDC(
      circuit([
        V('v1', 'top', '0', v),
        R('r1', 'top', 'a', r1),
        R('r3', 'a', '0', r3),
        R('r2', 'top', 'b', r2),
        R('r4', 'b', '0', r4),
        R('rg', 'a', 'b', rg),
      ]),
      EXACT,
    );
    const vth = v * (r3 / (r1 + r3) - r4 / (r2 + r4));
    const rth = (r1 * r3) / (r1 + r3) + (r2 * r4) / (r2 + r4);
    expect(s.elements.rg.current).toBeCloseTo(vth / (rth + rg), 12);
  });

  it('balanced bridge: no current in the detector', () => {
    // Balance condition R1/R3 = R2/R4 (common practice).
    const s = solveDC(
      circuit([V('v1', 't', '0', 5), R('r1', 't', 'a', 1000), R('r3', 'a', '0', 2000), R('r2', 't', 'b', 3300), R('r4', 'b', '0', 6600), R('rg', 'a', 'b', 100)]),
      EXACT,
    );
    expect(Math.abs(s.elements.rg.current)).toBeLessThan(1e-12);
  });

  it('current source into a resistor: SPICE I-source direction', () => {
    // SPICE convention: "I1 0 n 1m" drives 1 mA out of its − node (n) into the circuit.
    const s = solveDC(circuit([I('i1', '0', 'n', 1e-3), R('r1', 'n', '0', 4700)]), EXACT);
    expect(s.nodes.n).toBeCloseTo(4.7, 9);
  });
});

describe('the Lambert W helper itself', () => {
  it('W(e) = 1, W(1) = Ω ≈ 0.567143 (the omega constant, from memory), W(x)·e^W(x) = x', () => {
    expect(lambertW(Math.E)).toBeCloseTo(1, 14);
    expect(lambertW(1)).toBeCloseTo(0.567143290409784, 12);
    for (const x of [1e-6, 0.3, 7, 1e5, 1e50]) {
      const w = lambertW(x);
      expect(w * Math.exp(w) / x).toBeCloseTo(1, 12);
    }
    const w = lambertWOfExp(1000);
    expect(w + Math.log(w)).toBeCloseTo(1000, 10);
  });
});

describe('diode and resistor against the Lambert W closed form', () => {
  // Series diode–resistor from Vs: I = (nVt/R)·W((Is·R/nVt)·exp((Vs + Is·R)/nVt)) − Is, the standard
  // explicit solution of Vs = I·R + nVt·ln(I/Is + 1) (e.g. Banwell & Jayakumar, Electronics Letters 36(4), 2000).
  const cases = [
    { vs: 5, r: 1000, is: 4.352e-9, n: 1.906 }, // the NXP 1N4148 model figures in REFERENCES.md
    { vs: 1, r: 100, is: 1e-14, n: 1 },
    { vs: 12, r: 10000, is: 2.52e-9, n: 1.752 },
    { vs: 0.3, r: 1e5, is: 1e-12, n: 1.2 },
  ];
  for (const { vs, r, is, n } of cases) {
    it(`Vs=${vs} V, R=${r} Ω, IS=${is}, N=${n}`, () => {
      const nvt = n * thermalVoltage();
      const lnArg = Math.log((is * r) / nvt) + (vs + is * r) / nvt;
      const w = lnArg > 200 ? lambertWOfExp(lnArg) : lambertW(Math.exp(lnArg));
      const current = (nvt / r) * w - is;
      const s = solveDC(circuit([V('v1', 'a', '0', vs), R('r1', 'a', 'k', r), D('d1', 'k', '0', 'd')], [{ name: 'd', type: 'D', params: { IS: is, N: n } }]), EXACT);
      // GMIN (1e-12 S) sits across the junction, as in SPICE: allow for its few picoamps.
      expect(Math.abs(s.elements.d1.current - current)).toBeLessThan(1e-9 * current + 1e-11);
      expect(s.nodes.k).toBeCloseTo(vs - current * r, 7);
    });
  }
});

describe('BJT voltage-divider bias worked by hand', () => {
  // Textbook-style worked example (method of any introductory electronics text, numbers ours):
  // VCC 12 V, R1 47 kΩ, R2 10 kΩ, RC 4.7 kΩ, RE 1 kΩ, β = 100, IS = 1e-14 A.
  // By hand: VTH = 12·10/57 = 2.1053 V, RTH = 47k‖10k = 8.2456 kΩ;
  // first pass VBE = 0.7 V: IB = (2.1053 − 0.7)/(8.2456k + 101·1k) = 12.86 µA, IC = 1.286 mA;
  // then VBE = Vt·ln(IC/IS) = 0.6616 V, and repeating converges to IC ≈ 1.32 mA.
  it('collector current, collector and emitter voltages', () => {
    const vcc = 12, r1 = 47e3, r2 = 10e3, rc = 4.7e3, re = 1e3, beta = 100, is = 1e-14;
    const vth = (vcc * r2) / (r1 + r2);
    const rth = (r1 * r2) / (r1 + r2);
    let vbe = 0.7;
    let ib = 0;
    for (let k = 0; k < 50; k++) {
      ib = (vth - vbe) / (rth + (beta + 1) * re);
      vbe = thermalVoltage() * Math.log((beta * ib) / is);
    }
    const ic = beta * ib;
    expect(ic).toBeGreaterThan(1.3e-3); // the hand figure above, as a sanity check of the loop
    expect(ic).toBeLessThan(1.34e-3);
    const s = solveDC(
      circuit(
        [V('vcc', 'vcc', '0', vcc), R('r1', 'vcc', 'b', r1), R('r2', 'b', '0', r2), R('rc', 'vcc', 'c', rc), R('re', 'e', '0', re), Q('q1', 'c', 'b', 'e', 'q')],
        [{ name: 'q', type: 'NPN', params: { IS: is, BF: beta } }],
      ),
      EXACT,
    );
    expect(s.elements.q1.current).toBeCloseTo(ic, 7);
    expect(s.nodes.c).toBeCloseTo(vcc - ic * rc, 3);
    expect(s.nodes.e).toBeCloseTo((beta + 1) * ib * re, 3);
    expect(s.junctions.q1).toBe('active');
  });
});
