/**
 * DC operating point: plain Newton, then gmin stepping, then source stepping — each strategy
 * starting again from the initial guess — and a typed ConvergenceError naming the unknowns that
 * would not settle when all three fail. Work is bounded by the iteration and step limits in
 * ./options.ts.
 *
 * createDcSolver compiles once and keeps its matrices and LU plan, so repeated solves of the
 * same circuit (sweeps, warm starts) only pay for the Newton iterations themselves. Part values
 * can be changed in place between solves (setValue), which keeps the plan too: the matrix pattern
 * never depends on values. solveLean is for inner loops that read a few node voltages: the same
 * strategies and the same convergence test, but no per-element results.
 */
import type { Circuit } from './netlist.js';
import { compileCircuit, type CompiledCircuit } from './compile.js';
import { NewtonEngine, type NewtonOutcome } from './newton.js';
import { resolveDcOptions, type DcOptions, type ResolvedDcOptions } from './options.js';
import type { DcSolution } from './dc-solution.js';
import { buildDcSolution } from './dc-result.js';
import { ConvergenceError } from './errors.js';
import { badValue } from './check-values.js';
import { UserInputError } from '../errors.js';
import type { Device } from './devices/device.js';

export interface LeanDcOptions extends Omit<DcOptions, 'initial'> {
  /** Unknowns to start from, in this solver's order (compiled.unknownNames); all zero when absent. */
  start?: Float64Array;
}

export interface LeanDcResult {
  strategy: DcSolution['strategy'];
  iterations: number;
}

export interface DcSolver {
  readonly compiled: CompiledCircuit;
  readonly engine: NewtonEngine;
  solve(options?: DcOptions): DcSolution;
  /**
   * The operating point left in `x`, with no DcSolution built. Converges by the same test as
   * solve() (step within tolerance, no junction limited, KCL at every node with the devices' true
   * currents), so `x` is what solve() would return; throws ConvergenceError likewise.
   */
  solveLean(options?: LeanDcOptions): LeanDcResult;
  /**
   * Changes one value of a compiled element in place: "value" of a resistor or pot, "position" of
   * a pot, "dc" of a source, a law field of an op-amp ("vos", "gain"…), or a model parameter of
   * one diode or transistor ("IS", "BF"…; other parts sharing its model keep theirs). The Circuit
   * the solver was made from is not changed. UserInputError for an unknown element, a field it
   * cannot change, or a bad value (the element then keeps its old value).
   */
  setValue(element: string, field: string, value: number): void;
  setValues(changes: Iterable<readonly [element: string, field: string, value: number]>): void;
  /** setValue with the element looked up once, for loops. */
  valueSetter(element: string, field: string): (value: number) => void;
  /** Whether setValue(element, field, …) can work on this circuit. */
  canSet(element: string, field: string): boolean;
  /** The converged unknown vector of the last solve (shared; copy it to keep it). */
  readonly x: Float64Array;
}

/** First diagonal conductance in gmin stepping, siemens, and the largest step factor. */
const GMIN_STEP_START = 1e-2;
const GMIN_STEP_FACTOR = 10;
const GMIN_STEP_FACTOR_FAST = 1e4;
const SOURCE_STEP_START = 0.01;

