import type { Board, TestPoint } from '../schemas/board.js';
import { buildCircuit, type BuiltCircuit, DEFAULT_OHMMETER, METER_NODE, ohmmeterReading, testPointsFor, findCondition } from '../board/index.js';
import { createDcSolver, GROUND, type DcSolver } from '../circuit/index.js';
import { isSolverFailure } from '../circuit/errors.js';
import { SHORT_OHMS } from './board-edits.js';
import type { Fault } from './fault.js';
import { walkValue } from './value-walk.js';
import { ELSEWHERE_ITERATIONS, plainNewton, startOver, unknownsByName } from './newton-attempt.js';

/**
 * Predictions for faults that only change one resistor's value, without rebuilding the circuit.
 *
 * Each circuit of a condition (the powered board, or the unpowered board with the ohmmeter on one
 * test point) is compiled once and solved healthy; a fault writes its resistance into the compiled
 * element, solves, and the healthy value is written back. The matrix pattern and LU plan never
 * depend on values, so each fault pays only for its Newton iterations.
 *
 * Each solve starts from the healthy unknowns of its circuit (powered, or with the meter on the
 * same test point), as the dictionary's rebuilt faults do (faulty-board-readings.ts,
 * ohmmeter-readings.ts). Newton stops once a step is within reltol, so where it lands depends on
 * where it started and on the pivot plans that factored each step; `asMeasured` starts every fault
 * as measureAll on the rebuilt board would (unpowered from zero, no plans), which keeps the two
 * paths' answers equal far below the convergence tolerance, for checking this path.
 *
 * A fault that does not settle here returns undefined: the caller solves it the full way (with its
 * fallback options), so this path never makes a fault unpredictable that the full way can predict.
 */

/**
 * The resistance a resistor presents with this fault, when the fault is nothing but that; undefined
 * for every other fault. The equivalences follow applyFault's board edits: a short is SHORT_OHMS
 * across the part's pins (in parallel with it); a wrong value is the value fitted.
 *
 * An open is left to the full path: applyFault moves a pin onto a node of its own tied back through
 * OPEN_OHMS, and the solver's shunt from every node to ground (gshunt) on that extra node makes it
 * a T network, not OPEN_OHMS in series. On a high-impedance net the two differ by ≈1e-5 relative,
 * more than the agreement asked of this path.
 */
export function faultedResistance(fault: Fault, healthy: number): number | undefined {
  if (fault.kind !== 'resistor') return undefined;
  switch (fault.mode) {
    case 'short':
      return (healthy * SHORT_OHMS) / (healthy + SHORT_OHMS);
    case 'wrong-value':
      return fault.value;
    default:
      return undefined;
  }
}

export interface ValueFaultSolver {
  /**
   * Readings at every test point of the condition (in testPointsFor order) with this fault, or
   * undefined when the fault is not a value change this solver handles or did not settle here.
   */
  predict(fault: Fault, elsewhere?: () => Record<string, number> | undefined): number[] | undefined;
  /**
   * After a powered prediction that settled, its operating point by unknown name: a start for the
   * same fault in another condition (`elsewhere` above), tried when plain Newton from the healthy
   * point fails, before the walk.
   */
  settledUnknowns(): Record<string, number> | undefined;
}

/** One compiled circuit and how to read its test points from the solver's unknowns. */
interface Setup {
  solver: DcSolver;
  /** Where each fault's solve starts: the healthy unknowns, or zero (cold) for an ohmmeter circuit solved as measureAll does. */
  start: Float64Array | undefined;
  /** The healthy operating point, where a walk to the faulted value starts. */
  healthy: Float64Array;
  /** The pivot plans the healthy solve left, where every fault's solve starts. */
  plans: ReturnType<DcSolver['engine']['lu']['savePlans']>;
  /** Designator of a resistor → its element and healthy value, as built from the board. */
  resistors: Map<string, { element: string; value: number }>;
  setters: Map<string, (value: number) => void>;
  /** Writes this circuit's readings into `into` from the solver's unknowns. */
  read: (x: Float64Array, into: number[]) => void;
}


/**
 * The value-fault solver of one condition, or undefined when a healthy circuit of it does not settle
 * with the default options (its faults then all take the full way).
 */
export interface ValueFaultOptions {
  /**
   * Start every fault as measureAll on the rebuilt board does: with no pivot plans, and unpowered
   * from zero. By default a fault starts with the plans the healthy solve left, which mostly still
   * fit a one-resistor change (demo board, 13 powered conditions: ≈9,000 plans down to ≈2,700), and
   * an ohmmeter circuit from its healthy point (≈24 Newton iterations from zero, a few from there);
   * a fault then lands elsewhere within the tolerance than measureAll does (a few 1e-6 relative on
   * the demo board).
   */
  asMeasured?: boolean;
}

