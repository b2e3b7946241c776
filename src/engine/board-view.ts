import { roleCondition, roleParts, roleTestPoint, withSubstitutions } from '../board/index.js';
import { detectorTimeBand, expectBands, hissBand, idleDraw, ledCurrents, unlessUnavailable, type Band, type TimeBand } from '../circuit/analysis/index.js';
import type { Board, Condition, Part, TestPoint } from '../schemas/board.js';
import type { ConditionRole, PartRole, TestPointRole } from '../schemas/roles.js';
import type { ExpectedBand } from './outcome.js';

export type Substitutions = Record<string, number | string>;

/**
 * What a walk needs to know about its board: the parts, test points and conditions behind each
 * role, and the expected band at a test point for the current part values (memoised, because the
 * machine's guards and the step view ask for the same band more than once).
 */
export interface BoardView {
  board: Board;
  testPoint(role: TestPointRole): TestPoint | undefined;
  condition(role: ConditionRole): Condition | undefined;
  parts(role: PartRole): Part[];
  /**
   * Undefined when the board has no band there, or the circuit cannot be solved with these part
   * values. `quantity` "noise": the hiss band at a voltage test point (hiss-band.ts).
   */
  band(testPoint: string, condition: string, substitutions: Substitutions, quantity?: 'dc' | 'noise'): ExpectedBand | undefined;
  railVolts: number[];
  /**
   * What each rail supplies to the board at rest (its quiescent-role condition), amps, for the current
   * part values; undefined when the board names no quiescent condition or it cannot be solved.
   */
  idleDraw(substitutions: Substitutions): Array<{ rail: string; amps: number }> | undefined;
  /**
   * The current through each LED of a part role under a condition role, amps, for the current part
   * values; undefined when the board lacks the role or the condition, or it cannot be solved.
   */
  ledCurrents(role: PartRole, condition: ConditionRole, substitutions: Substitutions): Array<{ ref: string; amps: number }> | undefined;
  /** A detector time band for the current part values; undefined when the board lacks the parts' roles. */
  time(which: 'attack' | 'release', knob: 'fastest' | 'slowest', substitutions: Substitutions): TimeBand | undefined;
}

export interface BandOptions {
  /** Monte Carlo samples for the bands (the analysis module's default when absent). */
  samples?: number;
  seed?: number;
}

const views = new WeakMap<Board, Map<string, BoardView>>();

/**
 * One view per board object and band options: bands depend only on those and the substitutions,
 * so walks on the same board share the solved bands instead of solving them again.
 */
export function createBoardView(board: Board, options: BandOptions = {}): BoardView {
  const key = `${options.samples ?? ''}/${options.seed ?? ''}`;
  let byOptions = views.get(board);
  if (!byOptions) views.set(board, (byOptions = new Map()));
  let view = byOptions.get(key);
  if (!view) byOptions.set(key, (view = buildBoardView(board, options)));
  return view;
}

function buildBoardView(board: Board, options: BandOptions): BoardView {
  const memo = new Map<string, Band[]>();
  const bandsFor = (condition: string, substitutions: Substitutions): Band[] => {
    const key = `${condition}\u0000${substitutionsKey(substitutions)}`;
    let bands = memo.get(key);
    if (!bands) {
      // A changed part can leave the circuit unsolvable or invalid: the step then has no band
      // (the step view says so and refuses readings) rather than the walk crashing.
      bands = unlessUnavailable(() => expectBands(board, { condition, substitutions, samples: options.samples, seed: options.seed })) ?? [];
      memo.set(key, bands);
    }
    return bands;
  };
  // Each figure is worked out once per set of part values; one the board cannot give is undefined.
  const figures = new Map<string, unknown>();
  const once = <T>(key: string, work: () => T): T | undefined => {
    if (!figures.has(key)) figures.set(key, unlessUnavailable(work));
    return figures.get(key) as T | undefined;
  };
  const fitted = (substitutions: Substitutions) => withSubstitutions(board, substitutions);
  return {
    board,
    testPoint: (role) => roleTestPoint(board, role),
    condition: (role) => roleCondition(board, role),
    parts: (role) => roleParts(board, role),
    band: (testPoint, condition, substitutions, quantity = 'dc') => {
      if (quantity === 'noise') {
        return once(`hiss\u0000${testPoint}\u0000${condition}\u0000${substitutionsKey(substitutions)}`, (): ExpectedBand => {
          const { nominal, min, max, unit } = hissBand(fitted(substitutions), testPoint, condition);
          return { nominal, min, max, unit, kind: 'noise' };
        });
      }
      const found = bandsFor(condition, substitutions).find((b) => b.id === testPoint && b.condition === condition);
      return found && { nominal: found.nominal, min: found.min, max: found.max, unit: found.unit };
    },
    railVolts: board.rails.map((r) => r.volts),
    idleDraw: (substitutions) => {
      const condition = roleCondition(board, 'quiescent');
      return condition && once(`draw\u0000${substitutionsKey(substitutions)}`, () => idleDraw(fitted(substitutions), condition.id));
    },
    ledCurrents: (role, conditionRole, substitutions) => {
      const condition = roleCondition(board, conditionRole);
      const leds = roleParts(board, role).filter((p) => p.kind === 'led');
      if (!condition || !condition.powered || leds.length === 0) return undefined;
      return once(`leds\u0000${role}\u0000${condition.id}\u0000${substitutionsKey(substitutions)}`, () =>
        ledCurrents(fitted(substitutions), leds.map((p) => p.ref), condition.id),
      );
    },
    time: (which, knob, substitutions) => once(`time\u0000${which}\u0000${knob}\u0000${substitutionsKey(substitutions)}`, () => detectorTimeBand(fitted(substitutions), which, knob)),
  };
}

/** The same changes in any order give the same key. */
function substitutionsKey(substitutions: Substitutions): string {
  return JSON.stringify(Object.entries(substitutions).sort(([a], [b]) => a.localeCompare(b)));
}
