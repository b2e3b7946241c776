/**
 * Solver speed, for the README.
 *
 * 1. The bundled demo board, quiescent condition (a stand-in 60-node netlist when no board is
 *    bundled): median warm DC operating point; cold time from netlist text (parse + compile +
 *    solve); and the fault-dictionary workload — 300 operating points, one part changed each time
 *    (each resistor and pot in turn ×10, then ÷10), every one warm-started from the healthy point
 *    as the dictionary does — timed in voltwalk and in the reference simulator, ngspice 45 via
 *    eecircuit-engine 1.8.0, in-process, one netlist per operating point (an `alter` in a .control
 *    block returns no structured result through this package). ngspice gets the healthy point as
 *    `.nodeset`, the same head start; writing its netlists is not timed, only setNetList + runSim.
 *    Targets: ≤ 0.3 ms per warm operating point, and faster per operating point than the reference.
 * 2. A synthetic board-sized circuit (~80 nodes): compile + cold solve, kept-solver solves, AC.
 */
import { existsSync } from 'node:fs';
import { Simulation } from 'eecircuit-engine';
import { DEMO_BOARD_FILE, buildCircuit, loadBoard } from '../src/board/index.js';
import { createAcSolver, createDcSolver, solveDC, ledModel, ConvergenceError, type Circuit, type DcSolution, type Element } from '../src/circuit/index.js';
import { parseNetlist, writeNetlist } from '../src/circuit/spice/index.js';
import { fmt, median, timeRuns } from './timing.js';

const VARIANTS = Number(process.env.VOLTWALK_BENCH_VARIANTS ?? 300);
const WARM_TARGET_MS = 0.3;

/** The demo board under its quiescent condition, or the synthetic circuit when no board is bundled. */
function benchCircuit(): { label: string; circuit: Circuit } {
  if (existsSync(DEMO_BOARD_FILE)) {
    const board = loadBoard(DEMO_BOARD_FILE);
    return { label: `${board.name}, quiescent`, circuit: buildCircuit(board, 'quiescent').circuit };
  }
  return { label: 'synthetic 60-node stand-in', circuit: boardSizedCircuit(5) };
}

/** Each resistor and pot in turn ×10, then each ÷10, and round again, until `count` variants. */
function oneChangeVariants(circuit: Circuit, count: number): Circuit[] {
  const targets = circuit.elements.map((e, i) => [e, i] as const).filter(([e]) => e.kind === 'resistor' || e.kind === 'pot');
  const out: Circuit[] = [];
  for (let k = 0; out.length < count; k++) {
    const [element, index] = targets[k % targets.length];
    const factor = Math.floor(k / targets.length) % 2 === 0 ? 10 : 0.1;
    const changed = { ...element, value: (element as { value: number }).value * factor } as Element;
    const elements = circuit.elements.slice();
    elements[index] = changed;
    out.push({ ...circuit, elements });
  }
  return out;
}

async function ngspiceTimes(netlists: string[]): Promise<{ times: number[]; failures: number; start: number }> {
  const t0 = performance.now();
  const sim = new Simulation();
  await sim.start();
  const start = performance.now() - t0;
  // A first good run, so a failed run later cannot leave the engine without a result file.
  sim.setNetList('warm-up\nv1 1 0 1\nr1 1 0 1\n.op\n.end\n');
  await sim.runSim();
  const quiet = console.error;
  console.error = () => {}; // ngspice's notes go to stderr; printing them would be timed too
  const times: number[] = [];
  let failures = 0;
  try {
    for (const text of netlists) {
      const t = performance.now();
      sim.setNetList(text);
      await sim.runSim();
      times.push(performance.now() - t);
      if (sim.getError().some((l) => /^\s*error\b|interrupted|not parsed/i.test(l))) failures++;
    }
  } finally {
    console.error = quiet;
  }
  return { times, failures, start };
}

