import { describe, expect, it } from 'vitest';
import { buildCircuit, DEMO_BOARD_FILE, loadBoard, measureAll, readVoltage, solvePatiently, testPointsFor } from '../../src/board/index.js';
import { createDcSolver, solveDC, type DcSolution, type DcSolver } from '../../src/circuit/index.js';
import { applyFault, buildDictionary, faultsFor } from '../../src/diagnosis/index.js';
import { faultLink, NEAR_SHORT_OHMS } from '../../src/diagnosis/apply-fault.js';
import { OPEN_OHMS, SHORT_OHMS } from '../../src/diagnosis/board-edits.js';
import { faultyBoardReadings } from '../../src/diagnosis/faulty-board-readings.js';
import { ELSEWHERE_ITERATIONS, plainNewton, startOver } from '../../src/diagnosis/newton-attempt.js';
import { walkValue } from '../../src/diagnosis/value-walk.js';
import type { Board } from '../../src/schemas/board.js';
import type { Fault } from '../../src/diagnosis/fault.js';
import { tinyBoard } from './tiny-board.js';

/**
 * Two routes to one operating point (a walk or another start here, gmin or source stepping from
 * zero there) each stop anywhere within the solver's tolerance: they are asked to agree within
 * twice SPICE's default RELTOL (1e-3) and VNTOL (1 µV) (common practice).
 */
const agree = (a: number, b: number) => Math.abs(a - b) <= 2 * (1e-3 * Math.max(Math.abs(a), Math.abs(b)) + 1e-6);

const byId = (faults: Fault[], id: string) => {
  const f = faults.find((x) => x.id === id);
  if (!f) throw new Error(`no fault ${id}`);
  return f;
};

/** The healthy unknowns in this solver's order, zero where the solver has new ones (solve()'s warm start). */
function healthyStart(solver: DcSolver, healthy: DcSolution): Float64Array {
  return Float64Array.from(solver.compiled.unknownNames, (name) => healthy.unknowns?.[name] ?? 0);
}

/** Voltage readings of a board in a condition from a solver's unknowns. */
function readingsOf(board: Board, condition: string, solver: DcSolver, netNode: (net: string) => string): Record<string, number> {
  const v = (net: string) => {
    const i = solver.compiled.nodeIndex.get(netNode(net));
    return i === undefined ? 0 : solver.x[i];
  };
  return Object.fromEntries(testPointsFor(board, condition).map((tp) => [tp.id, v(tp.net) - v(tp.refNet ?? board.ground)]));
}

/** The board's readings solved from zero with every aid the solver has, as a check on the other routes. */
function fromScratch(board: Board, condition: string): Record<string, number> {
  const { circuit, netNode } = buildCircuit(board, condition);
  const s = solvePatiently(circuit);
  return Object.fromEntries(testPointsFor(board, condition).map((tp) => [tp.id, readVoltage(board, tp, netNode, s)]));
}

function expectAgreement(got: Record<string, number>, want: Record<string, number>) {
  const off = Object.keys(want).filter((id) => !agree(got[id], want[id]));
  expect(off.map((id) => `${id}: ${got[id]} vs ${want[id]}`)).toEqual([]);
  expect(Object.keys(got).sort()).toEqual(Object.keys(want).sort());
}

describe('faultLink: the one resistor a fault adds', () => {
  const board = tinyBoard();
  const faults = faultsFor(board);

  it('an opened pin: the tie on the faulty board, nearly healthy when it is nearly a short', () => {
    const fault = byId(faults, 'R1/open');
    const faulty = applyFault(board, fault);
    const link = faultLink(board, faulty, fault)!;
    const tie = faulty.parts.find((p) => p.ref === link.ref)!;
    expect(link.ohms).toBe(OPEN_OHMS);
    expect(link.nearHealthyOhms).toBe(NEAR_SHORT_OHMS);
    // The pin's own net first, then the net it left (board-edits.ts: openPin).
    expect(link.opened).toEqual([tie.pins['1'], 'div']);
    expect(faulty.parts.find((p) => p.ref === 'R1')!.pins['2']).toBe(tie.pins['1']);
  });

  it('a bridge: the link in parallel, nearly healthy when it is nearly open', () => {
    const fault = byId(faults, 'Q1/bridge/B-C');
    const link = faultLink(board, applyFault(board, fault), fault)!;
    expect(link.ohms).toBe(SHORT_OHMS);
    expect(link.nearHealthyOhms).toBe(OPEN_OHMS);
    expect(link.opened).toBeUndefined();
  });

  it('faults that add no single resistor have none', () => {
    for (const mode of ['reversed', 'wrong-value', 'output-stuck-high', 'rail-missing', 'rails-reversed']) {
      const fault = faults.find((f) => f.mode === mode)!;
      expect(fault, mode).toBeDefined();
      expect(faultLink(board, applyFault(board, fault), fault), fault.id).toBeUndefined();
    }
  });
});

