import { describe, expect, it } from 'vitest';
import {
  solveDC,
  thermalVoltage,
  potResistances,
  LED_PRESETS,
  LED_COLOURS,
  ledModel,
  type Potentiometer,
  type Element,
} from '../../src/circuit/index.js';
import { UserInputError } from '../../src/errors.js';
import { circuit, C, D, I, L, Q, R, V } from './helpers.js';

const EXACT = { gshunt: 0, reltol: 1e-9 };

describe('thermal voltage', () => {
  it('kT/q from CODATA constants', () => {
    // REFERENCES.md: 25.852 mV at 300 K, 25.865 mV at 300.15 K (27 °C, SPICE TNOM).
    expect(thermalVoltage()).toBeCloseTo(0.025865, 6);
    expect(thermalVoltage(300 - 273.15)).toBeCloseTo(0.025852, 6);
  });
});

describe('analysis temperature', () => {
  it('kT/q follows the circuit temperature; IS scaling is not modelled and says so', () => {
    // Shockley: V = N·Vt·ln(I/IS + 1) with Vt = kT/q; with IS held fixed, V scales with T.
    const model = { name: 'd', type: 'D' as const, params: { IS: 1e-14, N: 1, EG: 1.11, XTI: 3 } };
    const at = (t: number) => solveDC(circuit([I('i1', '0', 'a', 1e-3), D('d1', 'a', '0', 'd')], [model], t), EXACT);
    const cold = at(27);
    const hot = at(77);
    expect(hot.nodes.a / cold.nodes.a).toBeCloseTo((77 + 273.15) / (27 + 273.15), 6);
    expect(cold.warnings.join(' ')).not.toMatch(/temperature/);
    expect(hot.warnings.join(' ')).toMatch(/EG, XTI/);
  });
});

