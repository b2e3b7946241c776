import type { Board } from '../../schemas/board.js';
import { GROUND, type Circuit, type Element } from '../netlist.js';
import { ConvergenceError, createDcSolver, type DcOptions, type DcSolution, type DcSolver, type LeanDcOptions } from '../index.js';
import { buildCircuit, FALLBACK_DC_OPTIONS, readResistance, readVoltage, testPointsFor } from '../../board/index.js';
import { deviatedValue } from './deviation.js';
import { boardDeviations, type PartDeviation } from './part-spreads.js';
import type { Evaluate } from './worst-case.js';
import type { LuPlan } from '../sparse-lu.js';

/**
 * The board as a function from part deviations to test-point readings, for the tolerance analyses.
 *
 * Each condition's circuit is built and compiled once, into a solver kept for every sample; a
 * sample only writes the deviated values (element values, one part's model parameters, op-amp
 * offsets) into the compiled devices, then solves warm-started from near the nominal solution of
 * that circuit (never from the previous sample's, and with the solver's pivot plans put back as
 * they were, so a sample's result does not depend on the order samples are drawn in). Samples use
 * the solver's lean solve: the same convergence test, but only the node voltages the readings need
 * are read out of it.
 */

export interface BoardOutput {
  testPoint: string;
  condition: string;
  /** Netlist node the red probe is on. */
  node: string;
  unit: 'V' | 'Ω';
}

/** One circuit to solve per sample (a condition, or one ohmmeter placement of an unpowered condition). */
interface Setup {
  condition: string;
  circuit: Circuit;
  solver: DcSolver;
  /** The nominal unknowns, every sample's starting point. */
  nominal: Float64Array;
  /** The solver options the nominal solve needed (samples use the same), with `start` = `seed`. */
  options: LeanDcOptions & { start: Float64Array };
  /** Where a continuation step starts from, and the warm start handed to the solver. */
  base: Float64Array;
  seed: Float64Array;
  /** One setter per deviation that touches this circuit. */
  setters: Array<{ index: number; set: (value: number) => void }>;
  /** Offset deviations and the unknown index of the − input of the amplifier each one moves. */
  offsets: Array<{ index: number; inverting: number }>;
  /**
   * Per setter (same order): how the unknowns move per unit of deviation, measured by solving at
   * u = ±SECANT_AT (negative and positive sides apart: a part's spread need not be symmetric).
   * Undefined until predictStarts(), or when the secants could not all be solved; samples then
   * start from the offset seed.
   */
  slopes?: Slopes;
  /** The solver options of a solve from the predicted start (setup.options with PREDICTED_OPTIONS). */
  predictedOptions: LeanDcOptions & { start: Float64Array };
  /** The nominal solve's options with every strategy allowed, for a start from zero. */
  coldOptions: LeanDcOptions;
  /**
   * The solver's pivot plans as they were before any sample: restored before each sample, so a
   * sample's answer depends on its deviations alone, never on the samples solved before it.
   */
  plans: readonly LuPlan[];
  /** Output index → reading from a solution. */
  readers: Array<{ output: number; read: (s: DcSolution) => number }>;
  /**
   * What the readers see: node voltages refreshed from the solver after each sample's solve. The
   * readers take only `nodes`; the other fields stay empty rather than being built per sample.
   */
  view: DcSolution;
  nodeNames: string[];
  nodeUnknowns: Int32Array;
}

export interface ConditionEvaluator {
  condition: string;
  /** Indices into the board evaluator's outputs. */
  outputs: number[];
  evaluate: Evaluate;
}

export interface BoardEvaluator {
  deviations: PartDeviation[];
  outputs: BoardOutput[];
  /** Readings of every output for one deviation vector (every condition solved; NaN where a circuit was not). */
  evaluate: Evaluate;
  /** The same, one condition at a time (the worst-case search runs per condition). */
  perCondition: ConditionEvaluator[];
  /** Operating points solved so far. */
  solves: () => number;
  /**
   * Solves each circuit's secants (two solves per deviation that touches it, once), after which
   * every evaluation starts from its linear prediction. Worth it before many evaluations (Monte
   * Carlo); a handful of points (worst case, one simulated board) is cheaper without.
   */
  predictStarts: () => void;
  /** Circuits whose nominal operating point could not be found: their test points have no output. */
  unsolved: Array<{ condition: string; testPoints: string[]; reason: string }>;
}

