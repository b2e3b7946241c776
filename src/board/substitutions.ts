import type { Board, Part } from '../schemas/board.js';
import { UserInputError, type Problem } from '../errors.js';
import { formatValue } from '../units/index.js';
import { VALUE_RANGE } from './defaults.js';
import { parsePartValue } from './values.js';
import { didYouMean } from './shape-problems.js';

/**
 * The board with some part values replaced (a part the builder fitted, a value read off the bands):
 * `{ R12: "4k7", C3: 1e-7 }`. Each value is checked as the board's own would be — a value the kind
 * cannot have, an unknown designator or a part without a value is a UserInputError naming the
 * designator and the accepted form. The original board is not changed.
 */
export function withSubstitutions(board: Board, subs: Record<string, number | string>): Board {
  const entries = Object.entries(subs);
  if (entries.length === 0) return board;
  const problems: Problem[] = [];
  const byRef = new Map(board.parts.map((p, i) => [p.ref, i]));
  const parts = [...board.parts];
  for (const [ref, value] of entries) {
    const field = `substitution ${ref}`;
    const i = byRef.get(ref);
    if (i === undefined) {
      problems.push({ code: 'board.unknown-part', path: field, message: `no part "${ref}"${didYouMean(ref, [...byRef.keys()])}`, accepted: 'a designator on the board' });
      continue;
    }
    const part = board.parts[i];
    const range = VALUE_RANGE[part.kind];
    if (!range) {
      problems.push({ code: 'board.no-value', path: field, message: `${ref} is a ${part.kind}; it has no value to change`, accepted: 'a resistor, capacitor, electrolytic, inductor or pot' });
      continue;
    }
    const next: Part = { ...part, value };
    try {
      const { value: si } = parsePartValue(next, field);
      if (si === undefined || !(si >= range.min && si <= range.max)) {
        problems.push({
          code: 'board.bad-value',
          path: field,
          message: `${ref}: ${si === undefined ? 'no value' : formatValue(si, range.unit)} is not a value a ${part.kind} can have`,
          accepted: `${formatValue(range.min, range.unit)} to ${formatValue(range.max, range.unit)}`,
        });
        continue;
      }
    } catch (error) {
      if (!(error instanceof UserInputError)) throw error;
      problems.push(...error.problems.map((p) => ({ ...p, code: 'board.bad-value', path: field, message: `${ref}: ${p.message}` })));
      continue;
    }
    parts[i] = next;
  }
  if (problems.length) throw new UserInputError(problems);
  return { ...board, parts };
}
