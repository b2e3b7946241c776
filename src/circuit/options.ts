/**
 * The solver's tolerances and limits, all in one place, with SPICE's usual defaults.
 *
 * A Newton iterate has converged when every unknown moved less than
 *   reltol * max(|new|, |old|) + vntol   (node voltages)
 *   reltol * max(|new|, |old|) + abstol  (branch currents)
 * no junction voltage had to be limited in the step, and the KCL residual at every node is within
 * reltol of the largest current flowing there plus abstol.
 */
import type { DcSolution } from './dc-solution.js';

export interface DcOptions {
  /** Relative tolerance (SPICE RELTOL), default 1e-3. */
  reltol?: number;
  /** Absolute voltage tolerance in volts (SPICE VNTOL), default 1 µV. */
  vntol?: number;
  /** Absolute current tolerance in amps (SPICE ABSTOL), default 1 pA. */
  abstol?: number;
  /** Conductance in siemens placed across every junction (SPICE GMIN), default 1e-12. */
  gmin?: number;
  /**
   * Conductance from every node to ground, default 1e-12 S. It keeps nodes that a fault has left
   * floating (an open resistor, a node reached only through capacitors) solvable; a meter on
   * such a node would read whatever its own input pulls it to anyway. 0 disables it.
   */
  gshunt?: number;
  /** Newton iterations per attempt (SPICE ITL1), default 100. */
  maxIterations?: number;
  /** Most gmin steps, default 40. */
  maxGminSteps?: number;
  /** Most source steps, default 60. */
  maxSourceSteps?: number;
  /** A previous solution of this or a similar circuit to start Newton from (warm start). */
  initial?: DcSolution;
  /** Skip plain Newton and the named strategies (mostly for tests of the strategy list). */
  skip?: Array<'newton' | 'gmin' | 'source'>;
}

export interface ResolvedDcOptions {
  reltol: number;
  vntol: number;
  abstol: number;
  gmin: number;
  gshunt: number;
  maxIterations: number;
  maxGminSteps: number;
  maxSourceSteps: number;
  skip: ReadonlySet<string>;
}

export const DEFAULT_DC_OPTIONS: ResolvedDcOptions = {
  reltol: 1e-3,
  vntol: 1e-6,
  abstol: 1e-12,
  gmin: 1e-12,
  gshunt: 1e-12,
  maxIterations: 100,
  maxGminSteps: 40,
  maxSourceSteps: 60,
  skip: new Set(),
};

export function resolveDcOptions(options: DcOptions = {}): ResolvedDcOptions {
  const d = DEFAULT_DC_OPTIONS;
  const pick = (name: keyof ResolvedDcOptions, value: number | undefined, fallback: number): number => {
    if (value === undefined) return fallback;
    if (!Number.isFinite(value) || value < 0) {
      throw new RangeError(`DC option ${name} must be a finite number ≥ 0, got ${value}`);
    }
    return value;
  };
  return {
    reltol: pick('reltol', options.reltol, d.reltol),
    vntol: pick('vntol', options.vntol, d.vntol),
    abstol: pick('abstol', options.abstol, d.abstol),
    gmin: pick('gmin', options.gmin, d.gmin),
    gshunt: pick('gshunt', options.gshunt, d.gshunt),
    maxIterations: Math.max(1, Math.floor(pick('maxIterations', options.maxIterations, d.maxIterations))),
    maxGminSteps: Math.floor(pick('maxGminSteps', options.maxGminSteps, d.maxGminSteps)),
    maxSourceSteps: Math.floor(pick('maxSourceSteps', options.maxSourceSteps, d.maxSourceSteps)),
    skip: new Set(options.skip ?? []),
  };
}
