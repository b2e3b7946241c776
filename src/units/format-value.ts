/**
 * Engineering notation for people: 4700 -> "4.7 kΩ", 1e-7 -> "100 nF", -11.93 -> "-11.9 V".
 * An ASCII minus is used so the text can be pasted back into any input that takes values.
 */
const PREFIXES: Array<[number, string]> = [
  [1e9, 'G'],
  [1e6, 'M'],
  [1e3, 'k'],
  [1, ''],
  [1e-3, 'm'],
  [1e-6, 'µ'],
  [1e-9, 'n'],
  [1e-12, 'p'],
];

/** The prefix a value is shown with at `significant` figures (rounding can carry 999.96 k up to 1 M). */
function prefixFor(value: number, significant: number): [number, string] {
  const magnitude = Math.abs(value);
  let [scale, prefix] = PREFIXES[PREFIXES.length - 1];
  for (const entry of PREFIXES) {
    if (magnitude >= entry[0] * 0.9995) {
      [scale, prefix] = entry;
      break;
    }
  }
  if (Number((magnitude / scale).toPrecision(significant)) >= 1000 && scale < 1e9) {
    [scale, prefix] = PREFIXES[PREFIXES.findIndex((p) => p[0] === scale) - 1];
  }
  return [scale, prefix];
}

export function formatValue(value: number, unit = '', significant = 3): string {
  if (!Number.isFinite(value)) return `${value > 0 ? '' : '-'}∞${unit ? ` ${unit}` : ''}`;
  if (value === 0) return `0${unit ? ` ${unit}` : ''}`;
  const [scale, prefix] = prefixFor(value, significant);
  const text = String(Number((value / scale).toPrecision(significant)));
  const sep = unit || prefix ? ' ' : '';
  return `${text}${sep}${prefix}${unit}`;
}

/**
 * Values read against each other — a band's edges and its nominal — with one prefix and one count of
 * decimals, so they line up: "-11.80 V to -11.75 V", not "-11.8 V to -11.75 V", where the dropped
 * zero makes one edge look coarser than the other. The largest value sets the prefix, and shows
 * `significant` figures; the others take its decimals. A value that is not finite is shown as
 * formatValue shows it, and a set whose largest value is below formatReading's floor as zeros.
 */
export function formatAligned(values: readonly number[], unit: string, significant: number): string[] {
  const top = Math.max(0, ...values.filter(Number.isFinite).map(Math.abs));
  if (top < readingFloor(unit)) return values.map((v) => formatReading(v, unit, significant));
  const [scale, prefix] = prefixFor(top, significant);
  const lead = Math.floor(Math.log10(Number((top / scale).toPrecision(significant)))) + 1;
  const decimals = Math.max(0, significant - lead);
  const sep = unit || prefix ? ' ' : '';
  return values.map((v) => {
    if (!Number.isFinite(v)) return formatValue(v, unit);
    const text = (v / scale).toFixed(decimals);
    // A value that rounds to zero is shown unsigned ("0.00", not "-0.00").
    return `${/^-0(\.0*)?$/.test(text) ? text.slice(1) : text}${sep}${prefix}${unit}`;
  });
}

/**
 * A reading or an expected value for the bench: four significant figures, as a handheld meter shows
 * a rail (11.77 V, not 11.8 V), and anything below 10 µV (or 1 mΩ) as a plain zero — solver
 * residue such as 2.5 pV is not something a meter can display.
 */
export function formatReading(value: number, unit: string, figures = 4): string {
  if (!Number.isFinite(value)) return formatValue(value, unit);
  if (Math.abs(value) < readingFloor(unit)) return formatValue(0, unit);
  return formatValue(value, unit, figures);
}

const readingFloor = (unit: string) => (unit === 'Ω' ? 1e-3 : 1e-5);

/**
 * A band's edges and nominal as every screen and report shows them: with the figures that keep the
 * edges apart (bandFigures), lined up (formatAligned). An open end is shown as formatValue shows it.
 */
export function formatBand(min: number, max: number, nominal: number, unit: string): { min: string; max: string; nominal: string } {
  const [lo, hi, centre] = formatAligned([min, max, nominal], unit, bandFigures(min, max));
  return { min: lo, max: hi, nominal: centre };
}

/** A band is shown to at least this many steps of its last digit, and with at most MOST_FIGURES figures. */
const BAND_STEPS = 4;
const MOST_FIGURES = 5;

/**
 * Significant figures that keep a band's edges apart: the fewest from `least` up to MOST_FIGURES at
 * which the band spans at least BAND_STEPS steps of the last digit. A rail band of 11.74 V to 11.80 V
 * shown to three figures reads "11.7 V to 11.8 V", and a reading of 11.70 V would look inside it.
 */
export function bandFigures(min: number, max: number, least = 3): number {
  const width = max - min;
  const top = Math.max(Math.abs(min), Math.abs(max));
  if (!(width > 0) || !Number.isFinite(width) || !(top > 0)) return least;
  for (let figures = least; figures < MOST_FIGURES; figures++) {
    const step = 10 ** (Math.floor(Math.log10(top)) - figures + 1);
    if (width >= BAND_STEPS * step) return figures;
  }
  return MOST_FIGURES;
}