describe('Gummel–Poon against its closed forms', () => {
  // Terminal voltages forced by sources, so the transistor's own equations can be checked directly.
  // SPICE Gummel–Poon (ngspice manual, BJT model): with ISE = ISC = 0 and no high injection,
  // Ic = IS·(e^(Vbe/Vt) − e^(Vbc/Vt))·(1 − Vbc/VAF) − IS·(e^(Vbc/Vt) − 1)/BR, Ib = IS·(e^(Vbe/Vt) − 1)/BF + IS·(e^(Vbc/Vt) − 1)/BR.
  const vt = thermalVoltage();
  const forced = (vbe: number, vce: number, params: Record<string, number>, type: 'NPN' | 'PNP' = 'NPN') =>
    solveDC(
      circuit([V('vb', 'b', '0', vbe), V('vc', 'c', '0', vce), Q('q1', 'c', 'b', '0', 'q')], [{ name: 'q', type, params }]),
      EXACT,
    );

  it('forward active: exact Gummel–Poon form, and the textbook Ic = IS·e^(Vbe/Vt)·(1 + Vce/VAF)', () => {
    const IS = 1e-14, BF = 150, VAF = 80, vbe = 0.65, vce = 5;
    const s = forced(vbe, vce, { IS, BF, VAF });
    const vbc = vbe - vce;
    const spice = IS * (Math.exp(vbe / vt) - Math.exp(vbc / vt)) * (1 - vbc / VAF) - (IS * (Math.exp(vbc / vt) - 1)) / 1;
    const ib = (IS * (Math.exp(vbe / vt) - 1)) / BF + IS * (Math.exp(vbc / vt) - 1);
    // The junction GMIN (1e-12 S) adds picoamps; allow for it.
    expect(Math.abs(s.elements.q1.current - spice)).toBeLessThan(1e-9 * spice + 1e-11);
    expect(Math.abs(s.elements.q1.terminalCurrents[1] - ib)).toBeLessThan(1e-9 * ib + 1e-11);
    // The textbook Early form uses Vce where SPICE uses Vcb: they differ by about Vbe/VAF (0.8 % here).
    const textbook = IS * Math.exp(vbe / vt) * (1 + vce / VAF);
    expect(Math.abs(s.elements.q1.current / textbook - 1)).toBeLessThan(1.2 * (vbe / VAF));
    expect(s.junctions.q1).toBe('active');
  });

  it('high injection: qb = q1·(1 + √(1 + 4·q2))/2 with q2 = IS·e^(Vbe/Vt)/IKF', () => {
    const IS = 1e-14, BF = 100, IKF = 0.01, vbe = 0.75, vce = 5;
    const s = forced(vbe, vce, { IS, BF, IKF });
    const vbc = vbe - vce;
    const ibe = IS * (Math.exp(vbe / vt) - 1);
    const ibc = IS * (Math.exp(vbc / vt) - 1);
    const qb = (1 + Math.sqrt(1 + (4 * ibe) / IKF)) / 2;
    const ic = (ibe - ibc) / qb - ibc;
    expect(s.elements.q1.current / ic).toBeCloseTo(1, 8);
    // High injection pulls Ic well below IS·e^(Vbe/Vt).
    expect(s.elements.q1.current).toBeLessThan(0.6 * ibe);
  });

  it('base–emitter leakage ISE/NE adds to the base current only', () => {
    const IS = 1e-14, BF = 100, ISE = 1e-12, NE = 2, vbe = 0.55, vce = 3;
    const s = forced(vbe, vce, { IS, BF, ISE, NE });
    const vbc = vbe - vce;
    // SPICE also puts GMIN (1e-12 S) across each junction.
    const gmin = 1e-12 * vbe + 1e-12 * vbc;
    const ib = (IS * (Math.exp(vbe / vt) - 1)) / BF + ISE * (Math.exp(vbe / (NE * vt)) - 1) + IS * (Math.exp(vbc / vt) - 1) + gmin;
    expect(s.elements.q1.terminalCurrents[1] / ib).toBeCloseTo(1, 8);
  });

  it('PNP is the NPN mirrored: every voltage and current negated', () => {
    const params = { IS: 2e-14, BF: 120, VAF: 50, IKF: 0.05, ISE: 1e-13 };
    const n = forced(0.68, 4, params, 'NPN');
    const p = forced(-0.68, -4, params, 'PNP');
    expect(p.elements.q1.current / n.elements.q1.current).toBeCloseTo(-1, 9);
    expect(p.elements.q1.terminalCurrents[1] / n.elements.q1.terminalCurrents[1]).toBeCloseTo(-1, 9);
  });

  it('regions: cutoff, saturated, reverse-active', () => {
    expect(forced(0, 5, {}).junctions.q1).toBe('cutoff');
    expect(forced(0.7, 0.1, { IS: 1e-14 }).junctions.q1).toBe('saturated');
    expect(forced(-0.5, -5, { IS: 1e-14 }).junctions.q1).toBe('reverse-active');
  });

  it('RB, RE, RC get internal nodes and the answer still satisfies Kirchhoff', () => {
    const s = solveDC(
      circuit(
        [V('vcc', 'vcc', '0', 12), R('rb', 'vcc', 'b', 220e3), R('rc', 'vcc', 'c', 2200), Q('q1', 'c', 'b', '0', 'q')],
        [{ name: 'q', type: 'NPN', params: { IS: 1e-14, BF: 200, RB: 100, RE: 2, RC: 5 } }],
      ),
    );
    const [ic, ib, ie] = s.elements.q1.terminalCurrents;
    expect(ic + ib + ie).toBeCloseTo(0, 12);
    expect(ib).toBeCloseTo((12 - s.nodes.b) / 220e3, 10);
    expect(ic).toBeCloseTo((12 - s.nodes.c) / 2200, 9);
  });

  it('unsupported model parameters are named in a warning, charge parameters are not', () => {
    const s = solveDC(
      circuit([V('vcc', 'c', '0', 5), V('vb', 'b', '0', 0.6), Q('q1', 'c', 'b', '0', 'q')], [
        { name: 'q', type: 'NPN', params: { IS: 1e-14, CJE: 1e-12, TF: 4e-10, IRB: 1e-3, QUUX: 3 } },
      ]),
    );
    const w = s.warnings.join('\n');
    expect(w).toMatch(/IRB/);
    expect(w).toMatch(/QUUX/);
    expect(w).not.toMatch(/CJE|TF/);
  });
});

