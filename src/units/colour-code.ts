import { UserInputError } from '../errors.js';

/**
 * IEC 60062 resistor colour code: digit, multiplier, tolerance and temperature-coefficient bands.
 * 3 bands: two digits and a multiplier (±20 %); 4 bands: two digits, multiplier, tolerance;
 * 5 bands: three digits, multiplier, tolerance; 6 bands: as 5 plus a temperature coefficient.
 */
export const COLOURS = ['black', 'brown', 'red', 'orange', 'yellow', 'green', 'blue', 'violet', 'grey', 'white', 'gold', 'silver'] as const;
export type Colour = (typeof COLOURS)[number];

const DIGIT: Partial<Record<Colour, number>> = {
  black: 0, brown: 1, red: 2, orange: 3, yellow: 4, green: 5, blue: 6, violet: 7, grey: 8, white: 9,
};

/** Multiplier as a power of ten. */
const MULTIPLIER_EXP: Partial<Record<Colour, number>> = { ...DIGIT, gold: -1, silver: -2 };

/** Tolerance bands (fraction). Orange and yellow tolerance bands are left out: sources disagree on them. */
const TOLERANCE: Partial<Record<Colour, number>> = {
  brown: 0.01, red: 0.02, green: 0.005, blue: 0.0025, violet: 0.001, grey: 0.0005, gold: 0.05, silver: 0.1,
};

/** Temperature coefficient bands, ppm/K (IEC 60062; figures from memory). */
const TEMPCO: Partial<Record<Colour, number>> = {
  black: 250, brown: 100, red: 50, orange: 15, yellow: 25, green: 20, blue: 10, violet: 5, grey: 1,
};

const ALIASES: Record<string, Colour> = { gray: 'grey', purple: 'violet' };

export function toColour(word: string): Colour | undefined {
  const w = word.trim().toLowerCase();
  const c = (ALIASES[w] ?? w) as Colour;
  return (COLOURS as readonly string[]).includes(c) ? c : undefined;
}

export interface BandReading {
  /** Ohms. */
  value: number;
  /** Fraction. */
  tolerance: number;
  tempcoPpm?: number;
  bands: Colour[];
}

const ACCEPTED_BANDS = '3 to 6 colour names, e.g. "yellow violet red gold" or "brown black black red brown"';

function bad(message: string): never {
  throw new UserInputError({ code: 'bands.invalid', message, accepted: ACCEPTED_BANDS });
}

/** Decodes a band sequence read from the part, first band (nearest an end) first. */
export function decodeBands(words: string[]): BandReading {
  const bands = words.map((w) => toColour(w) ?? bad(`"${w}" is not a band colour`));
  if (bands.length < 3 || bands.length > 6) bad(`${bands.length} bands`);
  const digitCount = bands.length <= 4 ? 2 : 3;
  let mantissa = 0;
  for (let i = 0; i < digitCount; i++) {
    const d = DIGIT[bands[i]];
    if (d === undefined) bad(`band ${i + 1} is ${bands[i]}, which is not a digit colour`);
    mantissa = mantissa * 10 + d;
  }
  const multiplier = MULTIPLIER_EXP[bands[digitCount]];
  if (multiplier === undefined) bad(`band ${digitCount + 1} is ${bands[digitCount]}, which is not a multiplier colour`);
  const tolBand = bands[digitCount + 1];
  const tolerance = tolBand === undefined ? 0.2 : TOLERANCE[tolBand];
  if (tolerance === undefined) bad(`band ${digitCount + 2} is ${tolBand}, which is not a tolerance colour`);
  let tempcoPpm: number | undefined;
  if (bands.length === 6) {
    tempcoPpm = TEMPCO[bands[5]];
    if (tempcoPpm === undefined) bad(`band 6 is ${bands[5]}, which is not a temperature-coefficient colour`);
  }
  const value = Number((mantissa * Math.pow(10, multiplier)).toPrecision(12));
  return { value, tolerance, tempcoPpm, bands };
}

const colourOfDigit = (d: number) => (Object.keys(DIGIT) as Colour[]).find((c) => DIGIT[c] === d)!;
const colourOfExp = (e: number) => (Object.keys(MULTIPLIER_EXP) as Colour[]).find((c) => MULTIPLIER_EXP[c] === e);

/**
 * The bands a person should see on a resistor of this value. Two significant figures (4 bands) for
 * ±5 % and wider, three (5 bands) for ±2 % and tighter, as is the usual practice; 6 bands when a
 * temperature coefficient is given. Returns undefined when the value cannot be coded that way.
 */
export function encodeBands(value: number, tolerance = 0.05, tempcoPpm?: number): Colour[] | undefined {
  if (!(value > 0) || !Number.isFinite(value)) return undefined;
  const digits = tolerance >= 0.05 && tempcoPpm === undefined ? 2 : 3;
  const exp = Math.floor(Math.log10(value) + 1e-9) - (digits - 1);
  const mantissa = Math.round(value / Math.pow(10, exp));
  if (Math.abs(mantissa * Math.pow(10, exp) - value) > value * 1e-6) return undefined;
  const multiplier = colourOfExp(exp);
  if (multiplier === undefined) return undefined;
  const tolColour = (Object.keys(TOLERANCE) as Colour[]).find((c) => Math.abs(TOLERANCE[c]! - tolerance) < 1e-9);
  const digitBands = String(mantissa).padStart(digits, '0').split('').map((d) => colourOfDigit(Number(d)));
  const bands: Colour[] = [...digitBands, multiplier];
  if (tolColour) bands.push(tolColour);
  else if (tolerance < 0.2) return undefined;
  if (tempcoPpm !== undefined) {
    const t = (Object.keys(TEMPCO) as Colour[]).find((c) => TEMPCO[c] === tempcoPpm);
    if (!t || !tolColour) return undefined;
    bands.push(t);
  }
  return bands;
}

/** Colour names for display; falls back to the 5-band form when 2 figures cannot hold the value. */
export function bandsFor(value: number, tolerance = 0.05): string[] {
  return encodeBands(value, tolerance) ?? encodeBands(value, Math.min(tolerance, 0.01)) ?? [];
}

export { DIGIT as DIGIT_OF, TOLERANCE as TOLERANCE_OF_BAND, MULTIPLIER_EXP as MULTIPLIER_EXP_OF, TEMPCO as TEMPCO_OF_BAND };
