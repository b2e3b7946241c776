import type { DcSolver } from '../circuit/index.js';
import { isSolverFailure } from '../circuit/errors.js';

/**
 * Continuation in the fault itself. A faulty board is one change away from a healthy board whose
 * operating point is known; when plain Newton cannot reach the faulty point from the healthy one,
 * the changed element is walked from (nearly) its healthy value to its faulted value in geometric
 * steps, each solve starting from the last answer. Only the last step's answer is kept, and it is
 * solved at exactly the faulted value, so it is an operating point of the faulty circuit itself.
 *
 * Gmin stepping, the solver's own fallback, puts a large conductance on every node and takes it
 * away again, so most of its steps move the whole board; the walk only moves what the fault moves,
 * and the steps far from the circuit's own impedances settle at once.
 */

/**
 * Step control, tuned on the demo board's value and link faults with the walk as the only step
 * between plain Newton and gmin stepping (Newton iterations after a failed plain Newton, all 13
 * powered conditions: 106k with gmin stepping alone, 86k with these figures; doubling steps, a
 * 1-decade first step or 40 iterations per step each did worse).
 */
/** First step, in decades of the walked value. */
const FIRST_STEP_DECADES = 0.25;
/** A step that settles within this many iterations lets the next one be GROW times as long. */
const EASY_ITERATIONS = 3;
const GROW = 1.5;
/** A step that does not settle is tried again SHRINK times shorter... */
const SHRINK = 8;
/** ...unless this many steps have failed already: the fault is then left to gmin stepping. */
const MAX_FAILED_STEPS = 3;
/** Newton iterations allowed per step: a step that needs more is better split. */
const STEP_ITERATIONS = 30;
/** Below this step (decades) the walk gives up too. */
const SMALLEST_STEP_DECADES = 1 / 64;

export interface WalkOutcome {
  settled: boolean;
  /** Newton iterations of the steps that settled. */
  iterations: number;
  /** Steps that settled, and steps that did not (each followed by a shorter one, or the end). */
  steps: number;
  failedSteps: number;
}

/**
 * Walks an element's value from `from` to `to` (both > 0, ohms or whatever `set` takes), starting
 * from `start`, an operating point at `from` or near it. On success the answer at `to` is in
 * solver.x; on failure solver.x is unspecified and the element is left at some value between the
 * two (the caller sets it back).
 */
export function walkValue(solver: DcSolver, set: (value: number) => void, from: number, to: number, start: Float64Array): WalkOutcome {
  const logFrom = Math.log10(from);
  const span = Math.log10(to) - logFrom;
  const current = Float64Array.from(start);
  const outcome: WalkOutcome = { settled: false, iterations: 0, steps: 0, failedSteps: 0 };
  if (span === 0) return walkStep(solver, set, to, current, outcome) ? { ...outcome, settled: true } : outcome;
  let at = 0;
  let step = FIRST_STEP_DECADES / Math.abs(span);
  const smallest = SMALLEST_STEP_DECADES / Math.abs(span);
  while (at < 1) {
    const next = Math.min(1, at + step);
    const value = next === 1 ? to : 10 ** (logFrom + span * next);
    const before = outcome.iterations;
    if (walkStep(solver, set, value, current, outcome)) {
      at = next;
      current.set(solver.x);
      if (outcome.iterations - before <= EASY_ITERATIONS) step *= GROW;
    } else {
      step /= SHRINK;
      if (step < smallest || outcome.failedSteps >= MAX_FAILED_STEPS) return outcome;
    }
  }
  outcome.settled = true;
  return outcome;
}

function walkStep(solver: DcSolver, set: (value: number) => void, value: number, start: Float64Array, outcome: WalkOutcome): boolean {
  set(value);
  try {
    const result = solver.solveLean({ start, skip: ['gmin', 'source'], maxIterations: STEP_ITERATIONS });
    outcome.iterations += result.iterations;
    outcome.steps++;
    return true;
  } catch (error) {
    if (!isSolverFailure(error)) throw error;
    outcome.failedSteps++;
    return false;
  }
}
