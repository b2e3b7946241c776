import { describe, expect, it } from 'vitest';
import { solveDC } from '../../src/circuit/index.js';
import { circuit, OPAMP, R, TL072_LIKE, V } from './helpers.js';

const rails = [V('vp', 'vp', '0', 12), V('vn', 'vn', '0', -12)];
const A = TL072_LIKE.gain;

describe('op-amp with supply pins', () => {
  it('inverting amplifier: −Rf/Ri with the finite-gain correction', () => {
    // Inverting amplifier with finite open-loop gain A (standard op-amp text result):
    // Vout = −Vin·(Rf/Ri) / (1 + (1 + Rf/Ri)/A).
    const s = solveDC(
      circuit([...rails, V('vin', 'in', '0', 0.5), R('ri', 'in', 'm', 10e3), R('rf', 'm', 'out', 100e3), OPAMP('u1', '0', 'm', 'out', 'vp', 'vn')]),
      { gshunt: 0, reltol: 1e-9 },
    );
    const k = 10;
    const expected = (-0.5 * k) / (1 + (1 + k) / A);
    expect(s.nodes.out).toBeCloseTo(expected, 4);
    expect(s.nodes.m).toBeCloseTo(0, 4); // virtual earth
  });

  it('non-inverting amplifier: 1 + Rf/Rg, and the offset voltage multiplied by it', () => {
    // Non-inverting gain 1 + Rf/Rg (standard op-amp text result); an input offset appears at the output × the noise gain.
    const build = (vos: number) =>
      solveDC(
        circuit([...rails, V('vin', 'in', '0', 0.05), R('rg', 'm', '0', 1e3), R('rf', 'm', 'out', 100e3), OPAMP('u1', 'in', 'm', 'out', 'vp', 'vn', { vos })]),
        { gshunt: 0, reltol: 1e-9 },
      );
    const g = 101;
    // The tanh law's incremental gain falls toward the rails (A·sech²), so halfway up the swing the
    // closed-loop error is a little over g/A; hold it to 2·g/A.
    const ideal = build(0);
    expect(Math.abs(ideal.nodes.out / (0.05 * g) - 1)).toBeLessThan((2 * g) / A);
    const offset = build(1e-3);
    expect(Math.abs((offset.nodes.out - ideal.nodes.out) / (1e-3 * g) - 1)).toBeLessThan((2 * g) / A);
  });

  it('saturates smoothly about `headroom` inside each rail', () => {
    // REFERENCES.md: TL072 on ±12 V rails swings roughly ±10.5 V (1.5 V headroom).
    const drive = (vin: number) =>
      solveDC(circuit([...rails, V('vin', 'in', '0', vin), R('ri', 'in', 'm', 10e3), R('rf', 'm', 'out', 100e3), R('rl', 'out', '0', 10e3), OPAMP('u1', '0', 'm', 'out', 'vp', 'vn')]));
    const high = drive(-3).nodes.out;
    const low = drive(3).nodes.out;
    expect(high).toBeGreaterThan(10.2);
    expect(high).toBeLessThan(10.5);
    expect(low).toBeLessThan(-10.2);
    expect(low).toBeGreaterThan(-10.5);
    // In saturation the inputs are no longer equal: the loop has lost control.
    expect(Math.abs(drive(3).nodes.m)).toBeGreaterThan(0.1);
  });

  it('a missing positive rail leaves the output stuck low whatever the input asks', () => {
    // Common practice (REFERENCES.md): an output stuck at a rail means a missing supply.
    for (const vin of [-1, 0, 1]) {
      const s = solveDC(
        circuit([V('vn', 'vn', '0', -12), V('vin', 'in', '0', vin), R('ri', 'in', 'm', 10e3), R('rf', 'm', 'out', 100e3), OPAMP('u1', '0', 'm', 'out', 'vp_pin', 'vn')]),
      );
      expect(s.nodes.out).toBeLessThan(-10);
      expect(Number.isFinite(s.nodes.vp_pin)).toBe(true);
    }
  });

  it('reversed or equal supplies keep everything finite and inside the pins', () => {
    for (const [p, n] of [[-12, 12], [5, 5], [0, 0]]) {
      const s = solveDC(
        circuit([V('vp', 'vp', '0', p), V('vn', 'vn', '0', n), V('vin', 'in', '0', 0.3), R('ri', 'in', 'm', 10e3), R('rf', 'm', 'out', 100e3), OPAMP('u1', '0', 'm', 'out', 'vp', 'vn')]),
      );
      expect(Number.isFinite(s.nodes.out)).toBe(true);
      expect(s.nodes.out).toBeGreaterThanOrEqual(Math.min(p, n) - 0.5);
      expect(s.nodes.out).toBeLessThanOrEqual(Math.max(p, n) + 0.5);
    }
  });

  it('draws its quiescent current from V+ to V−', () => {
    // REFERENCES.md: TL072 supply current 1.4 mA typical per amplifier.
    const s = solveDC(circuit([...rails, OPAMP('u1', '0', 'out', 'out', 'vp', 'vn')]));
    expect(s.sourceCurrents.vp).toBeCloseTo(-1.4e-3, 6);
    expect(s.sourceCurrents.vn).toBeCloseTo(1.4e-3, 6);
    expect(s.nodes.out).toBeCloseTo(0, 4); // a follower at rest sits near 0 V (common practice)
  });
});
