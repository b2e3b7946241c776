import { z } from 'zod';

/** The ranking's result, as `voltwalk rank --json` prints it and trees read it. */
export const SuspectSchema = z
  .object({
    /** Designator ("none" for the healthy board). */
    part: z.string(),
    /** Plain words: "open", "fitted backwards", "wrong value 47 kΩ (…)". */
    fault: z.string(),
    probability: z.number().min(0).max(1),
    /** Ambiguity group, numbered from 1 in order of probability. */
    group: z.number().int().positive(),
    why: z.string(),
    /** Machine name of the fault mode and the fault's unique id. */
    mode: z.string(),
    id: z.string(),
  })
  .strict();
export type Suspect = z.infer<typeof SuspectSchema>;

export const SuspectGroupSchema = z
  .object({
    group: z.number().int().positive(),
    probability: z.number().min(0).max(1),
    /** Fault ids in the group, most probable first. */
    members: z.array(z.string()),
    /** The same members in plain words, same order: "no fault", "LED1 fitted backwards". */
    labels: z.array(z.string()),
    parts: z.array(z.string()),
  })
  .strict();
export type SuspectGroup = z.infer<typeof SuspectGroupSchema>;

export const NextProbeSchema = z
  .object({
    testPoint: z.string(),
    condition: z.string(),
    expectedInformationBits: z.number(),
  })
  .strict();

/** A reading no candidate's prediction comes near (see unexplained.ts). */
export const UnexplainedSchema = z
  .object({
    testPoint: z.string(),
    condition: z.string(),
    value: z.number(),
    /** The hypothesis whose prediction came nearest, and that prediction. */
    nearest: z.object({ id: z.string(), predicted: z.number() }).strict(),
    text: z.string(),
  })
  .strict();
export type Unexplained = z.infer<typeof UnexplainedSchema>;

export const RankResultSchema = z
  .object({
    suspects: z.array(SuspectSchema),
    groups: z.array(SuspectGroupSchema),
    next: NextProbeSchema.optional(),
    /** Readings that fit no single modelled fault; absent when every reading fits some candidate. */
    unexplained: z.array(UnexplainedSchema).optional(),
    /** Entropy of the suspects now, in bits. */
    entropyBits: z.number(),
  })
  .strict();
export type RankResult = z.infer<typeof RankResultSchema>;