export function createDcSolver(circuit: Circuit): DcSolver {
  const cc = compileCircuit(circuit);
  const engine = new NewtonEngine(cc);
  const n = cc.size;
  const x = new Float64Array(n);
  const start = new Float64Array(n);
  const saved = new Float64Array(n);

  const seedFrom = (v: Float64Array | null) => {
    for (const d of cc.devices) d.seed?.(v, cc.vt);
  };

  function warmStart(initial: DcSolution | undefined): boolean {
    start.fill(0);
    if (!initial) return false;
    warmStartVector(cc.unknownNames, initial, start);
    return true;
  }

  function gminStepping(opts: ResolvedDcOptions, warm: boolean): { outcome: NewtonOutcome; iterations: number } {
    let iterations = 0;
    x.set(start);
    seedFrom(warm ? x : null);
    let diag = GMIN_STEP_START;
    let outcome = engine.run(x, opts, diag, 1);
    iterations += outcome.iterations;
    if (!outcome.converged) return { outcome, iterations };
    let factor = GMIN_STEP_FACTOR;
    const target = Math.max(opts.gmin, 1e-15);
    for (let step = 0; step < opts.maxGminSteps && diag > target; step++) {
      saved.set(x);
      const next = Math.max(diag / factor, target);
      outcome = engine.run(x, opts, next, 1);
      iterations += outcome.iterations;
      if (outcome.converged) {
        diag = next;
        // Steps that settle at once can be much larger (the answer has stopped depending on gmin).
        factor = outcome.iterations <= 4 ? Math.min(factor * factor, GMIN_STEP_FACTOR_FAST) : Math.min(factor * Math.sqrt(factor), GMIN_STEP_FACTOR);
      } else {
        x.set(saved);
        seedFrom(x);
        factor = Math.sqrt(Math.sqrt(factor));
        if (factor < 1.00005) return { outcome, iterations };
      }
    }
    if (diag > target) return { outcome: { ...outcome, converged: false, detail: 'gmin step limit' }, iterations };
    outcome = engine.run(x, opts, 0, 1);
    iterations += outcome.iterations;
    return { outcome, iterations };
  }

  function sourceStepping(opts: ResolvedDcOptions): { outcome: NewtonOutcome; iterations: number } {
    let iterations = 0;
    // With every source at zero the answer is all zeros, exactly: start there, junctions included.
    // Seeding the junctions at their critical voltage instead (as a cold Newton does) gives a first
    // step of volts from nothing, which two transistors wired as a latch can then bounce on forever.
    x.fill(0);
    seedFrom(x);
    let scale = 0;
    let outcome = engine.run(x, opts, 0, 0);
    iterations += outcome.iterations;
    if (!outcome.converged) return { outcome, iterations };
    let raise = SOURCE_STEP_START;
    for (let step = 0; step < opts.maxSourceSteps; step++) {
      saved.set(x);
      const next = Math.min(1, scale + raise);
      outcome = engine.run(x, opts, 0, next);
      iterations += outcome.iterations;
      if (outcome.converged) {
        scale = next;
        if (scale >= 1) return { outcome, iterations };
        if (outcome.iterations <= opts.maxIterations / 4) raise *= 1.5;
      } else {
        x.set(saved);
        seedFrom(x);
        raise /= 10;
        if (raise < 1e-7) return { outcome, iterations };
      }
    }
    return { outcome: { ...outcome, converged: false, detail: 'source step limit' }, iterations };
  }

  function finish(opts: ResolvedDcOptions, strategy: DcSolution['strategy'], iterations: number): DcSolution {
    const { solution, violations } = buildDcSolution(cc, x, opts, strategy, iterations);
    if (violations.length) {
      const worst = violations.reduce((a, b) => (Math.abs(a.residual) > Math.abs(b.residual) ? a : b));
      throw new ConvergenceError(
        violations.map((v) => v.node),
        strategy,
        `KCL residual ${worst.residual.toExponential(2)} A at ${worst.node}`,
      );
    }
    return solution;
  }

  /** Runs the strategy list from `start`; leaves the answer in x or throws ConvergenceError. */
  function converge(opts: ResolvedDcOptions, warm: boolean): LeanDcResult {
    let total = 0;
    let last: NewtonOutcome | null = null;
    let lastStrategy = 'none';
    // Every strategy's unsettled unknowns, not only the last one's: each fails somewhere else (source
    // stepping, starting from the exact zero answer, may stall on a source current where plain
    // Newton left a diode's node moving), and the person needs to see where to look.
    const unsettled = new Set<number>();
    const failed = (outcome: NewtonOutcome) => {
      for (const i of outcome.unsettled) unsettled.add(i);
      return outcome;
    };

    if (!opts.skip.has('newton')) {
      x.set(start);
      seedFrom(warm ? x : null);
      const outcome = engine.run(x, opts, 0, 1);
      total += outcome.iterations;
      if (outcome.converged) return { strategy: 'newton', iterations: total };
      last = failed(outcome);
      lastStrategy = 'Newton';
    }
    if (!opts.skip.has('gmin')) {
      const { outcome, iterations } = gminStepping(opts, warm);
      total += iterations;
      if (outcome.converged) return { strategy: 'gmin', iterations: total };
      last = failed(outcome);
      lastStrategy = 'gmin stepping';
    }
    if (!opts.skip.has('source')) {
      const { outcome, iterations } = sourceStepping(opts);
      total += iterations;
      if (outcome.converged) return { strategy: 'source', iterations: total };
      last = failed(outcome);
      lastStrategy = 'source stepping';
    }
    // Leave a finite vector behind rather than a half-diverged one.
    x.set(start);
    const names = [...unsettled].sort((a, b) => a - b).map((i) => cc.unknownNames[i]);
    throw new ConvergenceError(names, lastStrategy, `${last?.detail ?? 'no strategy allowed'}; ${total} iterations`);
  }

  function solve(options: DcOptions = {}): DcSolution {
    const opts = resolveDcOptions(options);
    const { strategy, iterations } = converge(opts, warmStart(options.initial));
    return finish(opts, strategy, iterations);
  }

  // Inner loops hand the same options object to every solveLean; resolving (and checking) it once
  // per object, not per call, matters when a solve is two Newton iterations. Only an object seen
  // before with the same fields (other than `start`) reuses the last resolution.
  let lastGiven: LeanDcOptions | null = null;
  let lastCopy: LeanDcOptions = {};
  let lastResolved: ResolvedDcOptions | null = null;
  function resolveLean(options: LeanDcOptions): ResolvedDcOptions {
    if (options === lastGiven && lastResolved && sameOptions(options, lastCopy)) return lastResolved;
    lastResolved = resolveDcOptions(options);
    lastGiven = options;
    lastCopy = { ...options, skip: options.skip ? [...options.skip] : undefined };
    return lastResolved;
  }

  function solveLean(options: LeanDcOptions = {}): LeanDcResult {
    const opts = resolveLean(options);
    const given = options.start;
    if (given) {
      if (given.length !== n) throw new RangeError(`start has ${given.length} unknowns, the circuit ${n}`);
      start.set(given);
    } else {
      start.fill(0);
    }
    return converge(opts, given !== undefined);
  }

  let byName: Map<string, Device> | null = null;
  function device(element: string): Device {
    byName ??= new Map(cc.devices.map((d) => [d.name, d]));
    const d = byName.get(element);
    if (d) return d;
    throw new UserInputError({
      code: 'circuit.unknown-element',
      path: `elements.${element}`,
      message: `no element ${element} in this circuit`,
      accepted: 'the name of one of the circuit\'s elements',
    });
  }
  function settable(d: Device, field: string): boolean {
    return d.settable !== undefined && (d.settable.includes(field) || d.settable.includes(field.toUpperCase()));
  }
  function valueSetter(element: string, field: string): (value: number) => void {
    const d = device(element);
    const set = d.set;
    if (!set || !settable(d, field)) {
      throw badValue(element, field, 'a value to change', d.settable?.length ? `one of ${d.settable.join(', ')}` : 'nothing: this element has no value that can change in place');
    }
    return (value) => set.call(d, field, value);
  }
  const setValue = (element: string, field: string, value: number) => valueSetter(element, field)(value);
  function setValues(changes: Iterable<readonly [string, string, number]>): void {
    for (const [element, field, value] of changes) setValue(element, field, value);
  }
  function canSet(element: string, field: string): boolean {
    byName ??= new Map(cc.devices.map((d) => [d.name, d]));
    const d = byName.get(element);
    return d !== undefined && d.set !== undefined && settable(d, field);
  }

  return { compiled: cc, engine, solve, solveLean, setValue, setValues, valueSetter, canSet, x };
}