describe('diode breakdown (zener)', () => {
  // SPICE diode model (ngspice manual): below −BV the reverse current grows as IS·e^(−(BV+V)/(N·Vt)),
  // with BV adjusted so that the current at −BV is IBV. So at IBV the voltage is BV, and each decade
  // of current above adds N·Vt·ln 10.
  const model = { name: 'z', type: 'D' as const, params: { IS: 1e-14, N: 1, BV: 5.1, IBV: 1e-3 } };
  const at = (amps: number) => solveDC(circuit([I('i1', '0', 'k', amps), D('dz', '0', 'k', 'z')], [model]), EXACT);

  it('reverse current IBV gives BV', () => {
    const s = at(1e-3);
    expect(s.nodes.k).toBeCloseTo(5.1, 3);
    expect(s.junctions.dz).toBe('breakdown');
  });

  it('each decade above IBV adds N·Vt·ln 10', () => {
    const a = at(1e-3).nodes.k;
    const b = at(1e-2).nodes.k;
    expect(b - a).toBeCloseTo(thermalVoltage() * Math.LN10, 5);
  });

  it('a small reverse current stays below breakdown', () => {
    const s = solveDC(circuit([V('v1', 'k', '0', 3), D('dz', '0', 'k', 'z')], [model]), EXACT);
    expect(s.junctions.dz).toBe('reverse');
    expect(s.elements.dz.current).toBeGreaterThan(-1e-11);
  });

  it('a 1N4148 model gives the forward voltages in REFERENCES.md', () => {
    // NXP model IS = 4.352 nA, N = 1.906, RS = 0.6458 Ω: about 0.61 V at 1 mA and 0.73 V at 10 mA.
    const d = { name: 'd1n4148', type: 'D' as const, params: { IS: 4.352e-9, N: 1.906, RS: 0.6458 } };
    const vf = (amps: number) => solveDC(circuit([I('i1', '0', 'a', amps), D('d1', 'a', '0', 'd1n4148')], [d])).nodes.a;
    expect(vf(1e-3)).toBeCloseTo(0.61, 2);
    expect(vf(10e-3)).toBeCloseTo(0.73, 2);
    // Datasheet maximum: VF ≤ 1.0 V at 10 mA.
    expect(vf(10e-3)).toBeLessThan(1.0);
  });
});

describe('LED presets', () => {
  // REFERENCES.md, LED forward voltage at 20 mA (typical ranges).
  for (const colour of LED_COLOURS) {
    it(`${colour}: forward voltage at 20 mA within ${LED_PRESETS[colour].typicalRange.join('–')} V`, () => {
      const m = ledModel(colour);
      const s = solveDC(circuit([I('i1', '0', 'a', 0.02), D('led', 'a', '0', m.name)], [m]));
      const [lo, hi] = LED_PRESETS[colour].typicalRange;
      expect(s.nodes.a).toBeGreaterThanOrEqual(lo);
      expect(s.nodes.a).toBeLessThanOrEqual(hi);
      expect(s.nodes.a).toBeCloseTo(LED_PRESETS[colour].targetVf, 2);
      expect(s.junctions.led).toBe('forward');
    });
  }

  it('a red LED from 12 V through 1 kΩ draws about (12 − 2)/1k', () => {
    // Series-resistor sizing rule (common practice): I ≈ (Vsupply − Vf)/R.
    const m = ledModel('red');
    const s = solveDC(circuit([V('v1', 'a', '0', 12), R('r1', 'a', 'k', 1000), D('led', 'k', '0', m.name)], [m]));
    expect(s.elements.led.current).toBeGreaterThan(9.8e-3);
    expect(s.elements.led.current).toBeLessThan(10.3e-3);
  });
});

describe('potentiometer', () => {
  const pot = (position: number, taper: 'linear' | 'log'): Potentiometer => ({ kind: 'pot', name: 'vr1', nodes: ['a', 'w', '0'], value: 10000, position, taper });

  it('linear taper divides in proportion to rotation', () => {
    const [ra, rb] = potResistances(pot(0.3, 'linear'));
    expect(ra).toBeCloseTo(3000, 9);
    expect(rb).toBeCloseTo(7000, 9);
    const s = solveDC(circuit([V('v1', 'a', '0', 10), pot(0.3, 'linear')]), EXACT);
    expect(s.nodes.w).toBeCloseTo(7, 9);
  });

  it('audio taper passes through 10 % at mid-rotation and spans the track', () => {
    // "Audio" (log) taper: about 10 % of the track at half rotation (common practice).
    const [ra, rb] = potResistances(pot(0.5, 'log'));
    expect(ra / 10000).toBeCloseTo(0.1, 9);
    expect(ra + rb).toBeCloseTo(10000, 6);
    const fractions = [0, 0.1, 0.25, 0.5, 0.75, 0.9, 1].map((p) => potResistances(pot(p, 'log'))[0]);
    for (let i = 1; i < fractions.length; i++) expect(fractions[i]).toBeGreaterThan(fractions[i - 1]);
  });

  it('wiper at an end keeps a small, finite resistance', () => {
    const [ra, rb] = potResistances(pot(0, 'linear'));
    expect(ra).toBeGreaterThan(0);
    expect(ra).toBeLessThan(0.01);
    expect(rb).toBeCloseTo(10000, 6);
  });

  it('position outside 0…1 is refused by name', () => {
    expect(() => potResistances(pot(1.2, 'linear'))).toThrow(UserInputError);
    expect(() => potResistances(pot(1.2, 'linear'))).toThrow(/vr1\.position/);
  });
});