export function boardEvaluator(board: Board, conditions: string[]): BoardEvaluator {
  const deviations = boardDeviations(board);
  const outputs: BoardOutput[] = [];
  const setups: Setup[] = [];
  const unsolved: BoardEvaluator['unsolved'] = [];
  let solves = 0;
  for (const condition of conditions) {
    for (const built of buildsFor(board, condition)) {
      const { circuit, partElements } = built;
      const solver = createDcSolver(circuit);
      const setters = deviations.flatMap((d, index) => {
        const set = setterFor(circuit, solver, partElements[d.part] ?? [], d);
        return set ? [{ index, set }] : [];
      });
      solves++;
      let solved: { solution: DcSolution; options: DcOptions };
      try {
        solved = solveNominal(solver);
      } catch (error) {
        if (!(error instanceof ConvergenceError)) throw error;
        unsolved.push({ condition, testPoints: built.readings.map((r) => r.testPoint), reason: error.message });
        continue;
      }
      const { solution, options } = solved;
      const nominal = solver.x.slice();
      const readers = built.readings.map((r) => {
        outputs.push({ testPoint: r.testPoint, condition, node: r.node, unit: r.unit });
        return { output: outputs.length - 1, read: r.read };
      });
      const offsets = deviations.flatMap((d, index) => {
        if (d.target.kind !== 'vos') return [];
        const amps = (partElements[d.part] ?? []).map((n) => circuit.elements.find((e) => e.name === n)).filter((e) => e?.kind === 'opamp');
        const amp = amps[d.target.amplifier];
        const inverting = amp && amp.nodes[1] !== GROUND ? solver.compiled.nodeIndex.get(amp.nodes[1]) : undefined;
        return inverting === undefined ? [] : [{ index, inverting }];
      });
      const seed = new Float64Array(nominal.length);
      const view: DcSolution = { ...solution, nodes: { ...solution.nodes }, sourceCurrents: {}, elements: {}, junctions: {}, warnings: [], unknowns: undefined };
      const setup: Setup = {
        condition, circuit, solver, nominal, seed, base: new Float64Array(nominal.length),
        options: { ...options, ...WARM_OPTIONS, start: seed }, predictedOptions: { ...options, ...WARM_OPTIONS, ...PREDICTED_OPTIONS, start: seed },
        coldOptions: { ...options }, setters, offsets, plans: solver.engine.lu.savePlans(), readers, view,
        nodeNames: [...solver.compiled.nodeIndex.keys()], nodeUnknowns: Int32Array.from(solver.compiled.nodeIndex.values()),
      };
      setups.push(setup);
    }
  }
  const solveSetup = (setup: Setup, u: Float64Array, into: Float64Array, at: (output: number) => number) => {
    setup.solver.engine.lu.restorePlans(setup.plans);
    solveAlongPath(setup, deviations, u, () => solves++);
    const { view, nodeNames, nodeUnknowns } = setup;
    const x = setup.solver.x;
    for (let k = 0; k < nodeNames.length; k++) view.nodes[nodeNames[k]] = x[nodeUnknowns[k]];
    for (const r of setup.readers) into[at(r.output)] = r.read(view);
  };
  // One board across all conditions: a circuit that cannot be solved leaves its readings NaN
  // rather than losing the whole sample (Monte Carlo skips NaN per reading).
  const evaluate: Evaluate = (u) => {
    const y = new Float64Array(outputs.length);
    for (const setup of setups) {
      try {
        solveSetup(setup, u, y, (o) => o);
      } catch (error) {
        if (!(error instanceof ConvergenceError)) throw error;
        for (const r of setup.readers) y[r.output] = NaN;
      }
    }
    return y;
  };
  const perCondition = conditions.map((condition) => {
    const mine = setups.filter((s) => s.condition === condition);
    const indices = mine.flatMap((s) => s.readers.map((r) => r.output));
    const position = new Map(indices.map((o, k) => [o, k]));
    return {
      condition,
      outputs: indices,
      evaluate: (u: Float64Array) => {
        const y = new Float64Array(indices.length);
        for (const setup of mine) solveSetup(setup, u, y, (o) => position.get(o)!);
        return y;
      },
    };
  });
  let predicted = false;
  const predictStarts = () => {
    if (predicted) return;
    predicted = true;
    for (const setup of setups) {
      setup.slopes = secantSlopes(setup, deviations, () => solves++);
      setup.plans = setup.solver.engine.lu.savePlans();
    }
  };
  return { deviations, outputs, evaluate, perCondition, solves: () => solves, unsolved, predictStarts };
}