async function demoBoardTable(): Promise<void> {
  const { label, circuit } = benchCircuit();
  const solver = createDcSolver(circuit);
  const nominal = solver.solve();
  const nodes = Object.keys(nominal.nodes).length - 1;

  // Warm: a compiled solver, warm-started from the last answer, after JIT warm-up.
  const warm = median(timeRuns(() => void solver.solve({ initial: nominal }), 300, 20));
  const warmFresh = median(timeRuns(() => void solveDC(circuit, { initial: nominal }), 200, 20));
  // Cold: from netlist text — parse, compile, solve from zero.
  const text = writeNetlist(circuit);
  const firstT = performance.now();
  solveDC(parseNetlist(text).circuit);
  const first = performance.now() - firstT;
  const cold = median(timeRuns(() => void solveDC(parseNetlist(text).circuit), 50, 3));
  const parseOnly = median(timeRuns(() => void parseNetlist(text), 50, 3));

  // The fault-dictionary workload.
  const variants = oneChangeVariants(circuit, VARIANTS);
  const ours: number[] = [];
  let oursFailed = 0;
  let iterations = 0;
  for (const v of variants) {
    const t = performance.now();
    try {
      iterations += solveDC(v, { initial: nominal }).iterations;
    } catch (error) {
      if (!(error instanceof ConvergenceError)) throw error;
      oursFailed++;
    }
    ours.push(performance.now() - t);
  }
  // The same variants on one kept solver, the part's value written in place and put back after,
  // lean solve (what the tolerance analyses do per sample).
  const kept = createDcSolver(circuit);
  kept.solve();
  const start = kept.x.slice();
  const inPlace: number[] = [];
  let keptFailed = 0;
  for (let k = 0; k < variants.length; k++) {
    const changedIndex = variants[k].elements.findIndex((e, i) => e !== circuit.elements[i]);
    const before = circuit.elements[changedIndex] as { name: string; value: number };
    const after = variants[k].elements[changedIndex] as { value: number };
    const t = performance.now();
    kept.setValue(before.name, 'value', after.value);
    try {
      kept.solveLean({ start });
    } catch (error) {
      if (!(error instanceof ConvergenceError)) throw error;
      keptFailed++;
    }
    kept.setValue(before.name, 'value', before.value);
    inPlace.push(performance.now() - t);
  }
  const netlists = variants.map((v) => writeNetlist(v, { nodeset: nominal.nodes }));
  const ref = await ngspiceTimes(netlists);
  const sum = (xs: number[]) => xs.reduce((a, b) => a + b, 0);
  const oursMedian = median(ours);
  const refMedian = median(ref.times);

  console.log(`${label}: ${nodes} nodes, ${circuit.elements.length} elements, ${solver.compiled.size} unknowns; ${VARIANTS} one-part variants`);
  console.log('');
  console.log(`| measure | voltwalk | ngspice 45 (eecircuit-engine 1.8.0) | target |`);
  console.log(`|---|---|---|---|`);
  console.log(`| warm DC operating point (kept solver, warm start) | ${fmt(warm)} | — | ≤ ${WARM_TARGET_MS} ms ${warm <= WARM_TARGET_MS ? 'met' : 'missed'} |`);
  console.log(`| warm DC operating point (solveDC, compiles each time) | ${fmt(warmFresh)} | — | |`);
  console.log(`| cold: parse netlist + compile + solve from 0 V (median / first in process) | ${fmt(cold)} / ${fmt(first)} | — | |`);
  console.log(`| … of which parsing the netlist (${text.split('\n').length} lines) | ${fmt(parseOnly)} | — | |`);
  console.log(`| ${VARIANTS} operating points, one part changed each: median per point | ${fmt(oursMedian)} | ${fmt(refMedian)} | faster than the reference ${oursMedian < refMedian ? 'met' : 'missed'} |`);
  console.log(`| … total | ${fmt(sum(ours))} | ${fmt(sum(ref.times))} | |`);
  console.log(`| … points not solved | ${oursFailed} | ${ref.failures} | 0 |`);
  console.log(`| the same points on one kept solver, value set in place, lean solve: median per point | ${fmt(median(inPlace))} | — | |`);
  console.log(`| … total / not solved | ${fmt(sum(inPlace))} / ${keptFailed} | — | |`);
  console.log(`| ratio, reference / voltwalk, median per point | ${(refMedian / oursMedian).toFixed(1)}× | | |`);
  console.log(`| reference engine start (once per process) | — | ${fmt(ref.start)} | |`);
  console.log('');
  console.log(`(voltwalk: ${(iterations / Math.max(1, variants.length - oursFailed)).toFixed(1)} Newton iterations per variant on average)`);
}

