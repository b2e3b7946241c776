import { describe, expect, it } from 'vitest';
import { buildCircuit, DEMO_BOARD_FILE, loadBoard } from '../../src/board/index.js';
import { createDcSolver } from '../../src/circuit/index.js';
import { ConditionSolvers } from '../../src/diagnosis/condition-solvers.js';

describe('one compiled solver for conditions that differ in knob positions and volts', () => {
  const board = loadBoard(DEMO_BOARD_FILE);

  it('solves each condition exactly as a solver compiled from that condition does', () => {
    const solvers = new ConditionSolvers(board);
    // dc-below, dc-above and the ratio knob at either end: one switch position, one signal net.
    const conditions = ['dc-below', 'dc-above', 'dc-above-ratio-max', 'dc-above-ratio-min', 'dc-below'];
    const handedOut = conditions.map((c) => solvers.solverFor(c, buildCircuit(board, c)));
    expect(new Set(handedOut).size).toBe(1);
    for (const condition of conditions) {
      const built = buildCircuit(board, condition);
      const reused = solvers.solverFor(condition, built);
      reused.solveLean();
      const fresh = createDcSolver(built.circuit);
      fresh.solveLean();
      // Same values written, same empty plan list, same start: the same arithmetic, bit for bit.
      expect(Array.from(reused.x), condition).toEqual(Array.from(fresh.x));
    }
  });

  it('compiles apart a condition whose netlist differs (no test signal, another switch position)', () => {
    const solvers = new ConditionSolvers(board);
    const withSignal = solvers.solverFor('dc-below', buildCircuit(board, 'dc-below'));
    expect(solvers.solverFor('quiescent', buildCircuit(board, 'quiescent'))).not.toBe(withSignal);
    expect(solvers.solverFor('sidechain-hp', buildCircuit(board, 'sidechain-hp'))).not.toBe(withSignal);
  });
});