/**
 * The nominal operating point and the options it took: the solver's defaults, else the board's
 * fallbacks in turn (as solvePatiently tries them). Samples start from the options that worked, so
 * a circuit that needs a larger GMIN does not pay for a failing default solve on every sample.
 */
function solveNominal(solver: DcSolver): { solution: DcSolution; options: DcOptions } {
  let last: unknown;
  for (const options of [{}, ...FALLBACK_DC_OPTIONS]) {
    try {
      return { solution: solver.solve(options), options };
    } catch (error) {
      if (!(error instanceof ConvergenceError)) throw error;
      last = error;
    }
  }
  throw last;
}

/**
 * Solves one circuit at deviation vector u, starting from near the nominal solution.
 *
 * The first attempt starts from the linear prediction of the sample's operating point (nominal
 * plus each deviation times its secant, see secantSlopes): near the answer, Newton settles in one
 * or two iterations even where an amplifier sits at a sharp bend of its law. If that fails, the
 * start is the nominal solution with each op-amp's − input moved by its offset (offsetSeed), and
 * gmin stepping from the same warm start follows Newton. Source stepping is skipped: it restarts
 * from zero, ignoring the warm start, and is the slowest. If that fails, the deviation is applied
 * in 4 equal steps, each warm-started from the last (a continuation from the nominal board to the
 * sample). If that fails too, the sample's board is solved from zero with every strategy, source
 * stepping included, as the board itself powers up: slow, and on the demo board needed by one
 * circuit of 16,000 (1,000 samples, seed 1; under dc-above). Only if that fails is
 * the point reported as not solved (ConvergenceError), and the tolerance analyses count and skip it.
 *
 * From the predicted start, Newton alone gets PREDICTED_OPTIONS.maxIterations: a sample it does not
 * settle by then is one where a comparator has switched (a meter LED's comparator sitting near its
 * threshold), so the prediction is not near the answer and the offset seed does better. On the
 * demo board's input-gain-max condition, 200 samples: 3 to 8 iterations for most, 15 sent on.
 */
const PREDICTED_OPTIONS: DcOptions = { skip: ['source', 'gmin'], maxIterations: 30 };
const ATTEMPTS: ReadonlyArray<{ steps: number; predicted: boolean; cold?: boolean }> = [
  { steps: 1, predicted: true },
  { steps: 1, predicted: false },
  { steps: 4, predicted: false },
  { steps: 1, predicted: false, cold: true },
];
const WARM_OPTIONS: DcOptions = { skip: ['source'] };

