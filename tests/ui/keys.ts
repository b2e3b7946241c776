/** Named keys as a terminal sends them, for driving screens through stdin in tests. */
export const ENTER = '\r';
export const ESCAPE = '\u001B';
export const BACKSPACE = '\u007F';
export const ARROW_UP = '\u001B[A';
export const ARROW_DOWN = '\u001B[B';
export const TAB = '\t';

/**
 * ink reads stdin asynchronously and a list's key handler sees a move only after the re-render; a
 * frame settles within a few ms, but a machine busy with other test files needs more slack.
 */
export const settle = (ms = 150) => new Promise((resolve) => setTimeout(resolve, ms));

/** Types text and each key, waiting for the frame after each write (and once before, so input listeners are attached). */
export async function press(stdin: { write: (s: string) => void }, ...keys: string[]): Promise<void> {
  await settle(300);
  for (const k of keys) {
    stdin.write(k);
    await settle();
  }
}
