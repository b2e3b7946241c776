import { describe, expect, it } from 'vitest';
import { bundledBoardFiles, loadBoard } from '../../src/board/index.js';
import { buildDictionary, restrictDictionary } from '../../src/diagnosis/index.js';

describe('restrictDictionary', () => {
  const file = bundledBoardFiles().find((f) => f.endsWith('wenlow-nib.json'))!;
  const board = loadBoard(file);
  const ids = board.conditions.map((c) => c.id);
  const pick = [ids[3], ids[0], ids[1]];

  // With and without the board's first powered condition, from which faults that plain Newton
  // cannot settle elsewhere start again.
  it.each([[pick], [[ids[4], ids[2]]]])('gives what a dictionary built for %j alone predicts, in the order asked', (pick) => {
    const whole = buildDictionary(board);
    const alone = buildDictionary(board, { conditions: pick });
    const cut = restrictDictionary(whole, pick);
    expect(cut.observables).toEqual(alone.observables);
    expect(cut.hypotheses.map((h) => [h.id, h.prior])).toEqual(alone.hypotheses.map((h) => [h.id, h.prior]));
    expect(cut.skippedConditions).toEqual(alone.skippedConditions);
    expect([...cut.unsettled]).toEqual([...alone.unsettled]);
    cut.hypotheses.forEach((h, i) => {
      const other = alone.hypotheses[i];
      expect(h.variants?.length).toBe(other.variants?.length);
      const vectors = [[h.predictions, other.predictions], ...(h.variants ?? []).map((v, k) => [v, other.variants![k]])];
      for (const [a, b] of vectors) {
        a.forEach((v, j) => {
          // Opens (Infinity) and unsettled circuits (NaN) must match exactly; numbers to well
          // inside the solver's own tolerance (reltol 1e-3): no condition's solves start from
          // another condition that only one of the two builds has.
          if (!Number.isFinite(v) || !Number.isFinite(b[j])) expect(v, `${h.id} ${j}`).toBe(b[j]);
          else expect(Math.abs(v - b[j]), `${h.id} ${j}`).toBeLessThanOrEqual(1e-5 * Math.abs(b[j]) + 1e-7);
        });
      }
    });
  }, 300_000);

  it('hands back the same object for the same conditions, so rankings of one walk share it', () => {
    const whole = buildDictionary(board);
    expect(restrictDictionary(whole, pick)).toBe(restrictDictionary(whole, pick));
    expect(restrictDictionary(whole, [pick[0]])).not.toBe(restrictDictionary(whole, pick));
    expect(restrictDictionary(whole, [pick[0]]).observables.every((o) => o.condition === pick[0])).toBe(true);
  }, 300_000);
});