describe('faults plain Newton cannot reach from the healthy point (demo board)', () => {
  const board = loadBoard(DEMO_BOARD_FILE);
  const faults = faultsFor(board);

  it('an open resistor is walked in from a near short and lands where a solve from zero does', () => {
    const fault = byId(faults, 'R6/open');
    const faulty = applyFault(board, fault);
    const link = faultLink(board, faulty, fault)!;
    const healthy = solveDC(buildCircuit(board, 'quiescent').circuit);
    const { circuit, netNode, partElements } = buildCircuit(faulty, 'quiescent');
    const solver = createDcSolver(circuit);
    const start = healthyStart(solver, healthy);
    // Without the walk this fault needs gmin stepping: plain Newton alone does not settle it.
    expect(plainNewton(solver, start)).toBe(false);
    const walked = walkValue(solver, solver.valueSetter(partElements[link.ref][0], 'value'), link.nearHealthyOhms, link.ohms, start);
    expect(walked.settled).toBe(true);
    const want = fromScratch(faulty, 'quiescent');
    expectAgreement(readingsOf(faulty, 'quiescent', solver, netNode), want);
    // The dictionary's route gives the same.
    expectAgreement(faultyBoardReadings(faulty, 'quiescent', healthy, link).readings, want);
  }, 30_000);

  it('a resistor short is walked in place from the healthy value and lands where a solve from zero does', () => {
    // R3 shorted under dc-below: plain Newton from the healthy point does not settle it.
    const condition = 'dc-below';
    const built = buildCircuit(board, condition);
    const solver = createDcSolver(built.circuit);
    solver.solveLean();
    const start = solver.x.slice();
    const element = built.partElements.R3[0];
    const healthyOhms = (built.circuit.elements.find((e) => e.name === element) as { value: number }).value;
    const shorted = (healthyOhms * SHORT_OHMS) / (healthyOhms + SHORT_OHMS);
    const set = solver.valueSetter(element, 'value');
    set(shorted);
    expect(plainNewton(solver, start)).toBe(false);
    expect(walkValue(solver, set, healthyOhms, shorted, start).settled).toBe(true);
    // The same circuit with the value written into the netlist, solved from zero.
    const copy = { ...built.circuit, elements: built.circuit.elements.map((e) => (e.name === element ? { ...e, value: shorted } : e)) };
    const s = solvePatiently(copy);
    const want = Object.fromEntries(testPointsFor(board, condition).map((tp) => [tp.id, readVoltage(board, tp, built.netNode, s)]));
    expectAgreement(readingsOf(board, condition, solver, built.netNode), want);
  }, 30_000);

  it('a dead amplifier settles from its own operating point under another condition', () => {
    const fault = byId(faults, 'U1/output-stuck-high/a');
    const faulty = applyFault(board, fault);
    expect(faultLink(board, faulty, fault)).toBeUndefined();
    const inQuiescent = faultyBoardReadings(faulty, 'quiescent', solveDC(buildCircuit(board, 'quiescent').circuit), undefined);
    expect(inQuiescent.unknowns).toBeDefined();
    const healthy = solveDC(buildCircuit(board, 'dc-below').circuit);
    const { circuit, netNode } = buildCircuit(faulty, 'dc-below');
    const solver = createDcSolver(circuit);
    const start = healthyStart(solver, healthy);
    expect(plainNewton(solver, start)).toBe(false);
    expect(plainNewton(solver, startOver(solver, start, inQuiescent.unknowns!), ELSEWHERE_ITERATIONS)).toBe(true);
    const want = fromScratch(faulty, 'dc-below');
    expectAgreement(readingsOf(faulty, 'dc-below', solver, netNode), want);
    expectAgreement(faultyBoardReadings(faulty, 'dc-below', healthy, undefined, undefined, () => inQuiescent.unknowns).readings, want);
    // Tried before the healthy start (as the dictionary does for a fault plain Newton did not settle
    // under the other condition either), it is the start that settles.
    const first = faultyBoardReadings(faulty, 'dc-below', healthy, undefined, undefined, () => inQuiescent.unknowns, undefined, undefined, true);
    expect(first.fromHealthy).toBe(false);
    expectAgreement(first.readings, want);
  }, 30_000);
});

describe('faults whose circuit is one already solved', () => {
  const board = loadBoard(DEMO_BOARD_FILE);
  const faults = faultsFor(board);

  it('an unpowered board has no op-amps in its circuit, so a dead amplifier reads exactly as healthy there', () => {
    // The premise of sharing readings between equal netlists: a solve depends on its netlist alone.
    const fault = byId(faults, 'U1/output-stuck-high/a');
    expect(measureAll(applyFault(board, fault), 'unpowered')).toEqual(measureAll(board, 'unpowered'));
    const dict = buildDictionary(board, { faults: [fault], conditions: ['unpowered'], bands: [] });
    expect(dict.hypotheses[1].predictions).toEqual(dict.hypotheses[0].predictions);
  }, 30_000);

  it('two decoupling capacitors on the same nets shorted give one circuit and one set of readings', () => {
    const [c1, c3] = [byId(faults, 'C1/short'), byId(faults, 'C3/short')];
    const conditions = ['quiescent'];
    const key = (f: Fault) => JSON.stringify(buildCircuit(applyFault(board, f), 'quiescent').circuit.elements);
    expect(key(c1)).toBe(key(c3));
    const dict = buildDictionary(board, { faults: [c1, c3], conditions, bands: [] });
    expect(dict.hypotheses[2].predictions).toEqual(dict.hypotheses[1].predictions);
    const healthy = solveDC(buildCircuit(board, 'quiescent').circuit);
    const direct = measureAll(applyFault(board, c3), 'quiescent', { initial: healthy });
    dict.observables.forEach((o, j) => expect(dict.hypotheses[2].predictions[j]).toBe(direct[o.testPoint]));
  }, 30_000);
});
