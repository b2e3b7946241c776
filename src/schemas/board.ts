import { z } from 'zod';
import { ConditionRoleSchema, PartRoleSchema, StageRoleSchema, TestPointRoleSchema } from './roles.js';

/**
 * The board file: one JSON document describing a kit — its parts and nets, rails, test points,
 * controls, stages, named operating conditions and the roles diagnostic trees ask for.
 * This schema checks shape; src/board/validate.ts checks meaning (unknown nets, pin counts,
 * values a part kind cannot have) and reports every problem with its path.
 *
 * Nets are named by the part pins on them. A net must join two or more pins unless the board names
 * it elsewhere (a rail's net, a test point's net or refNet, a condition's signal net, the ground):
 * a net only one pin touches is otherwise reported as dangling. Net names may not start with "_"
 * (voltwalk's own nodes: the meter, the signal source) and may not differ only in letter case.
 */

export const BOARD_FORMAT = 'voltwalk-board/1';

/** A part value as a person writes it ("4k7", "100n", "2u2") or a plain SI number. */
export const ValueSchema = z.union([z.string().min(1), z.number()]);

export const PART_KINDS = [
  'resistor',
  'capacitor',
  'electrolytic',
  'inductor',
  'diode',
  'zener',
  'led',
  'npn',
  'pnp',
  'opamp-dual',
  'opamp-quad',
  'pot',
  'switch',
  'connector',
] as const;
export const PartKindSchema = z.enum(PART_KINDS);
export type PartKind = z.infer<typeof PartKindSchema>;

const PinPair = z.tuple([z.string(), z.string()]);

export const PartSchema = z
  .object({
    ref: z.string().regex(/^[A-Z]{1,3}[0-9]{1,3}$/, 'a designator such as R12, C3, U1, RV2, SW1'),
    kind: PartKindSchema,
    /** Resistance, capacitance or inductance (pots: the track). Semiconductors name a model instead. */
    value: ValueSchema.optional(),
    /** Fraction, e.g. 0.01 for 1 %. Defaults per kind are documented in src/board/defaults.ts. */
    tolerance: z.number().positive().max(1).optional(),
    /**
     * Model name (key of `models` or `opampModels`, or a built-in: 1N4148, TL072) for diodes, LEDs,
     * transistors and op-amps. Diodes default to 1N4148 and op-amps to TL072; the others must name one.
     */
    model: z.string().optional(),
    /** Pin name -> net name. Pin names per kind are fixed: see src/board/pins.ts. */
    pins: z.record(z.string(), z.string()),
    /** Plain-words location on the board, e.g. "left of the input jack". */
    where: z.string().min(1),
    /** Short name a person knows the part by, e.g. "Threshold" for a pot. */
    label: z.string().optional(),
    package: z.string().optional(),
    /** How to tell the part's orientation: "stripe = cathode", "flat side", "notch = pin 1". */
    orientation: z.string().optional(),
    /** Watts. */
    powerRating: z.number().positive().optional(),
    /** Pins that sit next to each other physically (solder-bridge candidates). DIP packages get theirs by default. */
    neighbours: z.array(PinPair).optional(),
    /** Pots: taper law; default linear. */
    taper: z.enum(['linear', 'log']).optional(),
    /** Pots: default wiper position 0..1 (pin 1 end = 0). Switches: default position name. */
    position: z.union([z.number().min(0).max(1), z.string()]).optional(),
    /** Switches: position name -> the pin pairs it connects. */
    positions: z.record(z.string(), z.array(PinPair)).optional(),
    /** Electrolytics and zeners: rated voltage (V). */
    voltageRating: z.number().positive().optional(),
  })
  .strict();
export type Part = z.infer<typeof PartSchema>;

export const ModelSchema = z
  .object({
    type: z.enum(['D', 'NPN', 'PNP']),
    params: z.record(z.string(), z.number()),
    /** Where the figures come from (datasheet, "from memory", "demo"). */
    source: z.string().optional(),
    /** Production spread used by tolerance analysis: parameter -> [min, max] multiplier of nominal. */
    spread: z.record(z.string(), z.tuple([z.number().positive(), z.number().positive()])).optional(),
  })
  .strict();
export type BoardModel = z.infer<typeof ModelSchema>;

