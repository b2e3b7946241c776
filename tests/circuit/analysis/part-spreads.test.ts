import { describe, expect, it } from 'vitest';
import { boardDeviations } from '../../../src/circuit/analysis/part-spreads.js';
import { deviatedValue } from '../../../src/circuit/analysis/deviation.js';
import { smallBoard } from './fixtures/small-board.js';

/** kT/q at 300.15 K: 25.865 mV (REFERENCES.md, CODATA constants). */
const VT_27C = 0.025865;

const byId = (board = smallBoard()) => new Map(boardDeviations(board).map((d) => [d.id, d]));

describe('part spreads from a board', () => {
  it('takes resistor tolerance from the file, else the kind default (±1 % metal film)', () => {
    const d = byId();
    expect(d.get('R3')).toMatchObject({ low: 22_000 * 0.95, nominal: 22_000, high: 22_000 * 1.05, distribution: 'gaussian' });
    expect(d.get('R1')?.high).toBeCloseTo(10_100, 9);
    // pot track: ±20 % default (common practice, src/board/defaults.ts)
    expect(d.get('RV2')?.low).toBeCloseTo(800_000, 6);
    // capacitors do not move a DC operating point and are left out
    expect(d.has('C1')).toBe(false);
  });

  it('gives a 2N3904 the datasheet hFE bin 100–300 about the model BF (MCC datasheet, 10 mA)', () => {
    const q = byId().get('Q1 BF')!;
    expect([q.low, q.nominal, q.high]).toEqual([100, 200, 300]);
    expect(q.distribution).toBe('uniform');
  });

  it('turns a ±25 mV forward-voltage spread into an IS ratio of exp(ΔV/(N·Vt)) (Shockley diode law)', () => {
    const d = byId().get('D1 IS')!;
    // NXP 1N4148 model: IS 4.352 nA, N 1.906 (REFERENCES.md)
    const k = Math.exp(0.025 / (1.906 * VT_27C));
    expect(d.nominal).toBeCloseTo(4.352e-9, 20);
    expect(d.high / d.nominal).toBeCloseTo(k, 9);
    expect(d.nominal / d.low).toBeCloseTo(k, 9);
    // log scale: halfway in u is halfway in forward voltage
    expect(deviatedValue(d, 0.5) / d.nominal).toBeCloseTo(Math.sqrt(k), 9);
  });

  it('gives each amplifier of a TL072 its own offset, ±10 mV max (ST datasheet, commercial grade)', () => {
    const d = byId();
    expect(d.get('U1A vos')).toMatchObject({ low: -0.01, nominal: 0, high: 0.01 });
    expect(d.get('U1B vos')).toBeDefined();
  });

  it("lets the board's models[].spread and opampModels[].vosMax override the defaults", () => {
    const board = smallBoard((b) => ({
      ...b,
      models: { '2N3904': { type: 'NPN', params: { IS: 1e-14, BF: 200 }, spread: { BF: [0.8, 1.2] } } },
      opampModels: { TL072: { vosMax: 0.003 } },
    }));
    const d = byId(board);
    expect(d.get('Q1 BF')).toMatchObject({ low: 160, high: 240 });
    expect(d.get('U1A vos')).toMatchObject({ low: -0.003, high: 0.003 });
  });
});
