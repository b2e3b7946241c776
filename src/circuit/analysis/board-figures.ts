import type { Board } from '../../schemas/board.js';
import { UserInputError } from '../../errors.js';
import { ConvergenceError } from '../errors.js';
import { roleCondition, roleTestPoint } from '../../board/index.js';
import { detectorTimeBand, type TimeBand } from './detector-times.js';
import { hissBand } from './hiss-band.js';
import { idleDraw } from './idle-draw.js';
import { toDbu } from './noise.js';
import { GAIN_FREQUENCY_HZ, signalGainDb } from './signal-gain.js';

/**
 * The board's expected figures beside its test-point readings, each worked out from the parts where
 * the board's roles say what to work it from, and left out where they do not (or the circuit will
 * not solve): what the supply delivers at rest, the detector's attack and release at both ends of
 * their knobs, the hiss at the makeup output (else the module output) at rest, and the gain a tone
 * on each condition's test signal sees to the module output.
 */
export interface FigureBand {
  nominal: number;
  min: number;
  max: number;
}

export interface BoardFigures {
  idleDraw?: { condition: string; rails: Array<{ rail: string; amps: number }> };
  /** 10–90 % times in seconds, with the knob at each end of its travel. */
  detector?: Record<'attack' | 'release', Record<'fastest' | 'slowest', FigureBand>>;
  /** Volts rms over 20 Hz–20 kHz. */
  hiss?: FigureBand & { testPoint: string; condition: string; dBu: number };
  /** Small-signal gain from each condition's test signal to the output, dB at `frequency` Hz (signal-gain.ts). */
  gain?: { testPoint: string; frequency: number; conditions: Array<{ condition: string; db: number }> };
}

export function boardFigures(board: Board): BoardFigures {
  const figures: BoardFigures = {};
  const rest = roleCondition(board, 'quiescent');
  if (rest) {
    const rails = unlessMissing(() => idleDraw(board, rest.id));
    if (rails) figures.idleDraw = { condition: rest.id, rails };
  }
  const detector = unlessMissing(() => {
    const end = (t: TimeBand): FigureBand => ({ nominal: t.nominal, min: t.min, max: t.max });
    const both = (which: 'attack' | 'release') => ({ fastest: end(detectorTimeBand(board, which, 'fastest')), slowest: end(detectorTimeBand(board, which, 'slowest')) });
    return { attack: both('attack'), release: both('release') };
  });
  if (detector) figures.detector = detector;
  const tp = roleTestPoint(board, 'makeup-output') ?? roleTestPoint(board, 'output');
  if (rest && tp) {
    const hiss = unlessMissing(() => hissBand(board, tp.id, rest.id));
    if (hiss) figures.hiss = { testPoint: tp.id, condition: rest.id, nominal: hiss.nominal, min: hiss.min, max: hiss.max, dBu: toDbu(hiss.nominal) };
  }
  const out = roleTestPoint(board, 'output') ?? roleTestPoint(board, 'makeup-output');
  if (out) {
    const conditions = board.conditions.flatMap((c) => {
      const db = unlessMissing(() => signalGainDb(board, c.id, out.id));
      return db === undefined || !Number.isFinite(db) ? [] : [{ condition: c.id, db }];
    });
    if (conditions.length) figures.gain = { testPoint: out.id, frequency: GAIN_FREQUENCY_HZ, conditions };
  }
  return figures;
}

/** A figure the board lacks the roles for, or whose circuit does not solve, is left out. */
function unlessMissing<T>(work: () => T): T | undefined {
  try {
    return work();
  } catch (error) {
    if (error instanceof UserInputError || error instanceof ConvergenceError) return undefined;
    throw error;
  }
}