function sameOptions(a: LeanDcOptions, b: LeanDcOptions): boolean {
  for (const key of OPTION_FIELDS) if (a[key] !== b[key]) return false;
  const sa = a.skip ?? [];
  const sb = b.skip ?? [];
  return sa.length === sb.length && sa.every((v, i) => v === sb[i]);
}

// Written as a record so that a new numeric option fails to compile until it is listed here.
const OPTION_FIELD_SET = {
  reltol: true, vntol: true, abstol: true, gmin: true, gshunt: true, maxIterations: true, maxGminSteps: true, maxSourceSteps: true,
} as const satisfies Record<Exclude<keyof ResolvedDcOptions, 'skip'>, true>;
const OPTION_FIELDS = Object.keys(OPTION_FIELD_SET) as Array<keyof typeof OPTION_FIELD_SET>;

/**
 * The start a previous solution gives a circuit with these unknowns: each unknown's value by name
 * (a node's voltage, a source's current), zero where the solution has none (a node a fault added)
 * or where it is not finite.
 */
export function warmStartVector(
  unknownNames: readonly string[],
  initial: Pick<DcSolution, 'unknowns' | 'nodes' | 'sourceCurrents'>,
  into: Float64Array = new Float64Array(unknownNames.length),
): Float64Array {
  for (let i = 0; i < unknownNames.length; i++) {
    const name = unknownNames[i];
    let v = initial.unknowns?.[name];
    if (v === undefined) v = initial.nodes[name];
    if (v === undefined && name.startsWith('i(')) v = initial.sourceCurrents[name.slice(2, -1)];
    into[i] = typeof v === 'number' && Number.isFinite(v) ? v : 0;
  }
  return into;
}

/** One DC operating point. For many solves of one circuit, keep a createDcSolver instead. */
export function solveDC(circuit: Circuit, options?: DcOptions): DcSolution {
  return createDcSolver(circuit).solve(options);
}
