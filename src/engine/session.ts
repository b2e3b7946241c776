import { createHash } from 'node:crypto';
import { readFileSync, renameSync, writeFileSync, unlinkSync } from 'node:fs';
import { createActor } from 'xstate';
import { z } from 'zod';
import { UserInputError, whyUnreadable, type Problem } from '../errors.js';
import type { Board } from '../schemas/board.js';
import type { Tree } from '../schemas/tree.js';
import { SAFETY_HOLD, WalkContextSchema } from './walk-context.js';
import { jsonNumbers } from './format-transcript.js';
import { createWalkMachine, type WalkOptions } from './walk-machine.js';

export const SESSION_FORMAT = 'voltwalk-session/1';

/**
 * A saved walk: which tree on which board (with digests, so a session never resumes on a tree or
 * board that has changed under it), the walk's options, and xstate's persisted snapshot.
 */
export const SessionSchema = z
  .object({
    format: z.literal(SESSION_FORMAT),
    treeId: z.string(),
    treeDigest: z.string(),
    boardId: z.string(),
    boardDigest: z.string(),
    /** The board file the walk ran on, when it came from one (the UI reopens it). */
    boardFile: z.string().optional(),
    savedAt: z.string(),
    options: z.object({ oscilloscope: z.boolean().optional() }).strict(),
    snapshot: z
      .object({
        status: z.literal('active'),
        value: z.string(),
        context: WalkContextSchema,
      })
      .loose(),
  })
  .strict();
export type Session = z.infer<typeof SessionSchema>;

/** Key order does not change meaning, so it must not change the digest. */
function canonical(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonical).join(',')}]`;
  if (value && typeof value === 'object') {
    return `{${Object.keys(value).sort().map((k) => `${JSON.stringify(k)}:${canonical((value as Record<string, unknown>)[k])}`).join(',')}}`;
  }
  return JSON.stringify(value);
}

export function digestOf(value: unknown): string {
  return createHash('sha256').update(canonical(value)).digest('hex').slice(0, 16);
}

/** A session for a walk now under way; `snapshot` is the actor's `getPersistedSnapshot()`. */
export function createSession(tree: Tree, board: Board, snapshot: unknown, options: { oscilloscope?: boolean; boardFile?: string } = {}): Session {
  return SessionSchema.parse({
    format: SESSION_FORMAT,
    treeId: tree.id,
    treeDigest: digestOf(tree),
    boardId: board.id,
    boardDigest: digestOf(board),
    ...(options.boardFile ? { boardFile: options.boardFile } : {}),
    savedAt: new Date().toISOString(),
    options: options.oscilloscope === undefined ? {} : { oscilloscope: options.oscilloscope },
    snapshot,
  });
}

/** Writes beside the target then renames, so a crash mid-write never leaves a half-written session. */
export function saveSession(file: string, session: Session): void {
  const temp = `${file}.${process.pid}.tmp`;
  try {
    writeFileSync(temp, `${JSON.stringify(session, jsonNumbers, 2)}\n`);
    renameSync(temp, file);
  } catch (error) {
    try {
      unlinkSync(temp);
    } catch {
      // nothing was written
    }
    throw new UserInputError({ code: 'session.unwritable', file, message: `cannot save the session: ${(error as NodeJS.ErrnoException).code ?? 'write failed'}`, accepted: 'a writable path' });
  }
}

const problem = (file: string, code: string, message: string, accepted: string, path?: string): UserInputError =>
  new UserInputError({ code, file, path, message, accepted } satisfies Problem);

const NUMBER_KEYS = new Set(['value', 'nominal', 'min', 'max']);

/** Undoes jsonNumbers for the numeric fields of readings and bands (and nowhere else). */
function reviveNumbers(key: string, value: unknown): unknown {
  if (NUMBER_KEYS.has(key) && (value === 'Infinity' || value === '-Infinity')) return value === 'Infinity' ? Infinity : -Infinity;
  return value;
}

/** Reads a session file; a wrong version or a damaged file is a UserInputError, and the file is left as it is. */
export function loadSession(file: string): Session {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (error) {
    throw problem(file, 'session.missing', `session file: ${whyUnreadable(error)}`, `a ${SESSION_FORMAT} file written by voltwalk`);
  }
  let raw: unknown;
  try {
    raw = JSON.parse(text, reviveNumbers);
  } catch {
    throw problem(file, 'session.corrupt', 'the session file is damaged (not valid JSON)', `a ${SESSION_FORMAT} file written by voltwalk`);
  }
  const format = (raw as { format?: unknown } | null)?.format;
  if (format !== SESSION_FORMAT) {
    throw problem(file, 'session.version', `the session file is format ${JSON.stringify(format ?? 'unknown')}, which this version cannot resume`, SESSION_FORMAT, 'format');
  }
  const parsed = SessionSchema.safeParse(raw);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw problem(file, 'session.corrupt', `the session file is damaged: ${issue.message}`, `a ${SESSION_FORMAT} file written by voltwalk`, issue.path.map(String).join('.'));
  }
  return parsed.data;
}

/**
 * Resumes a saved walk as a running actor on the same tree and board. A tree or board that changed
 * since the save, or a snapshot naming a step the tree no longer has, is a UserInputError.
 */
export function resumeWalk(session: Session, tree: Tree, board: Board, options: WalkOptions = {}, file?: string) {
  if (session.treeId !== tree.id || session.treeDigest !== digestOf(tree)) {
    throw problem(file ?? '', 'session.tree-changed', `the session was saved on tree "${session.treeId}", which has changed (or is not "${tree.id}") since`, 'start a new walk on the current tree', 'treeDigest');
  }
  if (session.boardId !== board.id || session.boardDigest !== digestOf(board)) {
    throw problem(file ?? '', 'session.board-changed', `the session was saved on board "${session.boardId}", which has changed (or is not "${board.id}") since`, 'start a new walk, or reopen the board file it was saved with', 'boardDigest');
  }
  const made = createWalkMachine(tree, board, { ...options, oscilloscope: session.options.oscilloscope ?? options.oscilloscope });
  const value = session.snapshot.value;
  if (value !== SAFETY_HOLD && !made.walk.plans[value]) {
    throw problem(file ?? '', 'session.corrupt', `the session stands at step "${value}", which the tree does not have`, 'a session saved by voltwalk', 'snapshot.value');
  }
  const actor = createActor(made.machine, { snapshot: session.snapshot as never });
  return { actor, ...made };
}
