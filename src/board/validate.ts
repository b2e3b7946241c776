import { readFileSync, statSync } from 'node:fs';
import { resolve } from 'node:path';
import { BoardSchema, type Board } from '../schemas/board.js';
import { UserInputError, whyUnreadable, type Problem } from '../errors.js';
import { shapeProblems } from './shape-problems.js';
import { meaningProblems } from './check-meaning.js';
import { parseJson } from './parse-json.js';

/** Shape (zod) then meaning; returns the board only when there is no problem at all. */
export function validateBoard(raw: unknown, file: string): { board?: Board; problems: Problem[] } {
  const parsed = BoardSchema.safeParse(raw);
  if (!parsed.success) return { problems: shapeProblems(parsed.error.issues, raw, BoardSchema, file) };
  const problems = meaningProblems(parsed.data, file);
  return problems.length ? { problems } : { board: parsed.data, problems };
}

/** Reads, parses and validates one board file; every problem is collected before anything is reported. */
export function checkBoardFile(file: string): { board?: Board; problems: Problem[] } {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (error) {
    return {
      problems: [
        {
          code: 'board.unreadable',
          file,
          message: whyUnreadable(error),
          accepted: 'a readable board file (JSON, "format": "voltwalk-board/1")',
        },
      ],
    };
  }
  const { value, problem } = parseJson(text, file, 'board');
  if (problem) return { problems: [problem] };
  return validateBoard(value, file);
}

const loaded = new Map<string, Board>();

/**
 * The board in `file`, validated; throws UserInputError listing every problem. Boards are cached
 * per path and modification time (they are read-only data), so the walk, the dictionary and the CLI share one object and
 * its parsed values.
 */
export function loadBoard(file: string): Board {
  let key: string | undefined;
  try {
    const st = statSync(file);
    key = `${resolve(file)}\0${st.mtimeMs}\0${st.size}`;
  } catch {
    // Unreadable: checkBoardFile says why.
  }
  const hit = key && loaded.get(key);
  if (hit) return hit;
  const { board, problems } = checkBoardFile(file);
  if (!board) throw new UserInputError(problems);
  if (key) loaded.set(key, board);
  return board;
}
