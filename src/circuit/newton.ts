/**
 * One Newton–Raphson attempt on a compiled circuit, at a given gmin-stepping conductance and
 * source factor. Each iteration stamps every device's companion model at the iterate (with
 * junction limiting), factors, solves, and compares per unknown. An iterate is accepted when the
 * last step was within tolerance, no junction was limited, and KCL holds at every node with the
 * devices' true currents (./kcl.ts) — the voltage test alone is too loose on an exponential.
 */
import type { CompiledCircuit } from './compile.js';
import type { StampContext } from './devices/device.js';
import type { ResolvedDcOptions } from './options.js';
import { Stamper } from './stamper.js';
import { SparseLu } from './sparse-lu.js';
import { KclChecker } from './kcl.js';
import { SingularMatrixError, StampError } from './errors.js';

/** Consecutive revisits after which an attempt is abandoned, and how many iterates are remembered. */
const CYCLE_LIMIT = 6;
const CYCLE_DEPTH = 8;
/** "Back near" = within this fraction of the step just taken. */
const CYCLE_RETURN = 0.5;

export interface NewtonOutcome {
  converged: boolean;
  iterations: number;
  /** Unknown indices still moving (or failing the residual) when the attempt gave up. */
  unsettled: number[];
  detail: string;
}

export class NewtonEngine {
  readonly cc: CompiledCircuit;
  readonly stamper: Stamper;
  readonly lu: SparseLu;
  readonly ctx: StampContext;
  private readonly xNew: Float64Array;
  /** The last CYCLE_DEPTH iterates, oldest overwritten first, for spotting cycles. */
  private readonly history: Float64Array[];
  private readonly moving: Uint8Array;
  private readonly kcl: KclChecker;

  constructor(cc: CompiledCircuit) {
    this.cc = cc;
    this.stamper = new Stamper(cc.size);
    this.stamper.restrictTo(cc.positions);
    this.lu = new SparseLu(cc.size, cc.pattern, cc.positions);
    this.ctx = { x: new Float64Array(cc.size), vt: cc.vt, gmin: 1e-12, sourceScale: 1, limit: true, limited: 0 };
    this.xNew = new Float64Array(cc.size);
    this.history = Array.from({ length: CYCLE_DEPTH }, () => new Float64Array(cc.size));
    this.moving = new Uint8Array(cc.size);
    this.kcl = new KclChecker(cc);
  }

  /** Stamps every device at x; returns how many devices limited their junction voltages. */
  stampAt(x: Float64Array, opts: ResolvedDcOptions, diagGmin: number, sourceScale: number, limit: boolean): number {
    const { stamper, ctx, cc } = this;
    ctx.x = x;
    ctx.gmin = opts.gmin;
    ctx.sourceScale = sourceScale;
    ctx.limit = limit;
    ctx.limited = 0;
    stamper.clear();
    for (const d of cc.devices) {
      stamper.owner = d.name;
      d.stamp(stamper, ctx);
    }
    const shunt = opts.gshunt + diagGmin;
    if (shunt > 0) {
      const n = cc.size;
      const a = stamper.a;
      const rows = cc.shuntRows;
      for (let t = 0; t < rows.length; t++) a[rows[t] * (n + 1)] += shunt;
    }
    return ctx.limited;
  }

  private residualOk(x: Float64Array, opts: ResolvedDcOptions, diagGmin: number): boolean {
    const violations = this.kcl.check(x, this.ctx, opts.gshunt + diagGmin, opts.reltol, opts.abstol);
    for (const v of violations) this.moving[v.index] = 1;
    return violations.length === 0;
  }

  private revisits(xNew: Float64Array, x: Float64Array, depth: number, opts: ResolvedDcOptions): boolean {
    const n = this.cc.size;
    const isCurrent = this.cc.isCurrent;
    outer: for (let h = 0; h < depth; h++) {
      const old = this.history[h];
      for (let i = 0; i < n; i++) {
        const xn = xNew[i];
        const tol = opts.reltol * Math.abs(xn) + (isCurrent[i] ? opts.abstol : opts.vntol);
        if (Math.abs(xn - old[i]) > CYCLE_RETURN * Math.abs(xn - x[i]) + tol) continue outer;
      }
      return true;
    }
    return false;
  }

  run(x: Float64Array, opts: ResolvedDcOptions, diagGmin: number, sourceScale: number): NewtonOutcome {
    const n = this.cc.size;
    const { moving, xNew, stamper } = this;
    const isCurrent = this.cc.isCurrent;
    let stepSmall = false;
    let cycling = 0;
    const history = this.history;
    const fail = (iterations: number, detail: string, all = false): NewtonOutcome => {
      const unsettled: number[] = [];
      for (let i = 0; i < n; i++) if (all || moving[i]) unsettled.push(i);
      return { converged: false, iterations, unsettled, detail };
    };
    for (let iter = 0; iter < opts.maxIterations; iter++) {
      let limited: number;
      try {
        limited = this.stampAt(x, opts, diagGmin, sourceScale, true);
      } catch (e) {
        if (e instanceof StampError) return fail(iter, e.message, true);
        throw e;
      }
      if (stepSmall && limited === 0) {
        moving.fill(0);
        if (this.residualOk(x, opts, diagGmin)) return { converged: true, iterations: iter, unsettled: [], detail: '' };
      }
      try {
        this.lu.factor(stamper.a);
      } catch (e) {
        if (e instanceof SingularMatrixError) {
          moving.fill(0);
          if (e.row >= 0 && e.row < n) moving[e.row] = 1;
          return fail(iter, 'singular matrix');
        }
        throw e;
      }
      this.lu.solve(stamper.b, xNew);
      stepSmall = true;
      moving.fill(0);
      for (let i = 0; i < n; i++) {
        const xn = xNew[i];
        const xo = x[i];
        if (!Number.isFinite(xn)) return fail(iter + 1, 'non-finite iterate', true);
        const abs = isCurrent[i] ? opts.abstol : opts.vntol;
        const tol = opts.reltol * Math.max(Math.abs(xn), Math.abs(xo)) + abs;
        if (Math.abs(xn - xo) > tol) {
          stepSmall = false;
          moving[i] = 1;
        }
      }
      // A cycle (the new iterate lands back near one of the last few, with every unknown that
      // moved within CYCLE_RETURN of its step) is not converging: give up on this attempt early
      // and let the next strategy start.
      cycling = !stepSmall && this.revisits(xNew, x, Math.min(iter, CYCLE_DEPTH), opts) ? cycling + 1 : 0;
      if (cycling >= CYCLE_LIMIT) return fail(iter + 1, 'iterates cycling');
      history[iter % CYCLE_DEPTH].set(x);
      x.set(xNew);
    }
    return fail(opts.maxIterations, 'iteration limit');
  }
}
