import type { Part, PartKind } from '../schemas/board.js';

/**
 * Pin names per part kind. Fixed sets for everything except switches (whatever pins their positions
 * use) and connectors (any names: they are not simulated). The op-amp pinouts are the industry-standard
 * dual (8-pin) and quad (14-pin) DIP/SOIC layouts (common practice; e.g. the TL072/TL074 datasheets).
 */
export const FIXED_PINS: Partial<Record<PartKind, readonly string[]>> = {
  resistor: ['1', '2'],
  capacitor: ['1', '2'],
  inductor: ['1', '2'],
  electrolytic: ['+', '-'],
  diode: ['A', 'K'],
  zener: ['A', 'K'],
  led: ['A', 'K'],
  npn: ['C', 'B', 'E'],
  pnp: ['C', 'B', 'E'],
  'opamp-dual': ['1', '2', '3', '4', '5', '6', '7', '8'],
  'opamp-quad': ['1', '2', '3', '4', '5', '6', '7', '8', '9', '10', '11', '12', '13', '14'],
  pot: ['1', '2', '3'],
};

/**
 * Kinds that can be fitted the wrong way round: an orientation check looks at these and no others
 * (a ceramic capacitor or a resistor has no wrong way).
 */
export const POLARISED_KINDS: ReadonlySet<PartKind> = new Set<PartKind>(['electrolytic', 'diode', 'zener', 'led', 'npn', 'pnp', 'opamp-dual', 'opamp-quad', 'connector']);

/** One amplifier of a multi-amplifier package: its pins and the letter added to the element name. */
export interface AmplifierPins {
  suffix: string;
  plus: string;
  minus: string;
  out: string;
}

export interface OpAmpPackage {
  amplifiers: readonly AmplifierPins[];
  vPlus: string;
  vMinus: string;
}

export const OPAMP_PACKAGES: Partial<Record<PartKind, OpAmpPackage>> = {
  // 1 OUT A, 2 -IN A, 3 +IN A, 4 V-, 5 +IN B, 6 -IN B, 7 OUT B, 8 V+
  'opamp-dual': {
    amplifiers: [
      { suffix: 'a', plus: '3', minus: '2', out: '1' },
      { suffix: 'b', plus: '5', minus: '6', out: '7' },
    ],
    vPlus: '8',
    vMinus: '4',
  },
  // 1 OUT A, 2 -IN A, 3 +IN A, 4 V+, 5 +IN B, 6 -IN B, 7 OUT B, 8 OUT C, 9 -IN C, 10 +IN C, 11 V-, 12 +IN D, 13 -IN D, 14 OUT D
  'opamp-quad': {
    amplifiers: [
      { suffix: 'a', plus: '3', minus: '2', out: '1' },
      { suffix: 'b', plus: '5', minus: '6', out: '7' },
      { suffix: 'c', plus: '10', minus: '9', out: '8' },
      { suffix: 'd', plus: '12', minus: '13', out: '14' },
    ],
    vPlus: '4',
    vMinus: '11',
  },
};

/** Pin counts of the packages that are dual-in-line by default (for neighbouring-pin lists). */
export const DIP_PIN_COUNT: Partial<Record<PartKind, number>> = { 'opamp-dual': 8, 'opamp-quad': 14 };

/** The pins a switch's positions use, in first-seen order. */
export function switchPinsUsed(part: Part): string[] {
  const seen = new Set<string>();
  for (const pairs of Object.values(part.positions ?? {})) for (const [a, b] of pairs) seen.add(a).add(b);
  return [...seen];
}

/** Pins the part must have on a net; undefined for connectors (any pins, none required). */
export function requiredPins(part: Part): readonly string[] | undefined {
  if (part.kind === 'switch') return switchPinsUsed(part);
  return FIXED_PINS[part.kind];
}

/** Words for the accepted pin names of a part, for error messages. */
export function acceptedPinsText(part: Part): string {
  if (part.kind === 'connector') return 'any pin names';
  if (part.kind === 'switch') {
    const used = switchPinsUsed(part);
    return used.length ? `the pins its positions use: ${used.join(', ')}` : 'the pins named in its positions';
  }
  return `${part.kind} pins ${(FIXED_PINS[part.kind] ?? []).map((p) => `"${p}"`).join(', ')}`;
}
