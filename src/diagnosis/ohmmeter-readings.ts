import type { Board } from '../schemas/board.js';
import { buildCircuit, findCondition, readResistance, resistanceReading, solvePatiently, testPointsFor } from '../board/index.js';
import { createDcSolver, warmStartVector, type DcSolution } from '../circuit/index.js';
import { isSolverFailure } from '../circuit/errors.js';
import { plainNewton, solverVolts } from './newton-attempt.js';

/**
 * The healthy board's ohmmeter circuits of an unpowered condition, solved: per resistance test
 * point, the operating point with the meter on it, as measureAll solves it. A test point whose
 * circuit does not settle has none (its faults are then solved from zero).
 */
export function healthyOhmmeterPoints(board: Board, conditionId: string): Map<string, DcSolution> {
  const points = new Map<string, DcSolution>();
  for (const tp of testPointsFor(board, conditionId)) {
    try {
      points.set(tp.id, solvePatiently(buildCircuit(board, conditionId, { ohmmeter: { testPoint: tp.id } }).circuit));
    } catch (error) {
      if (!isSolverFailure(error)) throw error;
    }
  }
  return points;
}

/**
 * What measureAll reads on a faulty board in an unpowered condition, each ohmmeter circuit started
 * from the healthy board's operating point with the meter on the same test point instead of from
 * zero: an ohmmeter's few volts through the board's junctions take ≈24 Newton iterations from
 * zero, and a single fault moves most nodes little. Where plain Newton from there fails (or the
 * healthy point is missing), the circuit is solved as measureAll solves it, from zero with its
 * fallbacks. Unpowered, the circuit has no op-amps and no feedback, one operating point, so the two
 * starts land on it alike, within the solver's tolerance.
 */
export function faultyOhmmeterReadings(faulty: Board, conditionId: string, healthy: Map<string, DcSolution>): Record<string, number> {
  const condition = findCondition(faulty, conditionId);
  const readings: Record<string, number> = {};
  for (const tp of testPointsFor(faulty, condition)) {
    const { circuit, netNode } = buildCircuit(faulty, condition.id, { ohmmeter: { testPoint: tp.id } });
    const from = healthy.get(tp.id);
    if (from) {
      const solver = createDcSolver(circuit);
      const start = warmStartVector(solver.compiled.unknownNames, from);
      if (plainNewton(solver, start)) {
        readings[tp.id] = resistanceReading(faulty, tp, netNode, solverVolts(solver));
        continue;
      }
    }
    readings[tp.id] = readResistance(faulty, tp, netNode, solvePatiently(circuit));
  }
  return readings;
}
