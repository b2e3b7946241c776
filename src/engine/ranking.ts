import { buildDictionary, dictionaryReady, rankSuspects, restrictDictionary } from '../diagnosis/index.js';
import { UserInputError } from '../errors.js';
import type { WalkContext } from './walk-context.js';
import type { WalkSetup } from './walk-machine.js';

type RankResult = ReturnType<typeof rankSuspects>;

export interface Ranking {
  suspects?: RankResult['suspects'];
  /** The ambiguity groups of the suspects shown, whole: every member and the group's whole probability. */
  groups?: RankResult['groups'];
  next?: RankResult['next'];
  /** Readings no single modelled fault explains, each as a sentence for the person (see diagnosis/unexplained.ts). */
  unexplained?: string[];
  /** Why there is no ranking, when there is none. */
  note?: string;
  /** "No fault" was left out because the walk concluded a fault. */
  faultPresent?: boolean;
}

/** Every reading of the walk so far, in the ranking's terms (board test point and condition ids). */
export function walkReadings(context: WalkContext): Array<{ testPoint: string; condition: string; value: number }> {
  return [
    // A hiss level is not a DC reading: the fault dictionary has nothing to compare it with.
    ...Object.values(context.readings)
      .filter((r) => r.band.kind !== 'noise')
      .map((r) => ({ testPoint: r.testPoint, condition: r.condition, value: r.value })),
    ...context.extraReadings,
  ];
}

/**
 * The ranked suspects for the readings so far, on the board as the person has it (substitutions
 * applied). `faultPresent` when the walk has concluded a fault: "no fault" is then no candidate.
 */
export function rankFor(walk: WalkSetup, context: WalkContext, faultPresent = false): Ranking {
  if (walk.options.ranking === false) return { note: 'ranking not asked for' };
  const readings = walkReadings(context);
  if (!readings.length) return { note: 'no readings yet, so no ranking of suspects' };
  try {
    // The dictionary covers the conditions this walk measures in (one build per tree and board), not every condition of the board.
    const conditions = [...new Set([...Object.values(walk.plans).flatMap((p) => (p.node.kind === 'measure' && p.condition && !p.skip ? [p.condition.id] : [])), ...readings.map((r) => r.condition)])];
    const board = walk.view.board;
    const whole = { substitutions: context.substitutions, diskCache: walk.options.diskCache };
    // The whole board's dictionary, once built (the terminal app builds it in the background, and
    // `voltwalk rank` keeps it on disk), holds these conditions' predictions too: cut them out rather
    // than solve them again here.
    const dictionary = dictionaryReady(board, whole) ? restrictDictionary(buildDictionary(board, whole), conditions) : undefined;
    const { suspects, groups, next, unexplained } = rankSuspects(board, readings, { substitutions: context.substitutions, conditions, dictionary, faultPresent });
    return { suspects, groups, next, faultPresent, ...(unexplained ? { unexplained: unexplained.map((u) => u.text) } : {}) };
  } catch (error) {
    // A ranking is advice beside the tree's conclusion; if it cannot be computed the walk still stands.
    if (error instanceof UserInputError) return { note: `no ranking: ${error.message.split('\n')[0]}` };
    throw error;
  }
}
