import { describe, expect, it } from 'vitest';
import { buildCircuit, DEMO_BOARD_FILE, loadBoard, measureAll, testPointsFor } from '../../src/board/index.js';
import { ConvergenceError, createDcSolver, solveDC, type DcSolution } from '../../src/circuit/index.js';
import { applyFault, buildDictionary, faultsFor } from '../../src/diagnosis/index.js';
import { createValueFaultSolver, faultedResistance } from '../../src/diagnosis/value-fault-solver.js';
import { SHORT_OHMS } from '../../src/diagnosis/board-edits.js';
import type { Fault } from '../../src/diagnosis/fault.js';

/**
 * The in-place path must predict what the full rebuild predicts: measureAll on applyFault's board,
 * warm-started from the healthy operating point as the dictionary does. Agreement is asked to
 * 1e-6 relative or 1 µV (SPICE's vntol, common practice), the two paths being the same circuit up to
 * how Newton's last step lands; an overload (Infinity) must be an overload on both.
 */
const close = (fast: number, full: number) => {
  if (!Number.isFinite(full) || !Number.isFinite(fast)) return fast === full;
  return Math.abs(fast - full) <= Math.max(1e-6 * Math.abs(full), 1e-6);
};
/**
 * A fault plain Newton cannot reach from the healthy point is settled by a walk of the resistor in
 * place and by gmin stepping on the rebuild: two routes to the same operating point, each stopping
 * anywhere within the solver's tolerance, so they are asked to agree within twice SPICE's default
 * RELTOL (1e-3) and VNTOL (1 µV) (common practice).
 */
const withinTolerance = (fast: number, full: number) => {
  if (!Number.isFinite(full) || !Number.isFinite(fast)) return fast === full;
  return Math.abs(fast - full) <= 2 * (1e-3 * Math.max(Math.abs(fast), Math.abs(full)) + 1e-6);
};
/** Whether plain Newton from the healthy point settles the rebuilt faulty board (no gmin or source stepping). */
function plainNewtonSettles(faulty: ReturnType<typeof applyFault>, condition: string, initial: DcSolution | undefined): boolean {
  try {
    createDcSolver(buildCircuit(faulty, condition).circuit).solve({ initial, skip: ['gmin', 'source'] });
    return true;
  } catch (error) {
    if (error instanceof ConvergenceError) return false;
    throw error;
  }
}

describe('faultedResistance', () => {
  const fault = (mode: Fault['mode'], value?: number): Fault => ({ id: `R1/${mode}`, part: 'R1', kind: 'resistor', mode, fault: mode, prior: 1, value });
  it('a short is SHORT_OHMS in parallel, a wrong value the value fitted', () => {
    // 10 kΩ ∥ 0.1 Ω = 1e3 / 10000.1 Ω (parallel resistances, textbook).
    expect(faultedResistance(fault('short'), 10e3)).toBeCloseTo(1e3 / 10000.1, 15);
    expect(faultedResistance(fault('short'), 10e3)! < SHORT_OHMS).toBe(true);
    expect(faultedResistance(fault('wrong-value', 4.7e3), 10e3)).toBe(4.7e3);
  });
  it('leaves every fault that is not a resistor value change to the full path', () => {
    // An open adds a node of its own (see faultedResistance): not a value change.
    expect(faultedResistance(fault('open'), 10e3)).toBeUndefined();
    expect(faultedResistance({ ...fault('short'), kind: 'diode' }, 10e3)).toBeUndefined();
    expect(faultedResistance({ ...fault('wiper-open'), kind: 'pot' }, 10e3)).toBeUndefined();
    expect(faultedResistance({ ...fault('reversed'), kind: 'npn' }, 10e3)).toBeUndefined();
  });
});

describe('value faults on the demo board: in place vs rebuilt', () => {
  const board = loadBoard(DEMO_BOARD_FILE);
  const valueFaults = faultsFor(board).filter((f) => faultedResistance(f, 1) !== undefined);

  for (const condition of ['unpowered', 'quiescent', 'dc-above-ratio-max']) {
    it(`every resistor short and misread value agrees in ${condition}`, () => {
      const solver = createValueFaultSolver(board, condition, { asMeasured: true })!;
      expect(solver).toBeDefined();
      // The dictionary's solver, starting each fault from the healthy plans and point, within the tolerance.
      const quick = createValueFaultSolver(board, condition)!;
      const powered = board.conditions.find((c) => c.id === condition)!.powered;
      const initial = powered ? solveDC(buildCircuit(board, condition).circuit) : undefined;
      const points = testPointsFor(board, condition);
      let handled = 0;
      const mismatches: string[] = [];
      for (const fault of valueFaults) {
        const fast = solver.predict(fault);
        if (!fast) continue;
        handled++;
        const faulty = applyFault(board, fault);
        const full = measureAll(faulty, condition, { initial });
        const agree = plainNewtonSettles(faulty, condition, initial) ? close : withinTolerance;
        const kept = quick.predict(fault);
        points.forEach((tp, k) => {
          if (!agree(fast[k], full[tp.id])) mismatches.push(`${fault.id} ${tp.id}: ${fast[k]} vs ${full[tp.id]}`);
          if (kept && !withinTolerance(kept[k], full[tp.id])) mismatches.push(`${fault.id} ${tp.id} (from healthy): ${kept[k]} vs ${full[tp.id]}`);
        });
      }
      expect(mismatches).toEqual([]);
      // Nearly every value fault must take the quick path, or the comparison above proves little.
      expect(handled).toBeGreaterThanOrEqual(Math.ceil(0.95 * valueFaults.length));
    }, 120_000);
  }

  it('the dictionary holds the same predictions either way, within the tolerance', () => {
    const faults = valueFaults.filter((_, i) => i % 17 === 0);
    const conditions = ['unpowered', 'quiescent'];
    const dict = buildDictionary(board, { faults, conditions, bands: [] });
    const initial = solveDC(buildCircuit(board, 'quiescent').circuit);
    faults.forEach((fault, i) => {
      const h = dict.hypotheses[i + 1];
      expect(h.id).toBe(fault.id);
      for (const condition of conditions) {
        const faulty = applyFault(board, fault);
        const warm = condition === 'quiescent' ? initial : undefined;
        const full = measureAll(faulty, condition, { initial: warm });
        // The dictionary starts each fault from the healthy plans and point, not as measureAll does.
        dict.observables.forEach((o, j) => {
          if (o.condition === condition) expect(withinTolerance(h.predictions[j], full[o.testPoint]), `${fault.id} ${o.testPoint}`).toBe(true);
        });
      }
    });
  }, 60_000);
});
