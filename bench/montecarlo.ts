/**
 * Monte Carlo of every test point of the bundled demo board: 1,000 boards, seed 1, all conditions
 * at once and one condition at a time. Target: ≤ 150 ms for the whole board on one core.
 * Reports medians of a few runs in wall time and in this process's CPU time (on a shared machine
 * the CPU time is the fairer figure), the number of operating points solved and samples lost,
 * and where a solve's time goes: compiling a circuit (paid once per circuit, not per sample: the
 * evaluator keeps one compiled solver per circuit and writes each sample's values into it), a
 * full warm solve, a lean warm solve, and the lean solve of a sample-sized change.
 */
import { existsSync } from 'node:fs';
import { DEMO_BOARD_FILE, bundledBoardFiles, buildCircuit, loadBoard, solvePatiently } from '../src/board/index.js';
import { boardEvaluator, monteCarlo, type Evaluate } from '../src/circuit/analysis/index.js';
import type { Distribution } from '../src/circuit/analysis/index.js';
import { compileCircuit, createDcSolver } from '../src/circuit/index.js';
import { fmt, median, timeRuns } from './timing.js';

const SAMPLES = Number(process.env.VOLTWALK_MC_SAMPLES ?? 1000);
const TARGET_MS = 150;

interface Run {
  wall: number;
  cpu: number;
  /** Samples lost: wholly (failures) or, for the reading that lost most, one circuit of the sample. */
  lost: number;
}

function measure(distributions: Distribution[], evaluate: Evaluate): Run {
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  const r = monteCarlo(distributions, evaluate, { samples: SAMPLES, seed: 1 });
  const wall = performance.now() - t0;
  const c = process.cpuUsage(c0);
  return { wall, cpu: (c.user + c.system) / 1000, lost: r.failures + r.missing.reduce((a, b) => Math.max(a, b), 0) };
}

export async function run(): Promise<void> {
  const file = existsSync(DEMO_BOARD_FILE) ? DEMO_BOARD_FILE : bundledBoardFiles()[0];
  if (!file) {
    console.log('no bundled board found; nothing to measure');
    return;
  }
  const board = loadBoard(file);
  const conditions = board.conditions.map((c) => c.id);

  const c0 = process.cpuUsage();
  const t0 = performance.now();
  const ev = boardEvaluator(board, conditions);
  ev.predictStarts();
  const setupMs = performance.now() - t0;
  const setupCpu = process.cpuUsage(c0);
  const setupSolves = ev.solves();
  const distributions = ev.deviations.map((d) => d.distribution);
  console.log(`board ${board.id}: ${ev.deviations.length} deviation variables, ${ev.outputs.length} readings over ${conditions.length} conditions`);
  // The set-up is paid once per analysis: building and compiling each circuit, its nominal solve,
  // and the secant solves that give every sample its predicted starting point.
  console.log(`set-up (build, nominal and secant solves of every circuit: ${setupSolves} solves): ${fmt(setupMs)} wall, ${fmt((setupCpu.user + setupCpu.system) / 1000)} CPU`);

  // All conditions at once: one sample = one solve per circuit (a condition, or one ohmmeter placement).
  const before = ev.solves();
  const runs = [measure(distributions, ev.evaluate)];
  const solvesPerRun = ev.solves() - before;
  const extra = runs[0].cpu > 20_000 ? 0 : 2;
  for (let i = 0; i < extra; i++) runs.push(measure(distributions, ev.evaluate));
  const wall = median(runs.map((r) => r.wall));
  const cpu = median(runs.map((r) => r.cpu));
  console.log(
    `${SAMPLES} samples, all conditions: median ${fmt(wall)} wall, ${fmt(cpu)} CPU over ${runs.length} run(s); ` +
      `${solvesPerRun} solves (${fmt(cpu / solvesPerRun)} CPU per solve), ${runs[0].lost} samples not solved (worst reading); ` +
      `target ${TARGET_MS} ms: ${(cpu / TARGET_MS).toFixed(0)}× the target in CPU time`,
  );

  // The least a sample can cost with this solver: every circuit started from its own answer, as a
  // perfect prediction would start it. At zero deviation the predicted start is the nominal answer,
  // so a sample there takes the shortest accepted solve (one Newton step found within tolerance,
  // then the convergence check at the new point), with the setters and readers a sample pays anyway.
  const zero = new Float64Array(distributions.length);
  const floorCpu = median(
    Array.from({ length: 3 }, () => {
      const f0 = process.cpuUsage();
      for (let k = 0; k < SAMPLES; k++) ev.evaluate(zero);
      const f = process.cpuUsage(f0);
      return (f.user + f.system) / 1000;
    }),
  );
  console.log(
    `floor: ${SAMPLES} samples each started from its own answer (a perfect prediction): median ${fmt(floorCpu)} CPU, ` +
      `${(floorCpu / TARGET_MS).toFixed(1)}× the target; the ${SAMPLES}-sample run above is ${(cpu / floorCpu).toFixed(1)}× this floor`,
  );

  // One condition at a time (one run each: the sum is what a per-condition report costs).
  let sum = 0;
  for (const pc of ev.perCondition) {
    const r = measure(distributions, pc.evaluate);
    sum += r.cpu;
    console.log(`  ${pc.condition.padEnd(22)} ${fmt(r.cpu)} CPU, ${r.lost} not solved`);
  }
  console.log(`  sum over conditions: ${fmt(sum)} CPU`);

  // Where a solve's time goes, on the first powered circuit.
  const cond = board.conditions.find((c) => c.powered)?.id ?? conditions[0];
  const { circuit } = buildCircuit(board, cond);
  const nominal = solvePatiently(circuit);
  const compile = median(timeRuns(() => void compileCircuit(circuit), 30));
  const solver = createDcSolver(circuit);
  const warm = median(timeRuns(() => void solver.solve({ initial: nominal }), 30));
  solver.solve({ initial: nominal });
  const start = solver.x.slice();
  const lean = median(timeRuns(() => void solver.solveLean({ start }), 30));
  // A sample-sized change: every resistor 1 % high, written in place.
  const resistors = circuit.elements.filter((e) => e.kind === 'resistor' && Number.isFinite(e.value) && e.value > 0);
  const setters = resistors.map((e) => [solver.valueSetter(e.name, 'value'), (e as { value: number }).value] as const);
  let flip = 1;
  const changed = median(
    timeRuns(() => {
      flip = flip === 1 ? 1.01 : 1;
      for (const [set, value] of setters) set(value * flip);
      solver.solveLean({ start });
    }, 30),
  );
  console.log(
    `per solve on "${cond}" (${solver.compiled.size} unknowns), wall: compile ${fmt(compile)} (once per circuit); warm-started ` +
      `from nominal, at nominal: full result ${fmt(warm)}, lean ${fmt(lean)}; every resistor 1 % off, written in place, lean: ${fmt(changed)}.`,
  );
}
