import { UserInputError } from '../errors.js';
import { fromDbu } from './decibels.js';
import { parseReading } from './parse-value.js';

const ACCEPTED = 'a hiss level in volts rms, e.g. 390uV, 390 µV or 0.39mV, or in dBu or dBV, e.g. -66 dBu';
// The sign may be typed as a hyphen or a true minus (U+2212); the hyphen goes first in the class, so no range is meant.
const DECIBELS = /^\s*([-+\u2212]?\s*\d+(?:[.,]\d+)?)\s*dB(u|v|fs)?\s*$/i;

/**
 * A hiss level as an audio interface or AC millivoltmeter shows it: volts rms with any prefix
 * ("390uV", "0.39 mV"), or dBu ("-66 dBu", against 0.7746 V) or dBV (against 1 V). Returned in volts
 * rms; a level is never zero or less.
 */
export function parseHissReading(text: string, field = 'hiss level'): number {
  const db = DECIBELS.exec(text);
  if (db) {
    const level = Number(db[1].replace(/\s+/g, '').replace('−', '-').replace(',', '.'));
    const reference = db[2]?.toLowerCase();
    if (reference === 'u') return fromDbu(level);
    if (reference === 'v') return 10 ** (level / 20);
    // dBFS depends on the interface's own full scale, and plain dB has no reference at all.
    throw new UserInputError({
      code: 'value.hiss-decibels',
      path: field,
      message: `"${text}" has no voltage reference (${reference ? 'dBFS is relative to the interface\'s own full scale' : 'plain dB is a ratio'})`,
      accepted: ACCEPTED,
    });
  }
  let volts: number;
  try {
    volts = parseReading(text, 'voltage', field);
  } catch (error) {
    if (error instanceof UserInputError) throw new UserInputError({ ...error.problems[0], accepted: ACCEPTED });
    throw error;
  }
  if (!(volts > 0)) throw new UserInputError({ code: 'value.hiss', path: field, message: `"${text}" is not a hiss level: an rms level is above zero`, accepted: ACCEPTED });
  return volts;
}
