import type { Board } from '../../schemas/board.js';
import { UserInputError } from '../../errors.js';
import { buildCircuit, roleCondition, roleParts, roleStage, roleTestPoint } from '../../board/index.js';
import { outputNoise, type NoiseResult } from './noise.js';

/**
 * Expected output noise of the makeup stage with its gain control at a given position, for the
 * "noisy makeup gain" fault-finding: a stage much noisier than this has a noisy part (a crackling
 * pot track, a failing op-amp, a resistor far over value).
 *
 * Built from the board's roles: the makeup-gain-pot (its wiper set to `position`), the
 * makeup-output test point (the output node) and the makeup-stage stage (whose parts are the
 * noise sources, unless `wholeBoard` asks for every part on the board, upstream stages included).
 * The board is as in the given condition, else the board's quiescent condition.
 */
export interface MakeupNoiseOptions {
  /** Wiper position of the makeup-gain pot, 0..1. */
  position: number;
  condition?: string;
  /** Count every part on the board as a noise source, not only the makeup stage's. */
  wholeBoard?: boolean;
  frequency?: number;
  band?: [number, number];
}

export interface MakeupNoise extends NoiseResult {
  condition: string;
  /** The makeup-gain pot's designator and the position used. */
  pot: string;
  position: number;
  /** The test point and node the noise is read at. */
  testPoint: string;
  node: string;
}

export function makeupNoise(board: Board, options: MakeupNoiseOptions): MakeupNoise {
  const { position } = options;
  if (!(position >= 0 && position <= 1)) {
    throw new UserInputError({ code: 'noise.position', path: 'position', message: `makeup-gain position ${position} is outside the track`, accepted: 'a number from 0 to 1' });
  }
  const pot = roleParts(board, 'makeup-gain-pot')[0];
  const tp = roleTestPoint(board, 'makeup-output');
  const stage = roleStage(board, 'makeup-stage');
  const missing = !pot ? 'roles.parts["makeup-gain-pot"]' : !tp ? 'roles.testPoints["makeup-output"]' : !stage && !options.wholeBoard ? 'roles.stages["makeup-stage"]' : undefined;
  if (missing || !pot || !tp) {
    throw new UserInputError({
      code: 'board.missing-role',
      path: missing,
      message: `board ${board.id} does not say which part or point that is, so the makeup stage's noise cannot be worked out`,
      accepted: 'a board whose roles name the makeup-gain pot, the makeup-output test point and the makeup stage',
    });
  }
  const condition = options.condition ?? roleCondition(board, 'quiescent')?.id ?? board.conditions.find((c) => c.powered)?.id;
  if (condition === undefined) {
    throw new UserInputError({ code: 'board.no-powered-condition', path: 'conditions', message: `board ${board.id} has no powered condition`, accepted: 'a condition with "powered": true' });
  }
  const { circuit, partElements, netNode } = buildCircuit(board, condition);
  const potNames = new Set(partElements[pot.ref] ?? []);
  const elements = circuit.elements.map((e) => (e.kind === 'pot' && potNames.has(e.name) ? { ...e, position } : e));
  const sourceNames = options.wholeBoard ? undefined : new Set(stage!.parts.flatMap((ref) => partElements[ref] ?? []));
  const node = netNode(tp.net);
  const result = outputNoise(
    { ...circuit, elements },
    {
      output: node,
      reference: netNode(tp.refNet ?? board.ground),
      frequency: options.frequency,
      band: options.band,
      include: sourceNames ? (e) => sourceNames.has(e.name) : undefined,
    },
  );
  return { ...result, condition, pot: pot.ref, position, testPoint: tp.id, node };
}