export function boardSizedCircuit(stages = 6): Circuit {
  const op = { gain: 2e5, rout: 75, rin: 1e12, headroom: 1.5, iq: 1.4e-3, vos: 0, en: 0, in: 0 };
  const els: Element[] = [
    { kind: 'vsource', name: 'vpos', nodes: ['p12', '0'], dc: 12 },
    { kind: 'vsource', name: 'vneg', nodes: ['n12', '0'], dc: -12 },
    { kind: 'resistor', name: 'rfp', nodes: ['p12', 'vp'], value: 10 },
    { kind: 'resistor', name: 'rfn', nodes: ['n12', 'vn'], value: 10 },
    { kind: 'vsource', name: 'vin', nodes: ['in0', '0'], dc: 0.2 },
  ];
  for (let k = 0; k < stages; k++) {
    const p = (s: string) => `s${k}_${s}`;
    const input = k === 0 ? 'in0' : `s${k - 1}_out`;
    els.push(
      { kind: 'resistor', name: p('ri'), nodes: [input, p('m')], value: 10e3 },
      { kind: 'resistor', name: p('rf'), nodes: [p('m'), p('out')], value: 12e3 },
      { kind: 'opamp', name: p('u'), nodes: [p('bias'), p('m'), p('out'), 'vp', 'vn'], params: op },
      { kind: 'resistor', name: p('rb1'), nodes: ['vp', p('bias')], value: 100e3 },
      { kind: 'resistor', name: p('rb2'), nodes: [p('bias'), '0'], value: 1e3 },
      // rectifier to a smoothing node
      { kind: 'diode', name: p('d1'), nodes: [p('out'), p('rect')], model: 'd1n4148' },
      { kind: 'resistor', name: p('rr'), nodes: [p('rect'), '0'], value: 47e3 },
      { kind: 'capacitor', name: p('cr'), nodes: [p('rect'), '0'], value: 1e-6 },
      // differential pair with tail resistor
      { kind: 'resistor', name: p('rc1'), nodes: ['vp', p('c1')], value: 10e3 },
      { kind: 'resistor', name: p('rc2'), nodes: ['vp', p('c2')], value: 10e3 },
      { kind: 'bjt', name: p('q1'), nodes: [p('c1'), p('rect'), p('e')], model: 'qn' },
      { kind: 'bjt', name: p('q2'), nodes: [p('c2'), '0', p('e')], model: 'qn' },
      { kind: 'resistor', name: p('rt'), nodes: [p('e'), 'vn'], value: 22e3 },
      // pot-set threshold and an LED from the collector
      { kind: 'pot', name: p('vr'), nodes: ['vp', p('w'), '0'], value: 10e3, position: 0.3 + 0.1 * (k % 5), taper: k % 2 ? 'log' : 'linear' },
      { kind: 'resistor', name: p('rw'), nodes: [p('w'), p('c2')], value: 100e3 },
      { kind: 'resistor', name: p('rl'), nodes: [p('c1'), p('la')], value: 2.2e3 },
      { kind: 'diode', name: p('led'), nodes: [p('la'), 'vn'], model: 'led_red' },
      { kind: 'resistor', name: p('rx'), nodes: [p('out'), p('x')], value: 4.7e3 },
      { kind: 'resistor', name: p('ry'), nodes: [p('x'), '0'], value: 4.7e3 },
      { kind: 'capacitor', name: p('cx'), nodes: [p('x'), p('m')], value: 1e-9 },
    );
  }
  return {
    title: 'bench board',
    elements: els,
    models: {
      d1n4148: { name: 'd1n4148', type: 'D', params: { IS: 4.352e-9, N: 1.906, RS: 0.6458 } },
      qn: { name: 'qn', type: 'NPN', params: { IS: 6.7e-15, BF: 200, VAF: 75, RB: 10, IKF: 0.05, ISE: 1e-14, NE: 1.5 } },
      led_red: ledModel('red'),
    },
  };
}


export async function run(): Promise<void> {
  await demoBoardTable();
  console.log('');
  console.log('Synthetic board-sized circuits (solver internals):');
  await syntheticCircuits();
}

async function syntheticCircuits(): Promise<void> {
  for (const stages of [6, 9]) {
    const c = boardSizedCircuit(stages);
    const solver = createDcSolver(c);
    const op = solver.solve();
    const nodes = Object.keys(op.nodes).length - 1;
    const unknowns = solver.compiled.size;
    const cold = median(timeRuns(() => void createDcSolver(c).solve(), 30));
    const reuseCold = median(timeRuns(() => void solver.solve(), 50));
    // A slightly different board each time (one resistor nudged), warm-started from the nominal answer.
    const nudged = structuredClone(c);
    const r = nudged.elements.find((e) => e.name === 's2_rf');
    if (r && r.kind === 'resistor') r.value *= 1.3;
    const nudgedSolver = createDcSolver(nudged);
    const warm = median(timeRuns(() => void nudgedSolver.solve({ initial: op }), 200));
    const warmFresh = median(timeRuns(() => void solveDC(nudged, { initial: op }), 100));
    const iters = nudgedSolver.solve({ initial: op }).iterations;
    console.log(`${nodes} nodes, ${unknowns} unknowns, ${c.elements.length} elements`);
    console.log(`  compile + cold solve           ${fmt(cold)}  (${op.iterations} Newton iterations)`);
    console.log(`  cold solve, compiled solver     ${fmt(reuseCold)}`);
    console.log(`  warm solve, compiled solver     ${fmt(warm)}  (${iters} iterations)`);
    console.log(`  warm solveDC (compiles again)   ${fmt(warmFresh)}`);
    const withAc = structuredClone(c);
    const vin = withAc.elements.find((e) => e.name === 'vin');
    if (vin && vin.kind === 'vsource') vin.ac = { mag: 1, phaseDeg: 0 };
    const ac = createAcSolver(withAc, { op });
    let f = 10;
    const acPoint = median(timeRuns(() => void ac.solve((f = f * 1.01)), 100));
    console.log(`  AC, one frequency               ${fmt(acPoint)}`);
    console.log(`  ratio warm/cold (kept solver)   ${(warm / reuseCold).toFixed(2)}`);
  }
}
