import { z } from 'zod';
import { ConditionRoleSchema, PartRoleSchema, TestPointRoleSchema } from './roles.js';

/**
 * A diagnostic tree: one JSON file per symptom in trees/. It names roles only (never a board's
 * designators) and carries no code: every decision is data the engine interprets. The shape is
 * checked here; src/engine/check-tree.ts checks meaning (references, cycles, roles some board
 * defines, and the safety gate). trees/README.md describes the format for contributors.
 */

export const TREE_FORMAT = 'voltwalk-tree/1';

export const HAZARDS = {
  'mains-supply': 'the bench supply or wall adapter is mains powered: keep it closed, dry and away from the probes',
  rails: 'the ±12 V rails are live: one slipped probe can short a rail and burn a part or a trace',
  'first-power-up-current-limit': 'first power-up: a current-limited supply set near the expected idle draw, so a short cannot cook the board',
  'charged-capacitors': 'the rail and detector capacitors keep a charge for a while after power is removed',
  'hot-parts': 'a shorted rail or a reversed part gets hot enough to burn a finger',
} as const;
export type Hazard = keyof typeof HAZARDS;
export const HazardSchema = z.enum(Object.keys(HAZARDS) as [Hazard, ...Hazard[]]);

export const NodeIdSchema = z.string().regex(/^[a-z][a-z0-9-]*$/, 'a lower-case node id such as check-rails');

/** Every prompt has two wordings: for a bench technician, and for a customer who has never held a probe. */
export const WordingSchema = z
  .object({
    technician: z.string().min(1),
    customer: z.string().min(1),
  })
  .strict();
export type Wording = z.infer<typeof WordingSchema>;

/** What a measure step can conclude about a reading against its expected band. */
export const OUTCOMES = ['in-band', 'low', 'high', 'stuck-at-rail', 'near-zero'] as const;
export const OutcomeSchema = z.enum(OUTCOMES);
export type Outcome = z.infer<typeof OutcomeSchema>;

export const CautionNodeSchema = z
  .object({
    kind: z.literal('caution'),
    /** The hazards this caution covers once acknowledged. */
    covers: z.array(HazardSchema).min(1),
    say: WordingSchema,
    next: NodeIdSchema,
  })
  .strict();

export const SetupNodeSchema = z
  .object({
    kind: z.literal('setup'),
    /** The board condition to set up (knobs, switches, test signal, power). */
    condition: ConditionRoleSchema,
    /** True when this step switches the module on: it is then gated like a powered measurement. */
    powered: z.boolean(),
    hazards: z.array(HazardSchema).default([]),
    say: WordingSchema,
    next: NodeIdSchema,
  })
  .strict();

export const MeasureNodeSchema = z
  .object({
    kind: z.literal('measure'),
    testPoint: TestPointRoleSchema,
    condition: ConditionRoleSchema,
    powered: z.boolean(),
    /**
     * "dc" (default): a DC voltage or a resistance on a multimeter. "noise": the hiss at a voltage
     * test point, rms over 20 Hz–20 kHz unweighted, read with an audio interface or AC
     * millivoltmeter (µV, mV or dBu); its band is the design's own hiss there (hiss-band.ts).
     */
    quantity: z.enum(['dc', 'noise']).default('dc'),
    /** Where a skipped measurement goes, when not the in-band branch (a skipped hiss level proves nothing). */
    skipTo: NodeIdSchema.optional(),
    /** Hazards a caution earlier on every path must have covered. */
    hazards: z.array(HazardSchema).default([]),
    say: WordingSchema,
    /** Where to go for each outcome; `default` catches any outcome not listed. A skipped step goes to `skipTo`, else `in-band`, else `default`. */
    branches: z
      .object({
        'in-band': NodeIdSchema.optional(),
        low: NodeIdSchema.optional(),
        high: NodeIdSchema.optional(),
        'stuck-at-rail': NodeIdSchema.optional(),
        'near-zero': NodeIdSchema.optional(),
        default: NodeIdSchema,
      })
      .strict(),
    /** Show the ranking's suggested next probe beside this step. */
    suggestProbe: z.boolean().default(false),
  })
  .strict();

