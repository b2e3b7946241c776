import type { Board, PartKind } from '../schemas/board.js';

/**
 * The fault modes voltwalk models, which part kinds each applies to, and its prior weight.
 *
 * What the weights rest on (relative, per part; the ranking normalises them):
 *  - Field failures of analog boards are mostly opens and shorts of passive parts and of junctions
 *    (Bandler & Salama, "Fault diagnosis of analog circuits", Proc. IEEE 73(8), 1985, surveying
 *    field data). Opens outnumber shorts there.
 *  - On a freshly built kit, builders' tallies put, most frequent first: a part fitted wrongly
 *    (reversed diode, LED, transistor, electrolytic, IC), a bad or cold solder joint (an open), a
 *    solder bridge, a wrong value from a misread colour code (common practice; REFERENCES.md).
 * No published table gives these numbers; the weights only keep that order: "fitted wrongly" 3,
 * an open joint 2, a bridge or a misread value 1 (shared among its variants), a short inside a part
 * or a dead IC 0.5 or less. A board's `faultPriors` replaces any of them, keyed by mode id
 * ("reversed") or kind and mode ("electrolytic.reversed").
 */
export interface FaultMode {
  id: string;
  kinds: readonly (PartKind | 'rail')[];
  /** Relative prior weight per part (shared among the variants of a mode, e.g. misread values). */
  weight: number;
  /** Plain words, as in "R21 open". */
  words: string;
}

const PASSIVE2 = ['resistor'] as const;
const JUNCTIONS = ['diode', 'zener', 'led'] as const;
const TRANSISTORS = ['npn', 'pnp'] as const;
const OPAMPS = ['opamp-dual', 'opamp-quad'] as const;

export const FAULT_MODES = {
  // A cold or cracked joint, or a cracked body: the commonest failure of a passive part.
  open: { id: 'open', kinds: [...PASSIVE2, ...JUNCTIONS], weight: 2, words: 'open' },
  short: { id: 'short', kinds: [...PASSIVE2, ...JUNCTIONS, 'capacitor', 'electrolytic'], weight: 0.5, words: 'shorted' },
  // Every plausible misreading of the colour bands, weight shared among them.
  'wrong-value': { id: 'wrong-value', kinds: PASSIVE2, weight: 1, words: 'wrong value' },
  'wiper-open': { id: 'wiper-open', kinds: ['pot'], weight: 1, words: 'wiper open' },
  'track-open': { id: 'track-open', kinds: ['pot'], weight: 0.5, words: 'track open' },
  // Fitted wrongly: the most frequent build fault in builders' tallies.
  reversed: { id: 'reversed', kinds: [...JUNCTIONS, 'electrolytic', ...TRANSISTORS], weight: 3, words: 'fitted backwards' },
  'open-be': { id: 'open-be', kinds: TRANSISTORS, weight: 1, words: 'open base–emitter (emitter lead open)' },
  'open-bc': { id: 'open-bc', kinds: TRANSISTORS, weight: 1, words: 'open base–collector (collector lead open)' },
  'short-ce': { id: 'short-ce', kinds: TRANSISTORS, weight: 0.5, words: 'collector–emitter short' },
  'other-pinout': { id: 'other-pinout', kinds: TRANSISTORS, weight: 2, words: 'a type with another pinout fitted' },
  'output-floating': { id: 'output-floating', kinds: OPAMPS, weight: 0.3, words: 'dead, output floating' },
  'output-stuck-high': { id: 'output-stuck-high', kinds: OPAMPS, weight: 0.2, words: 'dead, output stuck at the positive rail' },
  'output-stuck-low': { id: 'output-stuck-low', kinds: OPAMPS, weight: 0.2, words: 'dead, output stuck at the negative rail' },
  rotated: { id: 'rotated', kinds: OPAMPS, weight: 3, words: 'fitted rotated (pin 1 at the wrong end)' },
  'missing-pos-supply': { id: 'missing-pos-supply', kinds: OPAMPS, weight: 1, words: 'positive supply pin not connected' },
  'missing-neg-supply': { id: 'missing-neg-supply', kinds: OPAMPS, weight: 1, words: 'negative supply pin not connected' },
  // Per pair of neighbouring pins.
  bridge: { id: 'bridge', kinds: [...OPAMPS, ...TRANSISTORS, 'connector'], weight: 0.5, words: 'solder bridge' },
  'rail-missing': { id: 'rail-missing', kinds: ['rail'], weight: 1, words: 'rail missing at the power header' },
  // A ribbon cable plugged in the wrong way round: a classic of this module format.
  'rails-reversed': { id: 'rails-reversed', kinds: ['rail'], weight: 2, words: 'power cable reversed' },
} as const satisfies Record<string, FaultMode>;

export type FaultModeId = keyof typeof FAULT_MODES;

/** The no-fault hypothesis's share of the prior: someone is looking for a fault, but readings may be fine. */
export const DEFAULT_NO_FAULT_PRIOR = 0.05;

/** A mode's weight on this board: "kind.mode" override, then "mode", then the catalogue. */
export function modeWeight(board: Board, kind: PartKind | 'rail', mode: FaultModeId): number {
  const overrides = board.faultPriors ?? {};
  return overrides[`${kind}.${mode}`] ?? overrides[mode] ?? FAULT_MODES[mode].weight;
}
