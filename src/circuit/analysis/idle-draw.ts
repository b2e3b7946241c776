import type { Board } from '../../schemas/board.js';
import { buildCircuit, railSourceName, solvePatiently } from '../../board/index.js';

/**
 * What each rail supplies to the board under a condition, from the solved operating point: the size
 * of each rail source's current (SPICE's sense, into the + terminal through the source, differs in
 * sign between a positive and a negative rail; the draw is its size). Amps, in the board's rail order.
 */
export function idleDraw(board: Board, conditionId: string): Array<{ rail: string; amps: number }> {
  const solved = solvePatiently(buildCircuit(board, conditionId).circuit);
  return board.rails.map((r) => ({ rail: r.label, amps: Math.abs(solved.sourceCurrents[railSourceName(r.id)] ?? NaN) }));
}