/** Leaves the sample's operating point in setup.solver.x, or throws ConvergenceError. */
function solveAlongPath(setup: Setup, deviations: PartDeviation[], u: Float64Array, counted: () => void): void {
  const apply = (t: number) => {
    for (const { index, set } of setup.setters) set(deviatedValue(deviations[index], t * u[index]));
  };
  const { solver, base } = setup;
  for (const { steps, predicted, cold } of ATTEMPTS) {
    if (predicted && !setup.slopes) continue;
    if (cold) {
      counted();
      try {
        solver.solveLean(setup.coldOptions);
        return;
      } catch (error) {
        if (!(error instanceof ConvergenceError)) throw error;
      }
      continue;
    }
    base.set(setup.nominal);
    let reached = true;
    for (let k = 1; k <= steps && reached; k++) {
      apply(k / steps);
      counted();
      if (predicted) predictedSeed(setup, u);
      else offsetSeed(setup, deviations, u, (k - 1) / steps, k / steps);
      try {
        solver.solveLean(predicted ? setup.predictedOptions : setup.options);
        if (k < steps) base.set(solver.x);
      } catch (error) {
        if (!(error instanceof ConvergenceError)) throw error;
        reached = false;
      }
    }
    if (reached) return;
  }
  throw new ConvergenceError([], 'continuation', `no operating point reached from the predicted start, along 1 and 4 steps from nominal, nor from zero`);
}

/**
 * The secants of one circuit, stored by setter as sparse columns (CSR): only the unknowns a
 * deviation moves by more than SLOPE_FLOOR per unit. A deviation moves most unknowns of a circuit
 * by far less (on the demo board 60 % of entries are below it), and leaving them out of the start
 * moves it by at most SLOPE_FLOOR × (number of deviations) — on the demo board under 1e-7 V, a tenth
 * of VNTOL: a start that close moves Newton's answer by far less than its tolerance, and the sum
 * costs a third of what the dense one did.
 */
interface Slopes {
  /** Setter k's entries are at start[k] … start[k+1]−1 of index/up/down. */
  start: Int32Array;
  index: Int32Array;
  up: Float64Array;
  down: Float64Array;
}

const SLOPE_FLOOR = 1e-9;

function sparseSlopes(columns: Array<{ down: Float64Array; up: Float64Array }>): Slopes {
  const start = new Int32Array(columns.length + 1);
  const index: number[] = [];
  const up: number[] = [];
  const down: number[] = [];
  columns.forEach((c, k) => {
    for (let j = 0; j < c.up.length; j++) {
      if (Math.max(Math.abs(c.up[j]), Math.abs(c.down[j])) <= SLOPE_FLOOR) continue;
      index.push(j);
      up.push(c.up[j]);
      down.push(c.down[j]);
    }
    start[k + 1] = index.length;
  });
  return { start, index: Int32Array.from(index), up: Float64Array.from(up), down: Float64Array.from(down) };
}

/** The linear prediction of the sample's unknowns: nominal plus each deviation times its secant. */
function predictedSeed(setup: Setup, u: Float64Array): void {
  const { seed, setters } = setup;
  const { start, index, up, down } = setup.slopes!;
  seed.set(setup.nominal);
  for (let k = 0; k < setters.length; k++) {
    const ui = u[setters[k].index];
    if (ui === 0) continue;
    const slope = ui > 0 ? up : down;
    for (let t = start[k]; t < start[k + 1]; t++) seed[index[t]] += ui * slope[t];
  }
}

/**
 * A warm start for the step from t0·u to t1·u: the previous solution, with each deviated op-amp's
 * − input moved by the step's change of offset. An op-amp's open-loop gain is so high that a few
 * millivolts of offset applied to a settled solution drive its law deep into saturation, where
 * Newton's linearisation is flat and the iteration cycles; moving the − input with the offset
 * starts every amplifier at the differential input it had, inside its linear region.
 */
function offsetSeed(setup: Setup, deviations: PartDeviation[], u: Float64Array, t0: number, t1: number): void {
  const { seed } = setup;
  seed.set(setup.base);
  for (const { index, inverting } of setup.offsets) {
    const d = deviations[index];
    seed[inverting] += deviatedValue(d, t1 * u[index]) - deviatedValue(d, t0 * u[index]);
  }
}

/**
 * Where on each side of nominal the secants are taken: one standard deviation of the Gaussian
 * draws (see deviation.ts), the size of a typical sample's deviation.
 */
const SECANT_AT = 1 / 3;

