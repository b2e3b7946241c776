/**
 * Solver speed on a board-sized circuit (~80 nodes: op-amp stages, a differential pair per
 * stage, rectifier diodes, LEDs, pots), the size the fault dictionary solves over and over.
 * Reports medians of: compile + cold solve, warm solve on a kept solver, warm solveDC that
 * recompiles each time (what a caller pays when every fault builds a fresh Circuit), and one AC
 * frequency point on a kept linearisation.
 */
import { createAcSolver, createDcSolver, solveDC, ledModel, type Circuit, type Element } from '../src/circuit/index.js';
import { fmt, median, timeRuns } from './timing.js';

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
