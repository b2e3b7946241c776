/** Named keys as a terminal sends them, for driving screens through stdin in tests. */
export const ENTER = '\r';
export const ESCAPE = '\u001B';
export const BACKSPACE = '\u007F';
export const ARROW_UP = '\u001B[A';
export const ARROW_DOWN = '\u001B[B';
export const TAB = '\t';

/** ink reads stdin asynchronously; a frame settles within a few ms, 50 ms leaves slack on a busy machine. */
export const settle = (ms = 50) => new Promise((resolve) => setTimeout(resolve, ms));

/** Types text and each key, waiting for the frame after each write. */
export async function press(stdin: { write: (s: string) => void }, ...keys: string[]): Promise<void> {
  for (const k of keys) {
    stdin.write(k);
    await settle();
  }
}
