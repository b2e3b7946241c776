import type { Board } from '../schemas/board.js';
import { buildCircuit, DEFAULT_OHMMETER, findCondition, METER_NODE, ohmmeterReading, readResistance, solvePatiently, testPointsFor } from '../board/index.js';
import { createDcSolver, GROUND, type DcSolution } from '../circuit/index.js';
import { isSolverFailure, plainNewton } from './newton-attempt.js';

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
      const start = Float64Array.from(solver.compiled.unknownNames, (name) => {
        const v = from.unknowns?.[name] ?? from.nodes[name];
        return typeof v === 'number' && Number.isFinite(v) ? v : 0;
      });
      if (plainNewton(solver, start)) {
        const { nodeIndex } = solver.compiled;
        const v = (node: string) => {
          const i = node === GROUND ? undefined : nodeIndex.get(node);
          return i === undefined ? 0 : solver.x[i];
        };
        readings[tp.id] = ohmmeterReading(v(METER_NODE), v(netNode(tp.net)), v(netNode(tp.refNet ?? faulty.ground)), DEFAULT_OHMMETER);
        continue;
      }
    }
    readings[tp.id] = readResistance(faulty, tp, netNode, solvePatiently(circuit));
  }
  return readings;
}
