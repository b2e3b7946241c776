import { describe, expect, it } from 'vitest';
import { buildCircuit, bundledBoardFiles, loadBoard, measureAll } from '../../src/board/index.js';
import { solveDC } from '../../src/circuit/index.js';
import { applyFault, buildDictionary, distinguishable, faultsFor, meterAccuracy, rankSuspects, type Reading } from '../../src/diagnosis/index.js';

/**
 * On every bundled board, a single injected fault is found: the fault is applied, the meter readings
 * simulated, and the tool takes probes itself (its own suggestions, one condition so the test stays
 * quick) until it is sure or has taken eight. The fault must end in the top 3 with a reason that
 * names a test point and a number. Faults chosen: the first of each listed mode that some reading
 * under that condition can tell apart from every other candidate. Readings carry a meter error.
 */
const MODES = ['open', 'reversed', 'rotated', 'wrong-value'];
const PROBES = 8;

for (const file of bundledBoardFiles()) {
  const board = loadBoard(file);
  const condition = board.roles.conditions.quiescent ?? board.conditions.find((c) => c.powered)!.id;
  describe(`${board.id}: an injected fault ranks in the top 3`, () => {
    const dict = buildDictionary(board, { conditions: [condition] });
    const chosen = MODES.map((mode) =>
      dict.faults.find((f, k) => {
        const h = k + 1;
        if (f.mode !== mode || dict.hypotheses[h].predictions.some(Number.isNaN)) return false;
        return dict.hypotheses.every((_, j) => j === h || distinguishable(dict, h, j));
      }),
    ).filter((f) => f !== undefined);

    it('has faults of several modes to try', () => {
      expect(chosen.length).toBeGreaterThanOrEqual(2);
      expect(faultsFor(board).length).toBeGreaterThan(50);
    });

    for (const fault of chosen) {
      it(`${fault.id}`, () => {
        // Solved from the healthy operating point, as the dictionary is; then a meter error within
        // ±(0.5 % + 2 counts) (common DMM specification) so no reading sits exactly on a prediction.
        const exact = measureAll(applyFault(board, fault), condition, { initial: solveDC(buildCircuit(board, condition).circuit) });
        const truth = Object.fromEntries(Object.entries(exact).map(([tp, v]) => [tp, v + 0.6 * meterAccuracy(v, 'V')]));
        const readings: Reading[] = [];
        let result = rankSuspects(board, readings, { dictionary: dict });
        while (result.next && readings.length < PROBES && (result.groups[0]?.probability ?? 0) < 0.9) {
          readings.push({ testPoint: result.next.testPoint, condition, value: truth[result.next.testPoint] });
          result = rankSuspects(board, readings, { dictionary: dict });
        }
        const top3 = result.suspects.slice(0, 3);
        const found = top3.find((s) => s.id === fault.id);
        expect(found, `top 3: ${top3.map((s) => `${s.id} ${s.probability}`).join(', ')}`).toBeDefined();
        expect(found!.why).toMatch(new RegExp(`TP\\d+ would read -?[\\d.]+ [mkM]?[VΩ] with ${fault.part} `));
      });
    }
  });
}
