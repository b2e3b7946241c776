import type { BoardModel, PartKind } from '../schemas/board.js';
import type { OpAmpParams } from '../circuit/netlist.js';

/**
 * What a board file may leave out, per part kind, and where each figure comes from.
 * Tolerances are fractions (0.01 = ±1 %).
 */
export const DEFAULT_TOLERANCE: Partial<Record<PartKind, number>> = {
  // Metal-film resistors, ±1 % (IEC 60062 letter F), are the usual kit resistor (common practice).
  resistor: 0.01,
  // Multilayer ceramic X7R or film, ±10 % (letter K) (common practice).
  capacitor: 0.1,
  // Aluminium electrolytics, ±20 % (letter M) (common practice).
  electrolytic: 0.2,
  // Small axial/radial inductors, ±10 % (common practice).
  inductor: 0.1,
  // Carbon-track potentiometers, ±20 % on the track resistance (common practice).
  pot: 0.2,
};

/** Default wiper position when neither the part nor the condition sets one: the middle of the track. */
export const DEFAULT_POT_POSITION = 0.5;

/**
 * Closed-contact resistance of a switch. Miniature toggle and slide switch datasheets commonly
 * give ≤ 20 mΩ initial contact resistance (from memory).
 */
export const SWITCH_CONTACT_RESISTANCE = 0.02;

/** Name of the op-amp model used when a part names none. */
export const DEFAULT_OPAMP_MODEL = 'TL072';
/** Name of the diode model used when a small-signal diode names none. */
export const DEFAULT_DIODE_MODEL = '1N4148';

/**
 * Built-in op-amp models, by name; a board's `opampModels` entry of the same name replaces one.
 * TL072, per amplifier, from the ST datasheet at ±15 V unless marked:
 *  - supply current 1.4 mA typical (2.5 mA max);
 *  - output swing ±13.5 V typical on ±15 V, i.e. ≈1.5 V headroom to each rail, taken as the same
 *    headroom on ±12 V (an inference: ≈±10.5 V swing);
 *  - input noise 15 nV/√Hz (TI's datasheet gives 18 nV/√Hz);
 *  - large-signal voltage gain 200 V/mV typical, input resistance 10¹² Ω, input offset 3 mV typical
 *    and 10 mV max, current noise 0.01 pA/√Hz (from memory, same datasheet);
 *  - output resistance 100 Ω (from memory: a usual open-loop figure for this class; not a datasheet line).
 * The nominal offset is 0: its sign varies part to part, so the typical magnitude is a spread, not a mean.
 */
export const BUILTIN_OPAMP_MODELS: Record<string, OpAmpParams & { vosMax: number; source: string }> = {
  TL072: {
    gain: 2e5,
    rout: 100,
    rin: 1e12,
    headroom: 1.5,
    iq: 1.4e-3,
    vos: 0,
    vosMax: 10e-3,
    en: 15e-9,
    in: 1e-14,
    source: 'ST TL072 datasheet (±15 V figures); rout from memory',
  },
};

/**
 * Built-in semiconductor models; a board's `models` entry of the same name replaces one.
 * 1N4148: the NXP SPICE model's IS, N and RS (about 0.61 V at 1 mA, 0.73 V at 10 mA);
 * BV 100 V is the datasheet's repetitive reverse voltage rating (from memory), not a measured knee.
 */
export const BUILTIN_MODELS: Record<string, BoardModel> = {
  '1N4148': {
    type: 'D',
    params: { IS: 4.352e-9, N: 1.906, RS: 0.6458, BV: 100, IBV: 1e-4 },
    source: 'NXP 1N4148 SPICE model (IS, N, RS); BV from the datasheet rating, from memory',
  },
};

/**
 * Plausible value ranges per kind: a value outside is a typo or a unit slip (1 kF, a 0 Ω resistor),
 * not a part anyone fits on a module board. Wide on purpose.
 */
export const VALUE_RANGE: Partial<Record<PartKind, { unit: 'Ω' | 'F' | 'H'; min: number; max: number }>> = {
  resistor: { unit: 'Ω', min: 1e-3, max: 1e9 },
  pot: { unit: 'Ω', min: 10, max: 1e8 },
  capacitor: { unit: 'F', min: 0.1e-12, max: 1e-3 },
  electrolytic: { unit: 'F', min: 0.1e-6, max: 1 },
  inductor: { unit: 'H', min: 1e-9, max: 10 },
};

/** Semiconductor kinds and the model type each needs. */
export const MODEL_TYPE: Partial<Record<PartKind, BoardModel['type']>> = {
  diode: 'D',
  zener: 'D',
  led: 'D',
  npn: 'NPN',
  pnp: 'PNP',
};