/**
 * How the operating point moves with each deviation alone, on each side of nominal: solved at
 * u = ±SECANT_AT (two solves per deviation, paid once per circuit). Secants rather than tangents
 * of the nominal Jacobian: a precision rectifier resting between its diodes has a kink at nominal,
 * where a tangent predicts tenths of a volt wrong and a secant sees the bend. If any secant cannot
 * be solved, the circuit gets none and every sample starts from the offset seed.
 */
function secantSlopes(setup: Setup, deviations: PartDeviation[], counted: () => void): Slopes | undefined {
  const { solver, nominal } = setup;
  const u = new Float64Array(deviations.length);
  const side = (index: number, sign: number): Float64Array | undefined => {
    u[index] = sign * SECANT_AT;
    try {
      solveAlongPath(setup, deviations, u, counted);
    } catch (error) {
      if (!(error instanceof ConvergenceError)) throw error;
      return undefined;
    } finally {
      u[index] = 0;
    }
    const slope = new Float64Array(nominal.length);
    for (let j = 0; j < slope.length; j++) slope[j] = (solver.x[j] - nominal[j]) / (sign * SECANT_AT);
    return slope;
  };
  const columns: Array<{ down: Float64Array; up: Float64Array }> = [];
  for (const { index, set } of setup.setters) {
    const down = side(index, -1);
    const up = side(index, 1);
    set(deviatedValue(deviations[index], 0));
    if (!down || !up) return undefined;
    columns.push({ down, up });
  }
  return sparseSlopes(columns);
}

interface Build {
  circuit: Circuit;
  partElements: Record<string, string[]>;
  readings: Array<{ testPoint: string; node: string; unit: 'V' | 'Ω'; read: (s: DcSolution) => number }>;
}

function buildsFor(board: Board, condition: string): Build[] {
  const powered = board.conditions.find((c) => c.id === condition)?.powered ?? true;
  const points = testPointsFor(board, condition);
  if (points.length === 0) return [];
  if (powered) {
    const { circuit, partElements, netNode } = buildCircuit(board, condition);
    const readings = points.map((tp) => ({
      testPoint: tp.id,
      node: netNode(tp.net),
      unit: 'V' as const,
      read: (s: DcSolution) => readVoltage(board, tp, netNode, s),
    }));
    return [{ circuit, partElements, readings }];
  }
  return points.map((tp) => {
    const { circuit, partElements, netNode } = buildCircuit(board, condition, { ohmmeter: { testPoint: tp.id } });
    const read = (s: DcSolution) => readResistance(board, tp, netNode, s);
    return { circuit, partElements, readings: [{ testPoint: tp.id, node: netNode(tp.net), unit: 'Ω' as const, read }] };
  });
}

/**
 * How one deviation writes into a compiled circuit: a part's value onto its element(s), a model
 * parameter onto each of the part's own diodes or transistors (other parts of the same type keep
 * theirs), an offset onto one amplifier of a package. A model parameter the solver does not read
 * at DC has no effect on an operating point and gets no setter.
 */
function setterFor(circuit: Circuit, solver: DcSolver, elementNames: string[], d: PartDeviation): ((value: number) => void) | undefined {
  const elements = elementNames.map((n) => circuit.elements.find((e) => e.name === n)).filter((e): e is Element => e !== undefined);
  const target = d.target;
  let sets: Array<(value: number) => void>;
  if (target.kind === 'value') {
    sets = elements.filter((e) => e.kind === 'resistor' || e.kind === 'pot').map((e) => solver.valueSetter(e.name, 'value'));
  } else if (target.kind === 'vos') {
    const amp = elements.filter((e) => e.kind === 'opamp')[target.amplifier];
    sets = amp ? [solver.valueSetter(amp.name, 'vos')] : [];
  } else {
    sets = elements
      .filter((e) => (e.kind === 'diode' || e.kind === 'bjt') && solver.canSet(e.name, target.param))
      .map((e) => solver.valueSetter(e.name, target.param));
  }
  if (sets.length === 0) return undefined;
  if (sets.length === 1) return sets[0];
  return (value) => {
    for (const set of sets) set(value);
  };
}
