/**
 * IEC 60063 preferred number series. Kept as tables, not computed: E24 and below hold historic values
 * (27, 30, 33, 36, 39, 43, 47, 82) that rounding 10^(i/24) does not give.
 * Values are the mantissas of one decade, 100 <= m < 1000 (three significant figures for all series).
 */
export type SeriesName = 'E6' | 'E12' | 'E24' | 'E48' | 'E96';

const E6 = [100, 150, 220, 330, 470, 680];
const E12 = [100, 120, 150, 180, 220, 270, 330, 390, 470, 560, 680, 820];
const E24 = [
  100, 110, 120, 130, 150, 160, 180, 200, 220, 240, 270, 300, 330, 360, 390, 430, 470, 510, 560, 620, 680, 750, 820, 910,
];
const E48 = [
  100, 105, 110, 115, 121, 127, 133, 140, 147, 154, 162, 169, 178, 187, 196, 205, 215, 226, 237, 249, 261, 274, 287, 301,
  316, 332, 348, 365, 383, 402, 422, 442, 464, 487, 511, 536, 562, 590, 619, 649, 681, 715, 750, 787, 825, 866, 909, 953,
];
const E96 = [
  100, 102, 105, 107, 110, 113, 115, 118, 121, 124, 127, 130, 133, 137, 140, 143, 147, 150, 154, 158, 162, 165, 169, 174,
  178, 182, 187, 191, 196, 200, 205, 210, 215, 221, 226, 232, 237, 243, 249, 255, 261, 267, 274, 280, 287, 294, 301, 309,
  316, 324, 332, 340, 348, 357, 365, 374, 383, 392, 402, 412, 422, 432, 442, 453, 464, 475, 487, 499, 511, 523, 536, 549,
  562, 576, 590, 604, 619, 634, 649, 665, 681, 698, 715, 732, 750, 768, 787, 806, 825, 845, 866, 887, 909, 931, 953, 976,
];

export const E_SERIES: Readonly<Record<SeriesName, readonly number[]>> = { E6, E12, E24, E48, E96 };
export const SERIES_NAMES: readonly SeriesName[] = ['E6', 'E12', 'E24', 'E48', 'E96'];

export interface Preferred {
  /** The preferred value nearest on a logarithmic scale. */
  value: number;
  /** The neighbours at or below and at or above the given value. */
  below: number;
  above: number;
  /** (value - nearest) / nearest. */
  errorFraction: number;
}

function decadeOf(value: number): number {
  return Math.pow(10, Math.floor(Math.log10(value)) - 2);
}

/** Rounds away floating dust (4.7 * 1e3 = 4700.000000000001) so results compare as written. */
const clean = (x: number) => Number(x.toPrecision(6));

export function nearestPreferred(value: number, series: SeriesName): Preferred {
  if (!(value > 0) || !Number.isFinite(value)) throw new RangeError(`preferred values exist for positive numbers only, got ${value}`);
  const table = E_SERIES[series];
  const decade = decadeOf(value);
  const mantissa = value / decade;
  // Candidates span the decade boundary: the last value of the decade below and the first above.
  const candidates = [table[table.length - 1] / 10, ...table, 1000];
  let below = candidates[0];
  let above = candidates[candidates.length - 1];
  for (const c of candidates) {
    if (c <= mantissa * (1 + 1e-9)) below = c;
    if (c >= mantissa * (1 - 1e-9)) {
      above = c;
      break;
    }
  }
  const nearest = Math.abs(Math.log(mantissa / below)) <= Math.abs(Math.log(above / mantissa)) ? below : above;
  return {
    value: clean(nearest * decade),
    below: clean(below * decade),
    above: clean(above * decade),
    errorFraction: value / (nearest * decade) - 1,
  };
}

/** True when the value is a member of the series (to within 0.01 %, for values parsed from text). */
export function isPreferred(value: number, series: SeriesName): boolean {
  if (!(value > 0) || !Number.isFinite(value)) return false;
  return Math.abs(nearestPreferred(value, series).errorFraction) < 1e-4;
}
