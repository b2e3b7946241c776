/**
 * The few colours voltwalk uses, each with one meaning. Components look the tone up here and pass
 * it to ink only when colour is allowed; the words and characters beside it carry the same meaning.
 */
export const TONES = {
  /** A reading inside its healthy band; the band itself. */
  good: 'green',
  /** A reading outside its band; a refused input. */
  bad: 'red',
  /** A hazard to read before acting. */
  caution: 'yellow',
  /** Where the person is now: the selected item, the stage under test. */
  focus: 'cyan',
  /** Secondary text: hints, locations. */
  quiet: 'gray',
} as const;

export type Tone = keyof typeof TONES;

/** The ink `color` prop for a tone, or nothing when colour is off. */
export function toneColour(tone: Tone | undefined, colour: boolean): string | undefined {
  return colour && tone ? TONES[tone] : undefined;
}