describe('switch, capacitor, inductor, ratings', () => {
  const sw = (position: string): Element => ({
    kind: 'switch',
    name: 's1',
    nodes: ['com', 'x', 'y'],
    positions: { left: [[0, 1]], right: [[0, 2]], off: [] },
    position,
    ron: 0.05,
  });

  it('switch joins only the selected pair', () => {
    const els = [V('v1', 'com', '0', 5), sw('right'), R('rx', 'x', '0', 1000), R('ry', 'y', '0', 1000)];
    const s = solveDC(circuit(els), EXACT);
    expect(s.nodes.y).toBeCloseTo((5 * 1000) / 1000.05, 9);
    expect(s.nodes.x).toBeCloseTo(0, 12);
    expect(s.elements.s1.terminalCurrents[2]).toBeCloseTo(-s.nodes.y / 1000, 12);
  });

  it('unknown switch position is refused, listing the positions', () => {
    expect(() => solveDC(circuit([V('v1', 'com', '0', 5), sw('middle'), R('rx', 'x', '0', 1)]))).toThrow(/left, right, off/);
  });

  it('capacitor is open at DC, leakage conducts', () => {
    const open = solveDC(circuit([V('v1', 'a', '0', 10), R('r1', 'a', 'b', 1e4), C('c1', 'b', '0', 1e-6)]), EXACT);
    expect(open.nodes.b).toBeCloseTo(10, 12);
    const leaky = solveDC(circuit([V('v1', 'a', '0', 10), R('r1', 'a', 'b', 1e4), C('c1', 'b', '0', 1e-6, 1e-4)]), EXACT);
    expect(leaky.nodes.b).toBeCloseTo(5, 9);
  });

  it('capacitor-only node floats to ground through the shunt instead of failing', () => {
    const s = solveDC(circuit([V('v1', 'a', '0', 10), C('c1', 'a', 'f', 1e-6), C('c2', 'f', '0', 1e-6)]));
    expect(Number.isFinite(s.nodes.f)).toBe(true);
  });

  it('inductor is a short at DC and carries the branch current', () => {
    const s = solveDC(circuit([V('v1', 'a', '0', 6), L('l1', 'a', 'b', 1e-3), R('r1', 'b', '0', 100)]), EXACT);
    expect(s.nodes.b).toBeCloseTo(6, 12);
    expect(s.elements.l1.current).toBeCloseTo(0.06, 12);
  });

  it('a resistor over its power rating is flagged', () => {
    // P = V²/R = 144/100 = 1.44 W on a 0.25 W part.
    const s = solveDC(circuit([V('v1', 'a', '0', 12), R('r1', 'a', '0', 100, 0.25)]), EXACT);
    expect(s.elements.r1.power).toBeCloseTo(1.44, 9);
    expect(s.elements.r1.overRating).toBe(true);
    expect(s.warnings.some((w) => w.includes('r1'))).toBe(true);
  });

  it('bad values are refused with the element and field named', () => {
    expect(() => solveDC(circuit([V('v1', 'a', '0', 1), R('r7', 'a', '0', -5)]))).toThrow(/r7\.value/);
    expect(() => solveDC(circuit([V('v1', 'a', '0', Number.NaN), R('r1', 'a', '0', 5)]))).toThrow(UserInputError);
    expect(() => solveDC(circuit([V('v1', 'a', '0', 1), D('d1', 'a', '0', 'nosuch')]))).toThrow(/nosuch/);
  });
});
