import type { Board, Condition, Part, Stage, TestPoint } from '../schemas/board.js';
import type { ConditionRole, PartRole, StageRole, TestPointRole } from '../schemas/roles.js';
import { UserInputError } from '../errors.js';
import { didYouMean } from './shape-problems.js';

/** Finding things on a board by id or by role. Unknown ids are the caller's input, hence UserInputError. */

export function findCondition(board: Board, id: string): Condition {
  const c = board.conditions.find((x) => x.id === id);
  if (c) return c;
  const ids = board.conditions.map((x) => x.id);
  throw new UserInputError({
    code: 'board.unknown-condition',
    path: 'conditions',
    message: `board ${board.id} has no condition "${id}"${didYouMean(id, ids)}`,
    accepted: `one of ${ids.join(', ')}`,
  });
}

export function findTestPoint(board: Board, id: string): TestPoint {
  const t = board.testPoints.find((x) => x.id === id);
  if (t) return t;
  const ids = board.testPoints.map((x) => x.id);
  throw new UserInputError({
    code: 'board.unknown-test-point',
    path: 'testPoints',
    message: `board ${board.id} has no test point "${id}"${didYouMean(id, ids)}`,
    accepted: `one of ${ids.join(', ')}`,
  });
}

export function findPart(board: Board, ref: string): Part {
  const p = board.parts.find((x) => x.ref === ref);
  if (p) return p;
  const refs = board.parts.map((x) => x.ref);
  throw new UserInputError({
    code: 'board.unknown-part',
    path: 'parts',
    message: `board ${board.id} has no part "${ref}"${didYouMean(ref, refs)}`,
    accepted: 'a designator listed in the board file',
  });
}

/** The test point a role maps to on this board, or undefined when the board does not have the role. */
export function roleTestPoint(board: Board, role: TestPointRole): TestPoint | undefined {
  const id = board.roles.testPoints[role];
  return id === undefined ? undefined : board.testPoints.find((t) => t.id === id);
}

/** The parts a role maps to (empty when the board does not have the role). */
export function roleParts(board: Board, role: PartRole): Part[] {
  const refs = board.roles.parts[role] ?? [];
  return refs.map((r) => board.parts.find((p) => p.ref === r)).filter((p): p is Part => p !== undefined);
}

export function roleCondition(board: Board, role: ConditionRole): Condition | undefined {
  const id = board.roles.conditions[role];
  return id === undefined ? undefined : board.conditions.find((c) => c.id === id);
}

export function roleStage(board: Board, role: StageRole): Stage | undefined {
  const id = board.roles.stages[role];
  return id === undefined ? undefined : board.stages.find((s) => s.id === id);
}

/** The test points a meter can read in a condition: voltages when powered, resistances when not. */
export function testPointsFor(board: Board, condition: string | Condition): TestPoint[] {
  const c = typeof condition === 'string' ? findCondition(board, condition) : condition;
  const quantity = c.powered ? 'voltage' : 'resistance';
  return board.testPoints.filter((t) => t.quantity === quantity);
}

/** The stages that list a part (a dual op-amp can serve two). */
export function stagesOf(board: Board, ref: string): Stage[] {
  return board.stages.filter((s) => s.parts.includes(ref));
}