/** Op-amp figures per amplifier; any left out are the built-in TL072's (src/board/defaults.ts). */
export const OpAmpModelSchema = z
  .object({
    gain: z.number().positive().optional(),
    rout: z.number().nonnegative().optional(),
    rin: z.number().positive().optional(),
    headroom: z.number().nonnegative().optional(),
    iq: z.number().nonnegative().optional(),
    vos: z.number().optional(),
    /** Worst-case input offset (V), for tolerance analysis. */
    vosMax: z.number().nonnegative().optional(),
    en: z.number().nonnegative().optional(),
    in: z.number().nonnegative().optional(),
    source: z.string().optional(),
  })
  .strict();
export type BoardOpAmpModel = z.infer<typeof OpAmpModelSchema>;

export const RailSchema = z
  .object({
    id: z.string().min(1),
    label: z.string().min(1),
    /** Net where the supply connects (the header side, before any protection). */
    net: z.string().min(1),
    volts: z.number(),
  })
  .strict();
export type Rail = z.infer<typeof RailSchema>;

/** How easy a test point is to reach: a pad beats a leg beats an IC pin beats a header or jack contact. */
export const AccessSchema = z.enum(['pad', 'leg', 'ic-pin', 'header', 'jack']);
export type Access = z.infer<typeof AccessSchema>;

export const TestPointSchema = z
  .object({
    id: z.string().regex(/^TP[0-9]{1,3}$/, 'a test point id such as TP3'),
    label: z.string().min(1),
    net: z.string().min(1),
    /** The net the black probe goes to; ground by default. */
    refNet: z.string().optional(),
    quantity: z.enum(['voltage', 'resistance']).default('voltage'),
    /** Where the red and black probes go, in plain words. */
    probe: z.string().min(1),
    access: AccessSchema,
    stage: z.string().optional(),
  })
  .strict();
export type TestPoint = z.infer<typeof TestPointSchema>;

export const StageSchema = z
  .object({
    id: z.string().min(1),
    label: z.string().min(1),
    parts: z.array(z.string()),
  })
  .strict();
export type Stage = z.infer<typeof StageSchema>;

export const SignalSchema = z
  .object({
    /** Net the DC level is applied to (ground return implied). */
    net: z.string().min(1),
    volts: z.number(),
    /** Output resistance of whatever supplies the level, in ohms. */
    sourceResistance: z.number().nonnegative().default(0),
    /** How to make the level at the bench, in plain words. */
    how: z.string().min(1),
  })
  .strict();

export const ConditionSchema = z
  .object({
    id: z.string().regex(/^[a-z][a-z0-9-]*$/, 'a lower-case id such as dc-inject-high'),
    label: z.string().min(1),
    powered: z.boolean(),
    /** What the person sets up, in plain words. */
    instructions: z.string().min(1),
    /** Pot positions (0..1) and switch positions by designator; unset controls stay at their default. */
    settings: z.record(z.string(), z.union([z.number().min(0).max(1), z.string()])).default({}),
    signal: SignalSchema.optional(),
  })
  .strict();
export type Condition = z.infer<typeof ConditionSchema>;

export const RolesSchema = z
  .object({
    stages: z.partialRecord(StageRoleSchema, z.string()).default({}),
    testPoints: z.partialRecord(TestPointRoleSchema, z.string()).default({}),
    parts: z.partialRecord(PartRoleSchema, z.array(z.string()).min(1)).default({}),
    conditions: z.partialRecord(ConditionRoleSchema, z.string()).default({}),
  })
  .strict();
export type Roles = z.infer<typeof RolesSchema>;

export const BoardSchema = z
  .object({
    format: z.literal(BOARD_FORMAT),
    id: z.string().regex(/^[a-z][a-z0-9-]*$/),
    name: z.string().min(1),
    description: z.string().min(1),
    /** Notes a builder needs: how to make the DC injection level, what the kit expects. */
    notes: z.array(z.string()).default([]),
    /** The ground net; "gnd" by convention. */
    ground: z.string().default('gnd'),
    rails: z.array(RailSchema).min(1),
    models: z.record(z.string(), ModelSchema).default({}),
    opampModels: z.record(z.string(), OpAmpModelSchema).default({}),
    parts: z.array(PartSchema).min(1),
    testPoints: z.array(TestPointSchema).min(1),
    stages: z.array(StageSchema).min(1),
    conditions: z.array(ConditionSchema).min(1),
    roles: RolesSchema,
    /** Overrides of the fault-mode priors (fault mode -> relative weight). */
    faultPriors: z.record(z.string(), z.number().nonnegative()).optional(),
  })
  .strict();
export type Board = z.infer<typeof BoardSchema>;
export type BoardInput = z.input<typeof BoardSchema>;
