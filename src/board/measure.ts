import type { Board, TestPoint } from '../schemas/board.js';
import { GROUND } from '../circuit/netlist.js';
import { solveDC, type DcOptions, type DcSolution } from '../circuit/index.js';
import { buildCircuit } from './build-circuit.js';
import { findCondition, testPointsFor } from './lookup.js';
import { DEFAULT_OHMMETER, METER_NODE, ohmmeterReading, type OhmmeterModel } from './ohmmeter.js';

export interface MeasureOptions {
  /** Warm start for the powered solve (a solution of the same board and condition, e.g. the nominal one). */
  initial?: DcSolution;
  /** Solver options passed through. */
  solve?: Omit<DcOptions, 'initial'>;
  /** Ohmmeter figures, for a meter unlike the default one (see ohmmeter.ts). */
  ohmmeter?: Partial<OhmmeterModel>;
}

const nodeVolts = (s: DcSolution, node: string) => (node === GROUND ? 0 : (s.nodes[node] ?? 0));

/** Voltage test point: V(net) − V(refNet) from a solution of the built circuit. */
export function readVoltage(board: Board, tp: TestPoint, netNode: (net: string) => string, s: DcSolution): number {
  return nodeVolts(s, netNode(tp.net)) - nodeVolts(s, netNode(tp.refNet ?? board.ground));
}

/** Resistance test point: the ohmmeter's reading from a solution of a circuit built with that meter. */
export function readResistance(board: Board, tp: TestPoint, netNode: (net: string) => string, s: DcSolution, meter: Partial<OhmmeterModel> = {}): number {
  const model = { ...DEFAULT_OHMMETER, ...meter };
  return ohmmeterReading(nodeVolts(s, METER_NODE), nodeVolts(s, netNode(tp.net)), nodeVolts(s, netNode(tp.refNet ?? board.ground)), model);
}

/**
 * What a meter would show at every test point that applies in a condition, by test point id:
 * volts when powered (one solve), ohms when unpowered (one solve per test point, the meter being
 * on one pair of nets at a time). Infinity means the meter shows overload (open circuit).
 * Throws ConvergenceError from the solver if a circuit cannot be solved.
 */
export function measureAll(board: Board, conditionId: string, options: MeasureOptions = {}): Record<string, number> {
  const condition = findCondition(board, conditionId);
  const points = testPointsFor(board, condition);
  const readings: Record<string, number> = {};
  if (points.length === 0) return readings;
  if (condition.powered) {
    const { circuit, netNode } = buildCircuit(board, condition.id);
    const s = solveDC(circuit, { ...options.solve, initial: options.initial });
    for (const tp of points) readings[tp.id] = readVoltage(board, tp, netNode, s);
    return readings;
  }
  for (const tp of points) {
    const { circuit, netNode } = buildCircuit(board, condition.id, { ohmmeter: { testPoint: tp.id, ...options.ohmmeter } });
    const s = solveDC(circuit, { ...options.solve });
    readings[tp.id] = readResistance(board, tp, netNode, s, options.ohmmeter);
  }
  return readings;
}
