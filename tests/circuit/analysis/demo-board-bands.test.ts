import { describe, expect, it } from 'vitest';
import { DEMO_BOARD_FILE, loadBoard } from '../../../src/board/index.js';
import { boardEvaluator, detectorTimes, monteCarlo, worstCase } from '../../../src/circuit/analysis/index.js';
import { createRng } from '../../../src/circuit/analysis/prng.js';
import { drawDeviation } from '../../../src/circuit/analysis/deviation.js';

describe('bands on the bundled demo board', () => {
  const board = loadBoard(DEMO_BOARD_FILE);

  it('worst case contains every Monte Carlo board at every quiescent test point', () => {
    const ev = boardEvaluator(board, ['quiescent']);
    const [pc] = ev.perCondition;
    const wc = worstCase(ev.deviations.length, pc.evaluate);
    const mc = monteCarlo(ev.deviations.map((d) => d.distribution), ev.evaluate, { samples: 200, seed: 1 });
    const outside: string[] = [];
    pc.outputs.forEach((o, k) => {
      const slack = 1e-6 * (1 + Math.abs(wc.nominal[k]));
      if (mc.min[o] < wc.min[k] - slack || mc.max[o] > wc.max[k] + slack) outside.push(ev.outputs[o].testPoint);
    });
    expect(outside).toEqual([]);
    expect(wc.failures + mc.failures).toBe(0);
  }, 300_000);

  it('samples started from their predicted operating point settle where samples started from nominal do', () => {
    // The hardest conditions for the prediction: a precision rectifier resting between its diodes
    // (quiescent) and meter comparators near their thresholds (input-gain-max).
    const conditions = ['quiescent', 'input-gain-max'];
    const plain = boardEvaluator(board, conditions);
    const predicted = boardEvaluator(board, conditions);
    predicted.predictStarts();
    const rng = createRng(7);
    for (let k = 0; k < 40; k++) {
      const u = Float64Array.from(plain.deviations, (d) => drawDeviation(d.distribution, rng));
      const a = plain.evaluate(u);
      const b = predicted.evaluate(u);
      // Newton stops within reltol 1e-3 of the step (vntol 1 µV): two starts may land that far apart.
      a.forEach((v, j) => expect(Math.abs(v - b[j]), `${plain.outputs[j].condition} ${plain.outputs[j].testPoint}`).toBeLessThanOrEqual(2e-3 * Math.abs(v) + 1e-4));
    }
  }, 300_000);

  it("a sample's readings do not depend on the samples solved before it", () => {
    const ev = boardEvaluator(board, ['quiescent', 'input-gain-max']);
    ev.predictStarts();
    const rng = createRng(3);
    const us = Array.from({ length: 12 }, () => Float64Array.from(ev.deviations, (d) => drawDeviation(d.distribution, rng)));
    const forward = us.map((u) => ev.evaluate(u));
    const backward = [...us].reverse().map((u) => ev.evaluate(u)).reverse();
    forward.forEach((y, k) => expect([...backward[k]]).toEqual([...y]));
  }, 300_000);

  it('a sample no warm start settles is solved from zero, not lost', () => {
    // Seed 1's sample 626 under dc-above settles from neither its predicted start, the offset
    // seed, nor a 4-step continuation from nominal (6 solves); the start from zero reaches it.
    const ev = boardEvaluator(board, ['dc-above']);
    ev.predictStarts();
    const rng = createRng(1);
    let u = new Float64Array(0);
    for (let k = 0; k <= 626; k++) u = Float64Array.from(ev.deviations, (d) => drawDeviation(d.distribution, rng));
    const before = ev.solves();
    const y = ev.evaluate(u);
    expect(ev.solves() - before).toBe(7);
    expect([...y].filter((v) => !Number.isFinite(v))).toEqual([]);
    // The board it reached is a neighbour of the healthy one: every reading within 2 V of nominal.
    const nominal = ev.evaluate(new Float64Array(ev.deviations.length));
    y.forEach((v, j) => expect(Math.abs(v - nominal[j]), ev.outputs[j].testPoint).toBeLessThan(2));
  }, 300_000);

  it('gives attack and release times from the roles at mid-rotation', () => {
    const t = detectorTimes(board, 'quiescent');
    // τ = R·C and the 10–90 % time τ·ln 9 (first-order step response, textbook)
    expect(t.attack.tau).toBeCloseTo(t.attack.resistance * t.attack.capacitance, 15);
    expect(t.release.riseTime).toBeCloseTo(t.release.tau * Math.log(9), 12);
    expect(t.release.tau).toBeGreaterThan(t.attack.tau);
  });
});
