import { COLOURS, decodeBands, encodeBands, type Colour } from '../units/index.js';

const DIGITS: readonly Colour[] = COLOURS.slice(0, 10);
/** Multiplier colours in order of their power of ten: silver 10⁻², gold 10⁻¹, black 10⁰ … white 10⁹. */
const MULTIPLIERS: readonly Colour[] = ['silver', 'gold', ...DIGITS];

export interface Misread {
  value: number;
  /** The band read wrongly, 1-based, and the colours involved. */
  band: number;
  meant: Colour;
  read: Colour;
}

/**
 * The values a person fits when they misread one band of the intended resistor for a neighbouring
 * colour of the code (brown/red/orange, blue/violet/grey …, gold/silver in the multiplier), the
 * commonest way a wrong value reaches a kit (common practice). A neighbouring multiplier colour is a
 * decade error. Codes per IEC 60062 via src/units. Returns distinct values other than the intended one.
 */
export function colourMisreads(value: number, tolerance: number): Misread[] {
  const bands = encodeBands(value, tolerance) ?? encodeBands(value, Math.min(tolerance, 0.01));
  if (!bands) return [];
  const digitCount = bands.length <= 4 ? 2 : 3;
  const found = new Map<number, Misread>();
  const swap = (index: number, palette: readonly Colour[]) => {
    const at = palette.indexOf(bands[index]);
    for (const step of [-1, 1]) {
      const read = palette[at + step];
      if (!read || (index === 0 && read === 'black')) continue;
      const changed = bands.map((b, i) => (i === index ? read : b));
      const misread = decodeBands(changed).value;
      if (Math.abs(misread - value) > value * 1e-9 && !found.has(misread)) {
        found.set(misread, { value: misread, band: index + 1, meant: bands[index], read });
      }
    }
  };
  for (let i = 0; i < digitCount; i++) swap(i, DIGITS);
  swap(digitCount, MULTIPLIERS);
  return [...found.values()];
}
