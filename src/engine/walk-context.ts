import { z } from 'zod';
import { HazardSchema, OutcomeSchema } from '../schemas/tree.js';

/**
 * Everything a walk remembers, kept JSON-plain so a session file round-trips it. The schema is
 * what a resumed session is checked against before it reaches the machine.
 */

export const ReadingRecordSchema = z
  .object({
    /** The board's test point id and condition id the reading was taken at. */
    testPoint: z.string(),
    condition: z.string(),
    /** As typed, and as parsed (SI). */
    text: z.string(),
    value: z.number(),
    band: z.object({ nominal: z.number(), min: z.number(), max: z.number(), unit: z.enum(['V', 'Ω']), kind: z.literal('noise').optional() }).strict(),
    outcome: OutcomeSchema,
    /** The branch the tree took. */
    branch: z.string(),
  })
  .strict();
export type ReadingRecord = z.infer<typeof ReadingRecordSchema>;

export const ExtraReadingSchema = z.object({ testPoint: z.string(), condition: z.string(), value: z.number() }).strict();
export type ExtraReading = z.infer<typeof ExtraReadingSchema>;

export const WalkContextSchema = z
  .object({
    treeId: z.string(),
    boardId: z.string(),
    /** Steps met so far, in order; the last is the current step. Skipped steps appear too. */
    trail: z.array(z.string()),
    readings: z.record(z.string(), ReadingRecordSchema),
    /** Choice ids for observe and inspect steps; "done" for acknowledged cautions and setups. */
    answers: z.record(z.string(), z.string()),
    /** Hazards whose caution was acknowledged in this session (going back does not forget them). */
    acknowledged: z.array(HazardSchema),
    /** Part values the person changed on the board: designator -> value. */
    substitutions: z.record(z.string(), z.union([z.string(), z.number()])),
    /** Steps passed over and why (the board lacks the role, no oscilloscope, the person skipped). */
    skipped: z.record(z.string(), z.string()),
    /** Readings taken off the tree's route (the ranking's suggested probe). */
    extraReadings: z.array(ExtraReadingSchema),
    /** Set when the runtime safety guard stopped the walk. */
    blocked: z.object({ node: z.string(), missing: z.array(HazardSchema) }).strict().nullable(),
  })
  .strict();
export type WalkContext = z.infer<typeof WalkContextSchema>;

export type WalkEvent =
  | { type: 'user.acknowledge' }
  | { type: 'user.reading'; value: number; text: string }
  | { type: 'user.answer'; choice: string }
  | { type: 'user.skip' }
  | { type: 'user.back' }
  | { type: 'user.substitute'; ref: string; value: number | string | null }
  | { type: 'user.probe'; testPoint: string; condition: string; value: number };

/** The state the walk goes to when the runtime safety guard refuses a powered step. */
export const SAFETY_HOLD = 'safety_hold';
