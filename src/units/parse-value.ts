import { UserInputError } from '../errors.js';
import { TOLERANCE_LETTERS } from './letter-code.js';

/**
 * Part values and meter readings as people type them.
 *
 * Accepted forms (IEC 60062 letter code and engineering notation):
 *   plain numbers        4700, 0.47, 1e3, -12
 *   multiplier suffix    4.7k, 100n, 10u, 10µ, 3m3 is the letter code; 1M = 1 mega, 3m = 3 milli (case matters)
 *   letter code          4k7, 2R2, R47, 0R47, 470R, 4M7, 4n7, 2u2, 1µ0
 *   units (optional)     10kΩ, 10k ohm, 100nF, 1.5 V, 20 mA, 0.25W, 1kHz
 *   tolerance (optional) letter F G J K M after a letter-code value (4k7J), or "±5%" / "5%"
 *   decimal comma        4,7k and 4,7 are read as 4.7k and 4.7 (one comma, no dot). "4,700" is refused as
 *                        ambiguous (a thousands separator in some countries, a decimal comma in others).
 * A trailing F is a farad unit after a capacitor-scale multiplier (p, n, u, µ, m) and the 1 % tolerance
 * letter after an ohm-scale one (R, k, M, G).
 */

export type UnitSymbol = 'Ω' | 'F' | 'H' | 'V' | 'A' | 'W' | 'Hz';
export type Quantity = 'voltage' | 'resistance' | 'current';

export interface ParsedValue {
  value: number;
  unit?: UnitSymbol;
  /** Fraction, e.g. 0.05 for ±5 %. */
  tolerance?: number;
}

export const ACCEPTED_VALUE_FORMS =
  'a number with an optional multiplier and unit, e.g. 4700, 4.7k, 4k7, 2R2, R47, 100n, 2u2, 10kΩ, 100nF, -12V, 4,7k';

const MULTIPLIERS: Record<string, number> = {
  p: 1e-12,
  n: 1e-9,
  u: 1e-6,
  µ: 1e-6,
  μ: 1e-6,
  m: 1e-3,
  k: 1e3,
  K: 1e3,
  M: 1e6,
  G: 1e9,
  R: 1,
  r: 1,
};
const CAPACITOR_SCALE = new Set(['p', 'n', 'u', 'µ', 'μ', 'm']);
const OHM_SCALE_VALUE = /^(?:\d+(?:\.\d+)?[RrkKMG]\d*|\.\d+[kKMG]|[Rr]\d+)$/;

const UNIT_WORDS: Array<[RegExp, UnitSymbol]> = [
  [/\s*(Ω|ohms?)$/i, 'Ω'],
  [/\s*Hz$/i, 'Hz'],
  [/\s*V$/, 'V'],
  [/\s*A$/, 'A'],
  [/\s*W$/, 'W'],
  [/\s*H$/, 'H'],
];

const MULT = '[pnuµμmkKMGRr]';
// 4k7, 2R2, 4n7: the multiplier letter stands where the decimal point would be.
const LETTER_CODE = new RegExp(`^(\\d+)(${MULT})(\\d+)$`);
// R47, r47: a leading R is "0." in ohms.
const LEADING_R = /^[Rr](\d+)$/;
// 4.7k, 100n, 470R, 1meg, 1e3, -12
const PLAIN = new RegExp(`^([+-]?(?:\\d+(?:\\.\\d*)?|\\.\\d+)(?:[eE][+-]?\\d+)?)(meg|Meg|MEG|${MULT})?$`);

function fail(text: string, field: string | undefined, why: string, accepted = ACCEPTED_VALUE_FORMS): never {
  throw new UserInputError({
    code: 'value.invalid',
    path: field,
    message: `"${text}" is not a value: ${why}`,
    accepted,
  });
}

/** Normalises the decimal comma, the Unicode minus and spacing; refuses ambiguous commas. */
function normalise(text: string, field: string | undefined): string {
  let s = text.trim().replace(/\u2212/g, '-');
  const commas = (s.match(/,/g) ?? []).length;
  if (commas > 0) {
    if (commas > 1 || s.includes('.')) fail(text, field, 'more than one decimal separator');
    if (/^[+-]?\d{1,3},\d{3}(?!\d)/.test(s) && !/^[+-]?\d+,\d+[pnuµμmkKMGRr]/.test(s)) {
      fail(text, field, 'ambiguous comma (thousands separator or decimal comma?)', 'write 4.7 or 4700');
    }
    s = s.replace(',', '.');
  }
  return s;
}