export const ChoiceSchema = z
  .object({
    label: z.string().min(1),
    /** The label in customer wording, when it differs. */
    customerLabel: z.string().min(1).optional(),
    next: NodeIdSchema,
  })
  .strict();

export const ObserveNodeSchema = z
  .object({
    kind: z.literal('observe'),
    say: WordingSchema,
    /** Choice id -> label and next node; two choices make a yes/no question. */
    choices: z.record(NodeIdSchema, ChoiceSchema).refine((c) => Object.keys(c).length >= 2, 'at least two choices'),
    /** The instrument the question needs; an oscilloscope step names a multimeter-only alternative. */
    instrument: z.enum(['senses', 'multimeter', 'oscilloscope']).default('senses'),
    /** Where to go without that instrument, or when the person skips the question. */
    alternative: NodeIdSchema.optional(),
    /**
     * What the question should find, computed from the board's parts and shown beside it: the
     * detector's attack or release time (10–90 %) with its knob at the fast or slow end of its
     * travel, or which LEDs of a part role are lit under a condition (from their solved currents).
     */
    expect: z
      .union([
        z.object({ time: z.enum(['attack', 'release']), knob: z.enum(['fastest', 'slowest']) }).strict(),
        z.object({ leds: PartRoleSchema, condition: ConditionRoleSchema }).strict(),
      ])
      .optional(),
  })
  .strict()
  .refine((n) => n.instrument !== 'oscilloscope' || n.alternative !== undefined, {
    message: 'an oscilloscope step needs an "alternative" node for someone with only a multimeter',
    path: ['alternative'],
  });

export const INSPECTIONS = ['orientation', 'value-marking', 'solder', 'fitted'] as const;

export const InspectNodeSchema = z
  .object({
    kind: z.literal('inspect'),
    part: PartRoleSchema,
    look: z.enum(INSPECTIONS),
    say: WordingSchema,
    /** The part looks right / something is wrong with it. A skipped inspection goes to `ok`. */
    ok: NodeIdSchema,
    fault: NodeIdSchema,
  })
  .strict();

export const ConcludeNodeSchema = z
  .object({
    kind: z.literal('conclude'),
    /** One line: what the walk found. */
    title: z.string().min(1),
    /** Likely parts, most likely first. */
    parts: z.array(PartRoleSchema),
    /** What to do about it. */
    say: WordingSchema,
  })
  .strict();

export const TreeNodeSchema = z.discriminatedUnion('kind', [
  CautionNodeSchema,
  SetupNodeSchema,
  MeasureNodeSchema,
  ObserveNodeSchema,
  InspectNodeSchema,
  ConcludeNodeSchema,
]);

export const TreeSchema = z
  .object({
    format: z.literal(TREE_FORMAT),
    id: NodeIdSchema,
    /** One line, as a person would describe the trouble. */
    symptom: z.string().min(1).max(100),
    description: z.string().min(1),
    start: NodeIdSchema,
    nodes: z.record(NodeIdSchema, TreeNodeSchema),
  })
  .strict();

export type Tree = z.infer<typeof TreeSchema>;
export type TreeInput = z.input<typeof TreeSchema>;
export type TreeNode = z.infer<typeof TreeNodeSchema>;
export type CautionNode = z.infer<typeof CautionNodeSchema>;
export type SetupNode = z.infer<typeof SetupNodeSchema>;
export type MeasureNode = z.infer<typeof MeasureNodeSchema>;
export type ObserveNode = z.infer<typeof ObserveNodeSchema>;
export type InspectNode = z.infer<typeof InspectNodeSchema>;
export type ConcludeNode = z.infer<typeof ConcludeNodeSchema>;
export type Choice = z.infer<typeof ChoiceSchema>;
