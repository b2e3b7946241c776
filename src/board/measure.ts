import type { Board, TestPoint } from '../schemas/board.js';
import { GROUND } from '../circuit/netlist.js';
import { ConvergenceError, solveDC, type Circuit, type DcOptions, type DcSolution } from '../circuit/index.js';
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

/**
 * Further attempts when a solve with the caller's options fails, cheapest first:
 *  1. patient limits — a board with a few dozen junctions and op-amps in loops (the bundled
 *     compressor's VCA and control path) can need over a thousand source-stepping iterations;
 *  2. the same with 1 nS across every junction (SPICE GMIN 1e-9 instead of 1e-12): the compressor
 *     unpowered with the ohmmeter on its −12 V rail settles to within 0.01 % of ngspice's answer this
 *     way but not with the default GMIN. 1 nS is a 1 GΩ shunt: ten times the ohmmeter's overload
 *     threshold, and ≈12 nA on a 12 V junction when powered.
 * Only a failed solve pays for these.
 */
export const FALLBACK_DC_OPTIONS: readonly DcOptions[] = [
  { maxIterations: 500, maxGminSteps: 200, maxSourceSteps: 300 },
  { maxIterations: 500, maxGminSteps: 200, maxSourceSteps: 300, gmin: 1e-9 },
];

/** solveDC, then the fallbacks in turn; the last ConvergenceError is thrown if none converges. */
export function solvePatiently(circuit: Circuit, options: DcOptions = {}): DcSolution {
  try {
    return solveDC(circuit, options);
  } catch (error) {
    if (!(error instanceof ConvergenceError)) throw error;
    return solveFallbacks(circuit, options, error);
  }
}

/** The fallbacks alone, each from zero, after `failed` (thrown again, or the last one's error, if none converges). */
export function solveFallbacks(circuit: Circuit, options: DcOptions, failed: ConvergenceError): DcSolution {
  let last: ConvergenceError = failed;
  for (const fallback of FALLBACK_DC_OPTIONS) {
    try {
      return solveDC(circuit, { ...options, ...fallback, initial: undefined });
    } catch (again) {
      if (!(again instanceof ConvergenceError)) throw again;
      last = again;
    }
  }
  throw last;
}

/** A circuit's node voltages by netlist node name, ground (and any node it lacks) at 0 V. */
export type NodeVolts = (node: string) => number;

const solutionVolts = (s: DcSolution): NodeVolts => (node) => (node === GROUND ? 0 : (s.nodes[node] ?? 0));

/** Voltage test point: V(net) − V(refNet). */
export function voltageReading(board: Board, tp: TestPoint, netNode: (net: string) => string, volts: NodeVolts): number {
  return volts(netNode(tp.net)) - volts(netNode(tp.refNet ?? board.ground));
}

/** Resistance test point: the ohmmeter's reading, in a circuit built with that meter. */
export function resistanceReading(board: Board, tp: TestPoint, netNode: (net: string) => string, volts: NodeVolts, meter: Partial<OhmmeterModel> = {}): number {
  const model = { ...DEFAULT_OHMMETER, ...meter };
  return ohmmeterReading(volts(METER_NODE), volts(netNode(tp.net)), volts(netNode(tp.refNet ?? board.ground)), model);
}

/** voltageReading from a solution of the built circuit. */
export function readVoltage(board: Board, tp: TestPoint, netNode: (net: string) => string, s: DcSolution): number {
  return voltageReading(board, tp, netNode, solutionVolts(s));
}

/** resistanceReading from a solution of a circuit built with that meter. */
export function readResistance(board: Board, tp: TestPoint, netNode: (net: string) => string, s: DcSolution, meter: Partial<OhmmeterModel> = {}): number {
  return resistanceReading(board, tp, netNode, solutionVolts(s), meter);
}

/**
 * What a meter would show at every test point that applies in a condition, by test point id:
 * volts when powered (one solve), ohms when unpowered (one solve per test point, the meter being
 * on one pair of nets at a time). Infinity means the meter shows overload (open circuit).
 * A solve that fails is tried again with FALLBACK_DC_OPTIONS; ConvergenceError if none converges.
 */
export function measureAll(board: Board, conditionId: string, options: MeasureOptions = {}): Record<string, number> {
  const condition = findCondition(board, conditionId);
  const points = testPointsFor(board, condition);
  const readings: Record<string, number> = {};
  if (points.length === 0) return readings;
  if (condition.powered) {
    const { circuit, netNode } = buildCircuit(board, condition.id);
    const s = solvePatiently(circuit, { ...options.solve, initial: options.initial });
    for (const tp of points) readings[tp.id] = readVoltage(board, tp, netNode, s);
    return readings;
  }
  for (const tp of points) {
    const { circuit, netNode } = buildCircuit(board, condition.id, { ohmmeter: { testPoint: tp.id, ...options.ohmmeter } });
    const s = solvePatiently(circuit, { ...options.solve });
    readings[tp.id] = readResistance(board, tp, netNode, s, options.ohmmeter);
  }
  return readings;
}
