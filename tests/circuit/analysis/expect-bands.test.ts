import { describe, expect, it } from 'vitest';
import { boardEvaluator, expectBands, monteCarlo, worstCase, type Band } from '../../../src/circuit/analysis/index.js';
import { UserInputError } from '../../../src/errors.js';
import { smallBoard } from './fixtures/small-board.js';

const find = (bands: Band[], id: string, condition = 'quiescent') => bands.find((b) => b.id === id && b.condition === condition)!;

describe('expectBands on a small board', () => {
  const board = smallBoard();
  const bands = expectBands(board, { samples: 300, seed: 1 });

  it('gives a ±1 % divider the closed-form corners (textbook divider, both resistors at opposite ends)', () => {
    const tp1 = find(bands, 'TP1');
    const div = (r1: number, r2: number) => (12 * r2) / (r1 + r2);
    expect(tp1.nominal).toBeCloseTo(div(10_000, 4_700), 6);
    expect(tp1.max).toBeCloseTo(div(9_900, 4_747), 6);
    expect(tp1.min).toBeCloseTo(div(10_100, 4_653), 6);
    expect(tp1).toMatchObject({ node: 'div1', unit: 'V' });
    expect(tp1.mcLow!).toBeGreaterThan(tp1.min);
    expect(tp1.mcHigh!).toBeLessThan(tp1.max);
  });

  it("widens a follower's band by the op-amp's offset (TL072 ±10 mV max, ST datasheet)", () => {
    const tp1 = find(bands, 'TP1');
    const tp2 = find(bands, 'TP2');
    expect(tp2.max - tp1.max).toBeCloseTo(0.01, 4);
    expect(tp1.min - tp2.min).toBeCloseTo(0.01, 4);
  });

  it('reads an unpowered resistance test point as the parallel paths to ground (R1+R2 ∥ R9+R10)', () => {
    const tp6 = find(bands, 'TP6', 'unpowered');
    const par = (a: number, b: number) => (a * b) / (a + b);
    expect(tp6.unit).toBe('Ω');
    expect(tp6.nominal / par(14_700, 110_000)).toBeCloseTo(1, 4);
    // every path is ±1 % resistors, so the reading moves by about ±1 %
    expect(tp6.max / tp6.nominal).toBeCloseTo(1.01, 3);
  });

  it('is reproducible for a seed; another seed moves the Monte Carlo interval slightly', () => {
    const again = expectBands(board, { samples: 300, seed: 1, condition: 'quiescent' });
    const other = expectBands(board, { samples: 300, seed: 2, condition: 'quiescent' });
    const a = find(bands, 'TP4');
    expect(find(again, 'TP4')).toEqual(a);
    const b = find(other, 'TP4');
    expect(b.mcLow).not.toBe(a.mcLow);
    expect(Math.abs(b.mcLow! - a.mcLow!)).toBeLessThan(0.2 * (a.mcHigh! - a.mcLow!));
    expect(b.nominal).toBe(a.nominal);
  });

  it('answers for one condition only when asked', () => {
    const one = expectBands(board, { samples: 0, condition: 'release-max' });
    expect(new Set(one.map((b) => b.condition))).toEqual(new Set(['release-max']));
    expect(one[0].mcLow).toBeUndefined();
  });

  it('refuses an unknown condition with the accepted ids', () => {
    expect(() => expectBands(board, { condition: 'loud' })).toThrow(UserInputError);
    expect(() => expectBands(board, { condition: 'loud' })).toThrow(/quiescent, release-max, unpowered/);
  });
});

describe('worst case contains Monte Carlo on a board', () => {
  it('holds for every test point of every condition, transistor stage included', () => {
    const board = smallBoard();
    const ev = boardEvaluator(board, board.conditions.map((c) => c.id));
    const mc = monteCarlo(ev.deviations.map((d) => d.distribution), ev.evaluate, { samples: 400, seed: 3 });
    for (const pc of ev.perCondition) {
      const wc = worstCase(ev.deviations.length, pc.evaluate);
      pc.outputs.forEach((o, k) => {
        const slack = 1e-6 * (1 + Math.abs(wc.nominal[k]));
        expect(mc.min[o]).toBeGreaterThanOrEqual(wc.min[k] - slack);
        expect(mc.max[o]).toBeLessThanOrEqual(wc.max[k] + slack);
      });
    }
    // the transistor's collector really spreads (hFE 100–300 through a 100 kΩ bias divider)
    const tp4 = ev.outputs.findIndex((o) => o.testPoint === 'TP4');
    expect(mc.max[tp4] - mc.min[tp4]).toBeGreaterThan(0.2);
  });
});

describe('a substituted part', () => {
  it('moves the bands it feeds and only those', () => {
    const board = smallBoard();
    const base = expectBands(board, { samples: 200, seed: 4, condition: 'quiescent' });
    const subbed = expectBands(board, { samples: 200, seed: 4, condition: 'quiescent', substitutions: { R1: '22k' } });
    // R1 feeds the divider, its buffer and the detector behind the buffer
    for (const id of ['TP1', 'TP2', 'TP5']) expect(Math.abs(find(subbed, id).nominal - find(base, id).nominal)).toBeGreaterThan(0.5);
    // 12·4.7/(22 + 4.7) (textbook divider)
    expect(find(subbed, 'TP1').nominal).toBeCloseTo((12 * 4.7) / 26.7, 6);
    // the other rail's divider, the transistor stage and the makeup stage share no part with R1
    for (const id of ['TP3', 'TP4', 'TP7']) {
      const a = find(base, id);
      const b = find(subbed, id);
      // equal to solver precision (the joint Newton solve may take a different number of steps)
      for (const key of ['nominal', 'min', 'max', 'mcLow', 'mcHigh'] as const) expect(Math.abs(b[key]! - a[key]!)).toBeLessThan(1e-7 * (1 + Math.abs(a[key]!)));
    }
  });
});