export function createValueFaultSolver(board: Board, conditionId: string, options: ValueFaultOptions = {}): ValueFaultSolver | undefined {
  const condition = findCondition(board, conditionId);
  const points = testPointsFor(board, condition);
  const setups: Setup[] = [];
  if (condition.powered) {
    const built = buildCircuit(board, condition.id);
    const { netNode } = built;
    const setup = prepare(built, true);
    if (!setup) return undefined;
    const pairs = points.map((tp) => probes(board, tp, netNode, setup.solver));
    setups.push({
      ...setup,
      read: (x, into) => {
        for (let k = 0; k < pairs.length; k++) into[k] = at(x, pairs[k][0]) - at(x, pairs[k][1]);
      },
    });
  } else {
    for (let k = 0; k < points.length; k++) {
      const tp = points[k];
      const built = buildCircuit(board, condition.id, { ohmmeter: { testPoint: tp.id } });
      const { netNode } = built;
      const setup = prepare(built, !options.asMeasured);
      if (!setup) return undefined;
      const [probe, ref] = probes(board, tp, netNode, setup.solver);
      const meter = index(setup.solver, METER_NODE);
      setups.push({
        ...setup,
        read: (x, into) => {
          into[k] = ohmmeterReading(at(x, meter), at(x, probe), at(x, ref), DEFAULT_OHMMETER);
        },
      });
    }
  }

  function predict(fault: Fault, elsewhere?: () => Record<string, number> | undefined): number[] | undefined {
    const readings = new Array<number>(points.length).fill(NaN);
    for (const setup of setups) {
      const resistor = setup.resistors.get(fault.part);
      if (resistor === undefined) return undefined;
      const healthy = resistor.value;
      const value = faultedResistance(fault, healthy);
      if (value === undefined) return undefined;
      let set = setup.setters.get(fault.part);
      if (!set) {
        set = setup.solver.valueSetter(resistor.element, 'value');
        setup.setters.set(fault.part, set);
      }
      set(value);
      // Every fault starts from the same pivot plans: which plan factors a matrix decides its
      // rounding, and so where Newton lands within its tolerance, so plans kept from fault to
      // fault would make a prediction depend on the faults solved before it.
      setup.solver.engine.lu.restorePlans(options.asMeasured ? [] : setup.plans);
      try {
        if (!settle(setup, set, healthy, value, elsewhere)) return undefined;
        setup.read(setup.solver.x, readings);
      } finally {
        set(healthy);
      }
    }
    return readings;
  }

  const settledUnknowns = () => (condition.powered && setups.length === 1 ? unknownsByName(setups[0].solver) : undefined);
  return { predict, settledUnknowns };
}

/**
 * Plain Newton from the start; when that fails, Newton from the fault's own operating point under
 * another condition (`elsewhere()`, asked for only then), then the resistor walked from its healthy value to
 * the faulted one (value-walk.ts); when those fail too, the solver's own aids (gmin and source
 * stepping) from the start, as before, so a fault settles here whenever it did without them. Plain
 * Newton runs first and alone so that every fault it settles lands where it did: the other starts
 * only decide the faults that needed gmin stepping (as in faulty-board-readings.ts).
 */
function settle(setup: Setup, set: (value: number) => void, healthy: number, value: number, elsewhere: (() => Record<string, number> | undefined) | undefined): boolean {
  const { solver } = setup;
  const from = setup.start ? { start: setup.start } : {};
  if (plainNewton(solver, setup.start)) return true;
  // The solver's aids start over from `from` with the plans plain Newton left: as without the walk.
  const plans = solver.engine.lu.savePlans();
  const other = elsewhere?.();
  if (other && plainNewton(solver, startOver(solver, setup.healthy, other), ELSEWHERE_ITERATIONS)) return true;
  if (walkValue(solver, set, healthy, value, setup.healthy).settled) return true;
  set(value);
  solver.engine.lu.restorePlans(plans);
  try {
    solver.solveLean({ ...from, skip: ['newton'] });
    return true;
  } catch (error) {
    if (!isSolverFailure(error)) throw error;
    return false;
  }
}

function prepare({ circuit, partElements }: BuiltCircuit, warm: boolean): Omit<Setup, 'read'> | undefined {
  const solver = createDcSolver(circuit);
  try {
    solver.solveLean();
  } catch (error) {
    if (!isSolverFailure(error)) throw error;
    return undefined;
  }
  const resistors = new Map<string, { element: string; value: number }>();
  for (const [ref, names] of Object.entries(partElements)) {
    const e = names.length === 1 ? circuit.elements.find((el) => el.name === names[0]) : undefined;
    if (e?.kind === 'resistor') resistors.set(ref, { element: e.name, value: e.value });
  }
  const healthy = solver.x.slice();
  return { solver, start: warm ? healthy : undefined, healthy, plans: solver.engine.lu.savePlans(), resistors, setters: new Map() };
}

/** Unknown index of a node, −1 for ground or a node the circuit lacks (read as 0 V, as measureAll does). */
function index(solver: DcSolver, node: string): number {
  return node === GROUND ? -1 : (solver.compiled.nodeIndex.get(node) ?? -1);
}

function probes(board: Board, tp: TestPoint, netNode: (net: string) => string, solver: DcSolver): [number, number] {
  return [index(solver, netNode(tp.net)), index(solver, netNode(tp.refNet ?? board.ground))];
}

const at = (x: Float64Array, i: number) => (i < 0 ? 0 : x[i]);
