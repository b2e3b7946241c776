/**
 * Worst-case extremes of every output over the box u ∈ [-1, 1]^n of normalised part deviations.
 *
 * 1. Solve at nominal, then move one variable at a time to each end of its spread (2n solves). The
 *    change tells each output's sensitivity to each variable, with its sign; a variable whose both
 *    ends move the output the same way (a non-monotonic response) is left at nominal for that side.
 * 2. For each output, build the corner that should maximise it (every variable at the end that
 *    raised it) and the one that should minimise it, and solve there. Outputs that share a corner
 *    share the solve.
 * 3. The circuit is nonlinear, so a corner is checked, not assumed: each output's limits are the
 *    extremes over every point actually solved (nominal, every one-at-a-time end, every corner).
 *    If a single perturbation beats the corner, the perturbation wins.
 *
 * Every point solved lies inside the tolerance box, so each limit is attained by some real
 * combination of parts; the method can miss an interior extreme of a strongly nonlinear response,
 * which is why the Monte Carlo spread is shown beside it.
 */

/** Readings (one per output) for a vector of normalised deviations; throws if the point cannot be solved. */
export type Evaluate = (u: Float64Array) => Float64Array;

export interface WorstCaseOptions {
  /** Called after each solve with the number done and the planned total (the total can shrink as corners are shared). */
  onProgress?: (done: number, total: number) => void;
}

export interface WorstCaseResult {
  nominal: Float64Array;
  min: Float64Array;
  max: Float64Array;
  /** Deviation vectors at which each output's min / max was found. */
  minAt: Float64Array[];
  maxAt: Float64Array[];
  /** Sensitivity of output j to variable i: (y(+1) - y(-1)) / 2, row-major [i * outputs + j]; NaN if either end failed. */
  sensitivity: Float64Array;
  solves: number;
  /** Points that could not be solved (skipped). */
  failures: number;
}

export function worstCase(dimension: number, evaluate: Evaluate, options: WorstCaseOptions = {}): WorstCaseResult {
  const zero = new Float64Array(dimension);
  const nominal = evaluate(zero);
  const m = nominal.length;
  let solves = 1;
  let failures = 0;
  const min = Float64Array.from(nominal);
  const max = Float64Array.from(nominal);
  const minAt: Float64Array[] = Array.from({ length: m }, () => zero);
  const maxAt: Float64Array[] = Array.from({ length: m }, () => zero);
  const planned = 1 + 2 * dimension + 2 * m;
  const progress = () => options.onProgress?.(solves + failures, planned);

  const consider = (u: Float64Array, y: Float64Array) => {
    for (let j = 0; j < m; j++) {
      if (y[j] < min[j]) {
        min[j] = y[j];
        minAt[j] = u;
      }
      if (y[j] > max[j]) {
        max[j] = y[j];
        maxAt[j] = u;
      }
    }
  };
  const tryEvaluate = (u: Float64Array): Float64Array | undefined => {
    try {
      const y = evaluate(u);
      solves++;
      consider(u, y);
      return y;
    } catch {
      failures++;
      return undefined;
    } finally {
      progress();
    }
  };

  // Step 1: one variable at a time, to each end.
  const up: Array<Float64Array | undefined> = [];
  const down: Array<Float64Array | undefined> = [];
  for (let i = 0; i < dimension; i++) {
    for (const sign of [1, -1]) {
      const u = new Float64Array(dimension);
      u[i] = sign;
      (sign > 0 ? up : down).push(tryEvaluate(u));
    }
  }
  const sensitivity = new Float64Array(dimension * m);
  for (let i = 0; i < dimension; i++) {
    const yu = up[i];
    const yd = down[i];
    for (let j = 0; j < m; j++) sensitivity[i * m + j] = yu && yd ? (yu[j] - yd[j]) / 2 : NaN;
  }

  // Step 2: the corner each output's sensitivities point to, shared between outputs that agree.
  const corners = new Map<string, Float64Array>();
  for (let j = 0; j < m; j++) {
    for (const direction of [1, -1]) {
      const u = new Float64Array(dimension);
      for (let i = 0; i < dimension; i++) u[i] = bestEnd(nominal[j], up[i]?.[j], down[i]?.[j], direction);
      const key = u.join(',');
      if (!corners.has(key)) corners.set(key, u);
    }
  }
  const total = 1 + 2 * dimension + corners.size;
  const report = () => options.onProgress?.(solves + failures, total);
  for (const u of corners.values()) {
    try {
      const y = evaluate(u);
      solves++;
      consider(u, y);
    } catch {
      failures++;
    }
    report();
  }
  return { nominal, min, max, minAt, maxAt, sensitivity, solves, failures };
}

/**
 * Which end of one variable pushes an output furthest in `direction` (+1 up, -1 down): +1, -1, or 0
 * when neither end beats nominal by more than rounding (or both ends failed to solve).
 */
function bestEnd(y0: number, yUp: number | undefined, yDown: number | undefined, direction: number): number {
  const floor = 1e-12 * (1 + Math.abs(y0));
  const gainUp = yUp === undefined ? -Infinity : direction * (yUp - y0);
  const gainDown = yDown === undefined ? -Infinity : direction * (yDown - y0);
  if (Math.max(gainUp, gainDown) <= floor) return 0;
  return gainUp >= gainDown ? 1 : -1;
}
