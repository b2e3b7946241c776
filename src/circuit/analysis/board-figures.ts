import { z } from 'zod';
import type { Board } from '../../schemas/board.js';
import { roleCondition, roleTestPoint } from '../../board/index.js';
import { detectorTimeBand, type TimeBand } from './detector-times.js';
import { hissBand } from './hiss-band.js';
import { idleDraw, unlessUnavailable } from './operating-figures.js';
import { toDbu } from './noise.js';
import { GAIN_FREQUENCY_HZ, signalGainDb } from './signal-gain.js';

/**
 * The board's expected figures beside its test-point readings, each worked out from the parts where
 * the board's roles say what to work it from, and left out where they do not (or the circuit will
 * not solve): what the supply delivers at rest, the detector's attack and release at both ends of
 * their knobs, the hiss at the makeup output (else the module output) at rest, and the gain a tone
 * on each condition's test signal sees to the module output.
 */
const FigureBandSchema = z.object({ nominal: z.number(), min: z.number(), max: z.number() }).strict();
const KnobEndsSchema = z.object({ fastest: FigureBandSchema, slowest: FigureBandSchema }).strict();

/** The figures' one definition: the report prints them, `--json` writes them, and the disk cache checks its copy against it. */
export const BoardFiguresSchema = z
  .object({
    idleDraw: z.object({ condition: z.string(), rails: z.array(z.object({ rail: z.string(), amps: z.number() }).strict()) }).strict().optional(),
    /** 10–90 % times in seconds, with the knob at each end of its travel. */
    detector: z.object({ attack: KnobEndsSchema, release: KnobEndsSchema }).strict().optional(),
    /** Volts rms over 20 Hz–20 kHz; keys in the order boardFigures writes them, so a kept copy prints as a fresh one. */
    hiss: z.object({ testPoint: z.string(), condition: z.string(), nominal: z.number(), min: z.number(), max: z.number(), dBu: z.number() }).strict().optional(),
    /** Small-signal gain from each condition's test signal to the output, dB at `frequency` Hz (signal-gain.ts). */
    gain: z.object({ testPoint: z.string(), frequency: z.number(), conditions: z.array(z.object({ condition: z.string(), db: z.number() }).strict()) }).strict().optional(),
  })
  .strict();
export type BoardFigures = z.infer<typeof BoardFiguresSchema>;
export type FigureBand = z.infer<typeof FigureBandSchema>;

export function boardFigures(board: Board): BoardFigures {
  const figures: BoardFigures = {};
  const rest = roleCondition(board, 'quiescent');
  if (rest) {
    const rails = unlessUnavailable(() => idleDraw(board, rest.id));
    if (rails) figures.idleDraw = { condition: rest.id, rails };
  }
  const detector = unlessUnavailable(() => {
    const end = (t: TimeBand): FigureBand => ({ nominal: t.nominal, min: t.min, max: t.max });
    const both = (which: 'attack' | 'release') => ({ fastest: end(detectorTimeBand(board, which, 'fastest')), slowest: end(detectorTimeBand(board, which, 'slowest')) });
    return { attack: both('attack'), release: both('release') };
  });
  if (detector) figures.detector = detector;
  const tp = roleTestPoint(board, 'makeup-output') ?? roleTestPoint(board, 'output');
  if (rest && tp) {
    const hiss = unlessUnavailable(() => hissBand(board, tp.id, rest.id));
    if (hiss) figures.hiss = { testPoint: tp.id, condition: rest.id, nominal: hiss.nominal, min: hiss.min, max: hiss.max, dBu: toDbu(hiss.nominal) };
  }
  const out = roleTestPoint(board, 'output') ?? roleTestPoint(board, 'makeup-output');
  if (out) {
    const conditions = board.conditions.flatMap((c) => {
      const db = unlessUnavailable(() => signalGainDb(board, c.id, out.id));
      return db === undefined || !Number.isFinite(db) ? [] : [{ condition: c.id, db }];
    });
    if (conditions.length) figures.gain = { testPoint: out.id, frequency: GAIN_FREQUENCY_HZ, conditions };
  }
  return figures;
}
