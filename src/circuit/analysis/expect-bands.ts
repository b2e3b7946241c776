/**
 * The healthy band of every test point, the number a technician compares a reading with.
 *
 * THE BAND SHOWN TO USERS
 *   nominal   the reading of a board built exactly to its part list (every part at its value,
 *             transistor gain and diode saturation current at their model values, op-amp offset 0).
 *   min, max  worst-case limits over every part's stated spread at once: the corner of the
 *             tolerance box that each test point's sensitivities point to, solved and checked,
 *             widened by any one-at-a-time end or any Monte Carlo board that reads further out
 *             (the circuit is nonlinear; a corner is verified, never assumed).
 *   mcLow, mcHigh  beside them, the 99 % interval (0.5th to 99.5th percentile) of a seeded Monte
 *             Carlo run of `samples` boards (default 1,000, seed 1): where nearly all real boards
 *             land. A reading outside min–max means a fault; a reading inside min–max but outside
 *             mcLow–mcHigh is possible from tolerances alone, but unlikely.
 * Spreads and distributions: see part-spreads.ts and deviation.ts (±t % is Gaussian with 3σ = t,
 * truncated, for passives and op-amp offset; uniform over the datasheet bin for transistor gain
 * and diode forward voltage).
 */
import type { Board } from '../../schemas/board.js';
import { UserInputError } from '../../errors.js';
import { withSubstitutions } from '../../board/index.js';
import { boardEvaluator } from './board-evaluator.js';
import { worstCase } from './worst-case.js';
import { monteCarlo } from './monte-carlo.js';

export interface Band {
  /** Test point id, e.g. "TP3". */
  id: string;
  /** Netlist node the red probe is on. */
  node: string;
  condition: string;
  nominal: number;
  min: number;
  max: number;
  unit: 'V' | 'Ω';
  /** Monte Carlo 99 % interval; absent when samples = 0. */
  mcLow?: number;
  mcHigh?: number;
}

export interface ExpectOptions {
  /** One condition id; every condition of the board when absent. */
  condition?: string;
  /** Parts replaced before the analysis (designator → value), e.g. { R7: '22k' }. */
  substitutions?: Record<string, number | string>;
  /** Monte Carlo boards; default 1,000; 0 skips Monte Carlo. */
  samples?: number;
  /** Monte Carlo seed; default 1. */
  seed?: number;
  /** Progress over the whole run (worst-case solves then Monte Carlo samples), for long runs. */
  onProgress?: (done: number, total: number, phase: 'worst-case' | 'monte-carlo') => void;
}

export interface ExpectReport {
  bands: Band[];
  /** Operating points solved in all. */
  solves: number;
  /** Deviation variables (parts and model parameters) taken into account. */
  variables: number;
  /** Worst-case points that could not be solved, plus Monte Carlo samples lost (for the reading that lost most). */
  failures: number;
  /** Test points with no band because the healthy board itself could not be solved there. */
  unsolved: Array<{ condition: string; testPoints: string[]; reason: string }>;
}

export function expectBands(board: Board, options: ExpectOptions = {}): Band[] {
  return expectReport(board, options).bands;
}

export function expectReport(board: Board, options: ExpectOptions = {}): ExpectReport {
  const samples = options.samples ?? 1000;
  if (!Number.isInteger(samples) || samples < 0) {
    throw new UserInputError({ code: 'expect.samples', path: 'samples', message: `samples must be a whole number ≥ 0, got ${samples}`, accepted: 'e.g. 1000, or 0 for worst case only' });
  }
  const seed = options.seed ?? 1;
  if (!Number.isInteger(seed)) {
    throw new UserInputError({ code: 'expect.seed', path: 'seed', message: `seed must be a whole number, got ${seed}`, accepted: 'e.g. 1 or 12345' });
  }
  const subject = options.substitutions && Object.keys(options.substitutions).length > 0 ? withSubstitutions(board, options.substitutions) : board;
  const conditions = options.condition === undefined ? subject.conditions.map((c) => c.id) : [checkCondition(subject, options.condition)];
  const ev = boardEvaluator(subject, conditions);
  const n = ev.deviations.length;
  const nominal = new Float64Array(ev.outputs.length);
  const min = new Float64Array(ev.outputs.length);
  const max = new Float64Array(ev.outputs.length);
  let failures = 0;
  ev.perCondition.forEach((pc) => {
    if (pc.outputs.length === 0) return;
    const wc = worstCase(n, pc.evaluate, { onProgress: (d, t) => options.onProgress?.(d, t, 'worst-case') });
    failures += wc.failures;
    pc.outputs.forEach((o, k) => {
      nominal[o] = wc.nominal[k];
      min[o] = wc.min[k];
      max[o] = wc.max[k];
    });
  });
  // After the worst case, so its bands are the same whether or not a Monte Carlo run follows.
  if (samples > 0) ev.predictStarts();
  const mc =
    samples > 0 && ev.outputs.length > 0
      ? monteCarlo(
          ev.deviations.map((d) => d.distribution),
          ev.evaluate,
          { samples, seed, onProgress: (d, t) => options.onProgress?.(d, t, 'monte-carlo') },
        )
      : undefined;
  if (mc) failures += mc.failures + mc.missing.reduce((a, b) => Math.max(a, b), 0);
  const bands = ev.outputs.map((o, j): Band => {
    const band: Band = { id: o.testPoint, node: o.node, condition: o.condition, nominal: nominal[j], min: min[j], max: max[j], unit: o.unit };
    if (mc && !Number.isNaN(mc.low[j])) {
      band.min = Math.min(band.min, mc.min[j]);
      band.max = Math.max(band.max, mc.max[j]);
      band.mcLow = mc.low[j];
      band.mcHigh = mc.high[j];
    }
    return band;
  });
  return { bands, solves: ev.solves(), variables: n, failures, unsolved: ev.unsolved };
}

function checkCondition(board: Board, condition: string): string {
  if (board.conditions.some((c) => c.id === condition)) return condition;
  throw new UserInputError({
    code: 'board.unknown-condition',
    path: 'condition',
    message: `no condition "${condition}" on board ${board.id}`,
    accepted: board.conditions.map((c) => c.id).join(', '),
  });
}
