/**
 * The terminal wraps a long line at a space and keeps that space as the first character of the next
 * line, so a paragraph's continuation lines would start one column in, ragged. A transform for each
 * output line of a wrapped paragraph: every line after the first loses one leading space (after any
 * colour codes). Indentation a text carries on purpose sits on its first line, which is left alone.
 */
const COLOUR_CODES_THEN_SPACE = /^((?:\u001b\[[0-9;]*m)*) /;

export function dropBreakSpace(line: string, index: number): string {
  return index > 0 ? line.replace(COLOUR_CODES_THEN_SPACE, '$1') : line;
}
