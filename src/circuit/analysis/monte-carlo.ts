import { createRng } from './prng.js';
import { drawDeviation, type Distribution } from './deviation.js';
import type { Evaluate } from './worst-case.js';

/**
 * Monte Carlo over normalised part deviations: N boards drawn at random (each variable from its own
 * distribution, see deviation.ts), every output read from each, and the spread summarised by
 * percentiles. Seeded: the same seed and the same variables give the same draws, sample by sample,
 * on any machine. A sample that cannot be solved at all is counted and left out; a reading the
 * evaluator returns as NaN (one circuit of the sample not solved) is left out of that reading's
 * statistics only, and counted in `missing`.
 */

export interface MonteCarloOptions {
  /** Number of boards drawn; default 1,000. */
  samples?: number;
  /** PRNG seed; default 1. */
  seed?: number;
  /** Lower and upper percentile of the reported interval, in %; default 0.5 and 99.5 (a 99 % interval). */
  interval?: [number, number];
  /** Called every `progressEvery` samples (default 50) and at the end. */
  onProgress?: (done: number, total: number) => void;
  progressEvery?: number;
}

export interface MonteCarloResult {
  samples: number;
  failures: number;
  /** Per output: samples whose reading was NaN (not solved) and left out. */
  missing: Uint32Array;
  seed: number;
  interval: [number, number];
  /** Per output: the interval's ends, the median, and the extremes seen. */
  low: Float64Array;
  high: Float64Array;
  median: Float64Array;
  min: Float64Array;
  max: Float64Array;
  mean: Float64Array;
  std: Float64Array;
}

export function monteCarlo(
  distributions: readonly Distribution[],
  evaluate: Evaluate,
  options: MonteCarloOptions = {},
): MonteCarloResult {
  const total = options.samples ?? 1000;
  if (!Number.isInteger(total) || total < 1) throw new RangeError(`samples must be a whole number ≥ 1, got ${total}`);
  const seed = options.seed ?? 1;
  const interval = options.interval ?? [0.5, 99.5];
  const every = options.progressEvery ?? 50;
  const rng = createRng(seed);
  const n = distributions.length;
  const rows: Float64Array[] = [];
  let failures = 0;
  for (let k = 0; k < total; k++) {
    // Draw the whole vector before solving so a failed sample does not shift later draws.
    const u = new Float64Array(n);
    for (let i = 0; i < n; i++) u[i] = drawDeviation(distributions[i], rng);
    try {
      rows.push(evaluate(u));
    } catch {
      failures++;
    }
    if (options.onProgress && ((k + 1) % every === 0 || k + 1 === total)) options.onProgress(k + 1, total);
  }
  if (rows.length === 0) throw new Error(`Monte Carlo: none of ${total} samples could be solved`);
  const m = rows[0].length;
  const out = {
    low: new Float64Array(m),
    high: new Float64Array(m),
    median: new Float64Array(m),
    min: new Float64Array(m),
    max: new Float64Array(m),
    mean: new Float64Array(m),
    std: new Float64Array(m),
  };
  const missing = new Uint32Array(m);
  const buffer = new Float64Array(rows.length);
  for (let j = 0; j < m; j++) {
    let count = 0;
    for (let k = 0; k < rows.length; k++) {
      const v = rows[k][j];
      if (Number.isNaN(v)) missing[j]++;
      else buffer[count++] = v;
    }
    const column = buffer.subarray(0, count);
    column.sort();
    if (count === 0) {
      for (const key of Object.keys(out) as Array<keyof typeof out>) out[key][j] = NaN;
      continue;
    }
    out.low[j] = percentile(column, interval[0]);
    out.high[j] = percentile(column, interval[1]);
    out.median[j] = percentile(column, 50);
    out.min[j] = column[0];
    out.max[j] = column[column.length - 1];
    let sum = 0;
    for (const v of column) sum += v;
    const mean = sum / column.length;
    let sq = 0;
    for (const v of column) sq += (v - mean) ** 2;
    out.mean[j] = mean;
    out.std[j] = column.length > 1 ? Math.sqrt(sq / (column.length - 1)) : 0;
  }
  return { samples: rows.length, failures, missing, seed, interval, ...out };
}

/** Percentile p (0..100) of sorted data, linear between order statistics (the common "type 7" rule). */
export function percentile(sorted: ArrayLike<number>, p: number): number {
  const h = (sorted.length - 1) * (p / 100);
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, sorted.length - 1);
  const a = sorted[lo];
  const b = sorted[hi];
  // An open circuit reads Infinity; interpolating towards it would give NaN or Infinity·0.
  if (a === b || !Number.isFinite(a) || !Number.isFinite(b)) return h - lo < 0.5 ? a : b;
  return a + (h - lo) * (b - a);
}
