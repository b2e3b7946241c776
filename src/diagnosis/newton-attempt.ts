import type { DcSolver } from '../circuit/index.js';
import type { NodeVolts } from '../board/index.js';
import { isSolverFailure } from '../circuit/errors.js';


/**
 * Newton iterations allowed from a fault's operating point in another condition of the same board.
 * Conditions differ by a knob or a test signal, so the fault's own point elsewhere is usually a few
 * iterations away; when it is not, the walk and gmin stepping follow, and a longer try costs more
 * than it saves (demo board: 40 settles all but a few per cent of those that settle at all).
 */
export const ELSEWHERE_ITERATIONS = 40;

/** Plain Newton from `start` (no gmin or source stepping); whether it settled (answer in solver.x). */
export function plainNewton(solver: DcSolver, start: Float64Array | undefined, maxIterations?: number): boolean {
  try {
    solver.solveLean({ ...(start ? { start } : {}), skip: ['gmin', 'source'], ...(maxIterations ? { maxIterations } : {}) });
    return true;
  } catch (error) {
    if (!isSolverFailure(error)) throw error;
    return false;
  }
}

/** The node voltages of a solver's unknown vector (the last answer by default), for the meter readings. */
export function solverVolts(solver: DcSolver, x: Float64Array = solver.x): NodeVolts {
  const { nodeIndex } = solver.compiled;
  return (node) => {
    const i = nodeIndex.get(node);
    return i === undefined ? 0 : x[i];
  };
}

/** The solver's unknowns by name. */
export function unknownsByName(solver: DcSolver, x: Float64Array = solver.x): Record<string, number> {
  const out: Record<string, number> = {};
  solver.compiled.unknownNames.forEach((name, i) => (out[name] = x[i]));
  return out;
}

/** A start vector in the solver's order: `over` where it has a finite value, else `base`. */
export function startOver(solver: DcSolver, base: Float64Array, over: Record<string, number>): Float64Array {
  const start = base.slice();
  solver.compiled.unknownNames.forEach((name, i) => {
    const v = over[name];
    if (typeof v === 'number' && Number.isFinite(v)) start[i] = v;
  });
  return start;
}
