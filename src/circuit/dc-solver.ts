/**
 * DC operating point: plain Newton, then gmin stepping, then source stepping — each strategy
 * starting again from the initial guess — and a typed ConvergenceError naming the unknowns that
 * would not settle when all three fail. Work is bounded by the iteration and step limits in
 * ./options.ts.
 *
 * createDcSolver compiles once and keeps its matrices and LU plan, so repeated solves of the
 * same circuit (sweeps, warm starts) only pay for the Newton iterations themselves.
 */
import type { Circuit } from './netlist.js';
import { compileCircuit, type CompiledCircuit } from './compile.js';
import { NewtonEngine, type NewtonOutcome } from './newton.js';
import { resolveDcOptions, type DcOptions, type ResolvedDcOptions } from './options.js';
import type { DcSolution } from './dc-solution.js';
import { buildDcSolution } from './dc-result.js';
import { ConvergenceError } from './errors.js';

export interface DcSolver {
  readonly compiled: CompiledCircuit;
  readonly engine: NewtonEngine;
  solve(options?: DcOptions): DcSolution;
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
    const names = cc.unknownNames;
    for (let i = 0; i < n; i++) {
      const name = names[i];
      let v = initial.unknowns?.[name];
      if (v === undefined) v = initial.nodes[name];
      if (v === undefined && name.startsWith('i(')) v = initial.sourceCurrents[name.slice(2, -1)];
      start[i] = typeof v === 'number' && Number.isFinite(v) ? v : 0;
    }
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
    x.fill(0);
    seedFrom(null);
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

  function solve(options: DcOptions = {}): DcSolution {
    const opts = resolveDcOptions(options);
    const warm = warmStart(options.initial);
    let total = 0;
    let last: NewtonOutcome | null = null;
    let lastStrategy = 'none';

    if (!opts.skip.has('newton')) {
      x.set(start);
      seedFrom(warm ? x : null);
      const outcome = engine.run(x, opts, 0, 1);
      total += outcome.iterations;
      if (outcome.converged) return finish(opts, 'newton', total);
      last = outcome;
      lastStrategy = 'Newton';
    }
    if (!opts.skip.has('gmin')) {
      const { outcome, iterations } = gminStepping(opts, warm);
      total += iterations;
      if (outcome.converged) return finish(opts, 'gmin', total);
      last = outcome;
      lastStrategy = 'gmin stepping';
    }
    if (!opts.skip.has('source')) {
      const { outcome, iterations } = sourceStepping(opts);
      total += iterations;
      if (outcome.converged) return finish(opts, 'source', total);
      last = outcome;
      lastStrategy = 'source stepping';
    }
    // Leave a finite vector behind rather than a half-diverged one.
    x.set(start);
    const names = (last?.unsettled ?? []).map((i) => cc.unknownNames[i]);
    throw new ConvergenceError(names, lastStrategy, `${last?.detail ?? 'no strategy allowed'}; ${total} iterations`);
  }

  return { compiled: cc, engine, solve, x };
}

/** One DC operating point. For many solves of one circuit, keep a createDcSolver instead. */
export function solveDC(circuit: Circuit, options?: DcOptions): DcSolution {
  return createDcSolver(circuit).solve(options);
}
