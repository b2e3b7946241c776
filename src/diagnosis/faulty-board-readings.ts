import type { Board } from '../schemas/board.js';
import { buildCircuit, findCondition, measureAll, readVoltage, solveFallbacks, testPointsFor, voltageReading, type BuiltCircuit } from '../board/index.js';
import { ConvergenceError, createDcSolver, warmStartVector, type DcSolution, type DcSolver } from '../circuit/index.js';
import { ELSEWHERE_ITERATIONS, plainNewton, solverVolts, startOver, unknownsByName } from './newton-attempt.js';
import type { FaultLink } from './apply-fault.js';
import { walkValue } from './value-walk.js';
import type { ConditionSolvers } from './condition-solvers.js';

export interface FaultyReadings {
  readings: Record<string, number>;
  /** The operating point they come from, by unknown name (powered conditions only). */
  unknowns?: Record<string, number>;
  /** The pivot plans the solve left, and the matrix pattern they fit (powered conditions only). */
  plans?: SavedPlans;
  /** Whether plain Newton from the healthy point settled it (powered conditions only). */
  fromHealthy?: boolean;
}

export interface SavedPlans {
  pattern: Uint8Array;
  list: ReturnType<DcSolver['engine']['lu']['savePlans']>;
}

/**
 * The readings of a faulty board in one condition, as measureAll gives them warm-started from the
 * healthy operating point, except where plain Newton from there fails. measureAll then steps gmin
 * from the healthy point (≈130 iterations a circuit on the demo board); here, first:
 *  1. Newton from `elsewhere()`, the fault's own operating point under another condition (a knob
 *     or a test signal apart, so usually a few iterations away), for at most ELSEWHERE_ITERATIONS;
 *     asked for only here, as it may take a solve;
 *  2. when the fault is one added resistor (`link`), that resistor walked in from a value at which
 *     the board is as good as healthy (value-walk.ts).
 * Then, if neither settles, measureAll's way: gmin and source stepping from the healthy point with
 * the pivot plans plain Newton left, then its fallback options from zero. Plain Newton runs first
 * and alone, so every circuit it settles lands where measureAll's does, and a fault settles here
 * whenever measureAll settles it. ConvergenceError when nothing settles.
 * `startPlans`, pivot plans a solve of the same matrix pattern left (the same fault under another
 * condition), spare planning the first factorisations again; they change the rounding of each
 * step, so the answer moves within the solver's tolerance (exactly measureAll's without them).
 * `solvers` hands out one compiled solver for conditions alike but for knob positions and volts.
 * `elsewhereFirst` tries `elsewhere()` before plain Newton from the healthy point, for a fault that
 * plain Newton did not settle under that other condition either: it mostly fails again here, after
 * ≈60 iterations (demo board: 14 % of the dictionary's iterations saved); where both would settle,
 * the two starts land within the tolerance of each other.
 * Unpowered, or with no healthy point, it is measureAll itself.
 */
export function faultyBoardReadings(
  faulty: Board,
  conditionId: string,
  warm: DcSolution | undefined,
  link: FaultLink | undefined,
  built?: BuiltCircuit,
  elsewhere?: () => Record<string, number> | undefined,
  startPlans?: SavedPlans,
  solvers?: ConditionSolvers,
  elsewhereFirst = false,
): FaultyReadings {
  const condition = findCondition(faulty, conditionId);
  if (!condition.powered || !warm) return { readings: measureAll(faulty, conditionId, { initial: warm }) };
  const circuitBuilt = built ?? buildCircuit(faulty, condition.id);
  const { circuit, netNode, partElements } = circuitBuilt;
  const points = testPointsFor(faulty, condition);
  const solver = solvers ? solvers.solverFor(condition.id, circuitBuilt) : createDcSolver(circuit);
  if (startPlans && samePattern(startPlans.pattern, solver.compiled.pattern)) solver.engine.lu.restorePlans(startPlans.list);
  const settledAt = (x: Float64Array, fromHealthy = false): FaultyReadings => ({
    readings: Object.fromEntries(points.map((tp) => [tp.id, voltageReading(faulty, tp, netNode, solverVolts(solver, x))])),
    unknowns: unknownsByName(solver, x),
    plans: { pattern: solver.compiled.pattern, list: solver.engine.lu.savePlans() },
    fromHealthy,
  });
  // The same start solve({ initial: warm }) takes, so plain Newton lands where measureAll's does.
  const start = warmStartVector(solver.compiled.unknownNames, warm);
  const other = elsewhereFirst ? elsewhere?.() : undefined;
  if (other && plainNewton(solver, startOver(solver, start, other), ELSEWHERE_ITERATIONS)) return settledAt(solver.x);
  // solveLean is solve() without the DcSolution: the same start, strategy and convergence test.
  if (plainNewton(solver, start)) return settledAt(solver.x, true);
  const plans = solver.engine.lu.savePlans();
  const again = elsewhereFirst ? undefined : elsewhere?.();
  if (again && plainNewton(solver, startOver(solver, start, again), ELSEWHERE_ITERATIONS)) return settledAt(solver.x);
  const [element] = link ? (partElements[link.ref] ?? []) : [];
  if (link && element !== undefined) {
    const set = solver.valueSetter(element, 'value');
    const walked = walkValue(solver, set, link.nearHealthyOhms, link.ohms, openedAtItsNet(solver, start, link, netNode)).settled;
    set(link.ohms);
    if (walked) return settledAt(solver.x);
  }
  solver.engine.lu.restorePlans(plans);
  try {
    solver.solve({ initial: warm, skip: ['newton'] });
    return settledAt(solver.x);
  } catch (error) {
    if (!(error instanceof ConvergenceError)) throw error;
    // measureAll's own fallbacks (solvePatiently), each from zero on a fresh solver.
    const s = solveFallbacks(circuit, {}, error);
    return { readings: Object.fromEntries(points.map((tp) => [tp.id, readVoltage(faulty, tp, netNode, s)])) };
  }
}

function samePattern(a: Uint8Array, b: Uint8Array): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/** The walk's start: an opened pin's own node at the voltage of the net it left, as when it was joined. */
function openedAtItsNet(solver: DcSolver, start: Float64Array, link: FaultLink, netNode: (net: string) => string): Float64Array {
  if (!link.opened) return start;
  const { nodeIndex } = solver.compiled;
  const lone = nodeIndex.get(netNode(link.opened[0]));
  const from = nodeIndex.get(netNode(link.opened[1]));
  const out = start.slice();
  if (lone !== undefined) out[lone] = from === undefined ? 0 : start[from];
  return out;
}