function splitTolerance(s: string): { rest: string; tolerance?: number } {
  const percent = /\s*(?:±|\+\/-|\+-)?\s*(\d+(?:\.\d+)?)\s*%$/.exec(s);
  if (percent) return { rest: s.slice(0, percent.index).trim(), tolerance: Number(percent[1]) / 100 };
  // A tolerance letter only after a value that already carries an ohm-scale letter (4k7J, 10kJ, 2R2F),
  // so that 1M stays one megohm and 100nF stays farads.
  const letter = /^(.+)([FGJKM])$/.exec(s);
  if (letter && OHM_SCALE_VALUE.test(letter[1])) {
    return { rest: letter[1], tolerance: TOLERANCE_LETTERS[letter[2]] };
  }
  return { rest: s };
}

function splitUnit(s: string): { rest: string; unit?: UnitSymbol } {
  for (const [pattern, unit] of UNIT_WORDS) {
    const m = pattern.exec(s);
    if (m && m.index > 0) return { rest: s.slice(0, m.index).trim(), unit };
  }
  // F: farads only after a capacitor-scale multiplier or a bare number ("100nF", "1F").
  const farad = /^(.*?)\s*F$/.exec(s);
  if (farad && farad[1].length > 0) {
    const before = farad[1];
    const lastLetter = /([A-Za-zµμ])\d*$/.exec(before)?.[1];
    if (lastLetter === undefined || CAPACITOR_SCALE.has(lastLetter)) return { rest: before.trim(), unit: 'F' };
  }
  return { rest: s };
}

function parseNumber(core: string, text: string, field: string | undefined): number {
  let m = LETTER_CODE.exec(core);
  if (m) return Number(`${m[1]}.${m[3]}`) * MULTIPLIERS[m[2]];
  m = LEADING_R.exec(core);
  if (m) return Number(`0.${m[1]}`);
  m = PLAIN.exec(core);
  if (m) {
    const mult = m[2] === undefined ? 1 : /^meg$/i.test(m[2]) ? 1e6 : MULTIPLIERS[m[2]];
    return Number(m[1]) * mult;
  }
  return fail(text, field, describeProblem(core));
}

function describeProblem(core: string): string {
  if (core === '') return 'no number';
  if (/[.]{2,}/.test(core)) return 'two decimal points';
  if (/^[+-]{2,}/.test(core)) return 'more than one sign';
  if (!/\d/.test(core)) return 'no digits';
  if (/[pnuµμmkKMGRr].*[pnuµμmkKMGRr]/.test(core)) return 'more than one multiplier letter';
  return 'unrecognised characters';
}

/** Parses a part value or reading; `unit` is the unit expected, `field` names the input in errors. */
export function parseValue(text: string, opts: { unit?: UnitSymbol; field?: string } = {}): ParsedValue {
  const { field } = opts;
  if (typeof text !== 'string' || text.trim() === '') fail(String(text ?? ''), field, 'empty');
  const normal = normalise(text, field);
  const { rest: withUnit, tolerance } = splitTolerance(normal);
  const { rest: core, unit } = splitUnit(withUnit);
  if (unit && opts.unit && unit !== opts.unit) {
    fail(text, field, `the unit is ${unit} but ${opts.unit} is expected`, `a value in ${opts.unit}, e.g. ${example(opts.unit)}`);
  }
  const raw = parseNumber(core.replace(/\s+/g, ''), text, field);
  if (!Number.isFinite(raw)) fail(text, field, 'out of range');
  // 100 * 1e-9 is 1.0000000000000001e-7 in binary floating point; 12 figures is beyond any part's precision.
  const value = Number(raw.toPrecision(12));
  return { value, unit: unit ?? opts.unit, tolerance };
}

function example(unit: UnitSymbol): string {
  return { Ω: '4k7 or 4.7kΩ', F: '100n or 100nF', H: '10mH', V: '4.2 or 420mV', A: '20mA', W: '0.25W', Hz: '1kHz' }[unit];
}

const QUANTITY_UNIT: Record<Quantity, UnitSymbol> = { voltage: 'V', resistance: 'Ω', current: 'A' };

/**
 * A meter reading as typed at the bench: "4.2", "4.2 V", "420mV", "-11,9", "4k7".
 * The error names the accepted forms for that quantity, since a typo here must not become an outcome.
 */
export function parseReading(text: string, quantity: Quantity, field?: string): number {
  const unit = QUANTITY_UNIT[quantity];
  try {
    const parsed = parseValue(text, { unit, field });
    if (parsed.tolerance !== undefined) fail(text, field, 'a reading has no tolerance');
    return parsed.value;
  } catch (error) {
    if (error instanceof UserInputError) {
      const p = error.problems[0];
      throw new UserInputError({ ...p, accepted: `a ${quantity} reading such as ${example(unit)}` });
    }
    throw error;
  }
}
