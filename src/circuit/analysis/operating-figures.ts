import type { Board } from '../../schemas/board.js';
import { UserInputError } from '../../errors.js';
import { ConvergenceError } from '../errors.js';
import { buildCircuit, railSourceName, solvePatiently } from '../../board/index.js';

/**
 * Figures read straight off one solved operating point of the board under a condition.
 *
 * idleDraw: what each rail supplies, the size of each rail source's current (SPICE's sense, into
 * the + terminal through the source, differs in sign between a positive and a negative rail; the
 * draw is its size). Amps, in the board's rail order.
 *
 * ledCurrents: the forward current through each of these LEDs (anode to cathode). Amps.
 */
export function idleDraw(board: Board, conditionId: string): Array<{ rail: string; amps: number }> {
  const solved = solvePatiently(buildCircuit(board, conditionId).circuit);
  return board.rails.map((r) => ({ rail: r.label, amps: Math.abs(solved.sourceCurrents[railSourceName(r.id)] ?? NaN) }));
}

export function ledCurrents(board: Board, refs: string[], conditionId: string): Array<{ ref: string; amps: number }> {
  const { circuit, partElements } = buildCircuit(board, conditionId);
  const solved = solvePatiently(circuit);
  return refs.map((ref) => ({ ref, amps: solved.elements[(partElements[ref] ?? [])[0]]?.current ?? NaN }));
}

/**
 * A figure the board lacks the roles or parts for (UserInputError), or whose circuit does not solve
 * (ConvergenceError), is left out rather than stopping the report or the walk that asked for it.
 */
export function unlessUnavailable<T>(work: () => T): T | undefined {
  try {
    return work();
  } catch (error) {
    if (error instanceof UserInputError || error instanceof ConvergenceError) return undefined;
    throw error;
  }
}
