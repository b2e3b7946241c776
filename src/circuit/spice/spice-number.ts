/**
 * Numbers as SPICE reads them: a decimal number, an optional scale suffix, then any letters,
 * which are ignored (so `10kohm`, `1uF` and `5V` read as 10e3, 1e-6 and 5).
 *
 * Scale suffixes are case-insensitive, as in SPICE:
 *   f 1e-15  p 1e-12  n 1e-9  u 1e-6  m 1e-3  k 1e3  meg 1e6  g 1e9  t 1e12  mil 25.4e-6
 * The classic trap: `M` and `m` both mean milli; mega is `MEG`. `1M` on a resistor is 1 mΩ.
 * Unlike the part-value reader in src/units, SPICE has no letter code: `4k7` reads as 4000
 * (the `7` is ignored as a unit), which is why the reader warns about it.
 */

export const ACCEPTED_SPICE_NUMBER =
  'a number with an optional SPICE scale suffix f p n u m k meg g t mil (case-insensitive; m is milli, meg is mega), e.g. 4.7k, 100n, 1meg, 2.2e-6, 10kohm';

const NUMBER = /^([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:e[+-]?\d+)?)([a-zµ]*)(.*)$/i;

// Powers of ten, applied to the decimal exponent so that 100n is exactly 1e-7 (multiplying by
// 1e-9 would give 1.0000000000000001e-7). mil is the one factor that is not a power of ten.
const SCALES: Array<[string, number]> = [
  // Longest first so "meg" and "mil" win over "m".
  ['meg', 6],
  ['mil', NaN],
  ['f', -15],
  ['p', -12],
  ['n', -9],
  ['u', -6],
  ['µ', -6],
  ['m', -3],
  ['k', 3],
  ['g', 9],
  ['t', 12],
];
const MIL = 25.4e-6;

export interface SpiceNumber {
  value: number;
  /** The scale suffix as written (lower case), if any. */
  suffix?: string;
  /** Letters after the number and suffix that SPICE ignores (a unit such as "ohm", "F", "V"). */
  ignored?: string;
}

/** Reads one SPICE number; undefined when the text is not one. */
export function readSpiceNumber(text: string): SpiceNumber | undefined {
  const match = NUMBER.exec(text.trim());
  if (!match) return undefined;
  const [, digits, letters, rest] = match;
  // Anything after the letters (a digit as in "4k7", a symbol) is not part of a SPICE number's
  // letters, but SPICE itself stops at the first non-letter and ignores the rest; we do the same
  // and report it as ignored so the caller can warn.
  const lower = letters.toLowerCase();
  let power = 0;
  let suffix: string | undefined;
  for (const [name, exponent] of SCALES) {
    if (lower.startsWith(name)) {
      power = exponent;
      suffix = name;
      break;
    }
  }
  const [mantissa, exponent = '0'] = digits.toLowerCase().split('e');
  const value = suffix === 'mil' ? Number(digits) * MIL : Number(`${mantissa}e${Number(exponent) + power}`);
  if (!Number.isFinite(value)) return undefined;
  const ignored = lower.slice(suffix?.length ?? 0) + rest;
  return { value, ...(suffix ? { suffix } : {}), ...(ignored ? { ignored } : {}) };
}

/** Formats a number so SPICE reads it back exactly (shortest round-trip form, no scale suffix). */
export function formatSpiceNumber(value: number): string {
  if (!Number.isFinite(value)) throw new RangeError(`not a finite number: ${value}`);
  return Object.is(value, -0) ? '-0' : String(value);
}
