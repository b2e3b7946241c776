import { UserInputError } from '../../../errors.js';

/**
 * A refused input's hint for the line under a field: what was wrong and the accepted form. The
 * field's own name is left out (it is right above), so the hint fits one line of the terminal.
 */
export function hintOf(error: unknown): string {
  if (error instanceof UserInputError) {
    const p = error.problems[0];
    // The typed text is on screen already; repeating it in quotes would push the accepted form off the line.
    const message = p.message.replace(/^".*" is not a value: /, '');
    return p.accepted ? `${message} (accepted: ${p.accepted})` : message;
  }
  return (error instanceof Error ? error.message : String(error)).split('\n')[0];
}
