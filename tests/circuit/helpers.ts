/** Small builders for test circuits, so each test reads like its schematic. */
import { expect } from 'vitest';
import { solveDC, type Circuit, type Element, type Model, type OpAmpParams } from '../../src/circuit/index.js';

export function circuit(elements: Element[], models: Model[] = [], temperatureC?: number): Circuit {
  const c: Circuit = { title: 'test', elements, models: Object.fromEntries(models.map((m) => [m.name, m])) };
  if (temperatureC !== undefined) c.temperatureC = temperatureC;
  return c;
}

export const R = (name: string, a: string, b: string, value: number, powerRating?: number): Element =>
  powerRating === undefined
    ? { kind: 'resistor', name, nodes: [a, b], value }
    : { kind: 'resistor', name, nodes: [a, b], value, powerRating };
export const V = (name: string, p: string, n: string, dc: number, acMag?: number): Element =>
  acMag === undefined
    ? { kind: 'vsource', name, nodes: [p, n], dc }
    : { kind: 'vsource', name, nodes: [p, n], dc, ac: { mag: acMag, phaseDeg: 0 } };
export const I = (name: string, p: string, n: string, dc: number): Element => ({ kind: 'isource', name, nodes: [p, n], dc });
export const C = (name: string, a: string, b: string, value: number, leakage?: number): Element =>
  leakage === undefined
    ? { kind: 'capacitor', name, nodes: [a, b], value }
    : { kind: 'capacitor', name, nodes: [a, b], value, leakage };
export const L = (name: string, a: string, b: string, value: number): Element => ({ kind: 'inductor', name, nodes: [a, b], value });
export const D = (name: string, anode: string, cathode: string, model: string): Element => ({ kind: 'diode', name, nodes: [anode, cathode], model });
export const Q = (name: string, c: string, b: string, e: string, model: string): Element => ({ kind: 'bjt', name, nodes: [c, b, e], model });

/**
 * A TL072-like op-amp on the figures in REFERENCES.md (ST datasheet at ±15 V: 1.4 mA supply
 * current, about 1.5 V of output headroom); gain 2e5 and 75 Ω output resistance are round
 * figures of the usual order (from memory), not datasheet values.
 */
export const TL072_LIKE: OpAmpParams = { gain: 2e5, rout: 75, rin: 1e12, headroom: 1.5, iq: 1.4e-3, vos: 0, en: 18e-9, in: 1e-14 };

export const OPAMP = (name: string, inp: string, inn: string, out: string, vp: string, vn: string, params: Partial<OpAmpParams> = {}): Element => ({
  kind: 'opamp',
  name,
  nodes: [inp, inn, out, vp, vn],
  params: { ...TL072_LIKE, ...params },
});

/** Relative closeness with an absolute floor. */
export function near(a: number, b: number, rel: number, abs = 0): boolean {
  return Math.abs(a - b) <= rel * Math.max(Math.abs(a), Math.abs(b)) + abs;
}

/**
 * Solves the circuit and checks Kirchhoff's current law at every node with the element currents the
 * solver reports: within reltol·Σ|I| + abstol, plus the 1e-12 S node shunt.
 */
export function expectKclBalanced(c: Circuit): void {
  const s = solveDC(c);
  const sum = new Map<string, number>();
  const mag = new Map<string, number>();
  for (const el of c.elements) {
    el.nodes.forEach((nd, t) => {
      const i = s.elements[el.name].terminalCurrents[t];
      expect(Number.isFinite(i)).toBe(true);
      sum.set(nd, (sum.get(nd) ?? 0) + i);
      mag.set(nd, (mag.get(nd) ?? 0) + Math.abs(i));
    });
  }
  for (const [nd, total] of sum) {
    if (nd === '0') continue;
    expect(Number.isFinite(s.nodes[nd])).toBe(true);
    expect(Math.abs(total)).toBeLessThanOrEqual(1e-3 * mag.get(nd)! + 1e-12 * Math.abs(s.nodes[nd]) + 1e-11);
  }
}
