import type { Board } from '../../schemas/board.js';
import { buildCircuit, findTestPoint, SIGNAL_SOURCE, solvePatiently } from '../../board/index.js';
import { createAcSolver } from '../ac-solver.js';
import { GROUND } from '../netlist.js';

/**
 * The small-signal gain from a condition's test signal to a test point, at the condition's own
 * operating point: a tone riding on the DC level sees this gain while the control voltage sits
 * where that level puts it. So, from one condition to another, it gives the VCA's attenuation at
 * each DC level (gain reduction) and the makeup stage's gain at each knob position. In dB, at a
 * spot frequency in the audio band (1 kHz), where the coupling capacitors are short circuits.
 * Undefined when the condition has no test signal.
 */
export const GAIN_FREQUENCY_HZ = 1000;

export function signalGainDb(board: Board, conditionId: string, testPointId: string): number | undefined {
  const condition = board.conditions.find((c) => c.id === conditionId);
  if (!condition?.powered || !condition.signal) return undefined;
  const tp = findTestPoint(board, testPointId);
  const { circuit, netNode } = buildCircuit(board, conditionId);
  const driven = { ...circuit, elements: circuit.elements.map((e) => (e.kind === 'vsource' && e.name === SIGNAL_SOURCE ? { ...e, ac: { mag: 1, phaseDeg: 0 } } : e)) };
  const nodes = createAcSolver(driven, { op: solvePatiently(circuit) }).solve(GAIN_FREQUENCY_HZ).nodes;
  const at = (net: string) => nodes[netNode(net)] ?? nodes[GROUND];
  const out = at(tp.net);
  const ref = at(tp.refNet ?? board.ground);
  return 20 * Math.log10(Math.hypot(out.re - ref.re, out.im - ref.im));
}
