/**
 * Monte Carlo of every test point of the bundled demo board: 1,000 boards, seed 1, all conditions
 * at once and one condition at a time. Target: ≤ 150 ms for the whole board on one core.
 * Reports medians of a few runs, the number of operating points solved, and where a solve's time
 * goes (compiling the circuit vs the Newton solve itself) so a miss can be read.
 */
import { existsSync } from 'node:fs';
import { DEMO_BOARD_FILE, bundledBoardFiles, buildCircuit, loadBoard, solvePatiently } from '../src/board/index.js';
import { boardEvaluator, monteCarlo } from '../src/circuit/analysis/index.js';
import { compileCircuit, createDcSolver } from '../src/circuit/index.js';
import { fmt, median, timeRuns } from './timing.js';

const SAMPLES = 1000;
const TARGET_MS = 150;

export async function run(): Promise<void> {
  const file = existsSync(DEMO_BOARD_FILE) ? DEMO_BOARD_FILE : bundledBoardFiles()[0];
  if (!file) {
    console.log('no bundled board found; nothing to measure');
    return;
  }
  const board = loadBoard(file);
  const conditions = board.conditions.map((c) => c.id);

  const t0 = performance.now();
  const ev = boardEvaluator(board, conditions);
  const setupMs = performance.now() - t0;
  const distributions = ev.deviations.map((d) => d.distribution);
  console.log(`board ${board.id}: ${ev.deviations.length} deviation variables, ${ev.outputs.length} readings over ${conditions.length} conditions`);
  console.log(`set-up (build + nominal solve of every circuit): ${fmt(setupMs)}`);

  // All conditions at once: one sample = one solve per circuit (a condition, or one ohmmeter placement).
  const before = ev.solves();
  let failures = 0;
  const first = performance.now();
  failures += monteCarlo(distributions, ev.evaluate, { samples: SAMPLES, seed: 1 }).failures;
  const firstMs = performance.now() - first;
  const solvesPerRun = ev.solves() - before;
  const repeats = firstMs > 20_000 ? 0 : firstMs > 5_000 ? 1 : 3;
  const times = [firstMs, ...timeRuns(() => void monteCarlo(distributions, ev.evaluate, { samples: SAMPLES, seed: 1 }), repeats, 0)];
  const all = median(times);
  console.log(
    `${SAMPLES} samples, all conditions: median ${fmt(all)} over ${times.length} run(s) ` +
      `(${solvesPerRun} solves, ${fmt(all / solvesPerRun)} per solve, ${failures} failed samples); ` +
      `target ${TARGET_MS} ms: ${(all / TARGET_MS).toFixed(1)}× the target`,
  );

  // One condition at a time (one run each: the sum is what a per-condition report costs).
  let sum = 0;
  for (const pc of ev.perCondition) {
    const t = performance.now();
    monteCarlo(distributions, pc.evaluate, { samples: SAMPLES, seed: 1 });
    const ms = performance.now() - t;
    sum += ms;
    console.log(`  ${pc.condition.padEnd(22)} ${fmt(ms)}`);
  }
  console.log(`  sum over conditions: ${fmt(sum)}`);

  // Where a solve's time goes, on the quiescent circuit (or the first powered one).
  const cond = board.conditions.find((c) => c.powered)?.id ?? conditions[0];
  const { circuit } = buildCircuit(board, cond);
  const nominal = solvePatiently(circuit);
  const compile = median(timeRuns(() => void compileCircuit(circuit), 30));
  const solver = createDcSolver(circuit);
  const warm = median(timeRuns(() => void solver.solve({ initial: nominal }), 30));
  console.log(
    `per solve on "${cond}" (${solver.compiled.size} unknowns): compile ${fmt(compile)}, warm-started solve on a compiled circuit ${fmt(warm)} ` +
      `(${solver.solve({ initial: nominal }).iterations} Newton iteration(s)). Every sample rebuilds its circuits' devices, because the ` +
      'compiled devices hold their values; the solve itself is the rest.',
  );
}
