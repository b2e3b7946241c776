/**
 * A value and its unit are one word to a reader: "±12 V" broken into "±12" at the end of one line
 * and "V rails" at the start of the next reads as two things. The terminal wraps at plain spaces
 * only, so the space between a number and the unit that follows it becomes a no-break space.
 */
const NO_BREAK_SPACE = '\u00a0';
const VALUE_THEN_UNIT = /(\d) (?=(?:[pnuµmkM]?(?:V|A|Ω|Hz|F|W|s)|dBu?|°C|%)(?![A-Za-z]))/g;

export function keepUnitsTogether(text: string): string {
  return text.replace(VALUE_THEN_UNIT, `$1${NO_BREAK_SPACE}`);
}
