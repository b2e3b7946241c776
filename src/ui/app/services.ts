import { existsSync, mkdirSync } from 'node:fs';
import { createActor } from 'xstate';
import { loadBoard, withSubstitutions } from '../../board/index.js';
import { loadAllTrees } from '../../engine/load-tree.js';
import { createWalkMachine, type WalkSetup } from '../../engine/walk-machine.js';
import { createSession, loadSession, resumeWalk, saveSession, type Session } from '../../engine/session.js';
import { currentStep, readingEvent, answerEvent, probeEvent, type WalkStep } from '../../engine/step-view.js';
import { meterAllowance } from '../../engine/outcome.js';
import type { WalkContext, WalkEvent } from '../../engine/walk-context.js';
import { UserInputError } from '../../errors.js';
import type { Board } from '../../schemas/board.js';
import type { Tree } from '../../schemas/tree.js';
import { formatValue, parseReading } from '../../units/index.js';
import { listSessions, type SessionEntry } from '../sessions/session-list.js';
import { newSessionFile } from '../sessions/sessions-folder.js';
import { describePart } from '../parts/part-info.js';

/**
 * Everything the app needs beyond its first frame, in one module loaded after that frame is on
 * screen: the board and tree files, the walk engine (which pulls in the solver and the ranking),
 * and session files. The app shell imports only this module's types.
 */

export interface StartData {
  board: Board;
  boardFile: string;
  trees: Tree[];
  sessions: SessionEntry<Session>[];
}

export function loadStartData(boardFile: string, folder: string): StartData {
  const board = loadBoard(boardFile);
  const trees = loadAllTrees();
  return { board, boardFile, trees, sessions: readSessions(folder, trees) };
}

export function readSessions(folder: string, trees: Tree[]): SessionEntry<Session>[] {
  return listSessions(folder, loadSession, (s) => isFinished(s, trees));
}

/** A walk that stands on a conclusion is finished; one on any other step can be resumed. */
export function isFinished(session: Session, trees: Tree[]): boolean {
  const tree = trees.find((t) => t.id === session.treeId);
  return tree?.nodes[session.snapshot.value]?.kind === 'conclude';
}

/** A running walk: the actor, the engine's view of tree and board, and the file it autosaves to. */
export interface WalkRun {
  actor: ReturnType<typeof createActor<ReturnType<typeof createWalkMachine>['machine']>>;
  walk: WalkSetup;
  tree: Tree;
  board: Board;
  boardFile: string;
  file: string;
}

/**
 * The walk routes every reading on the worst-case band (min/max over all tolerances); the Monte
 * Carlo interval is not used by the walk, so the screens skip it and a walk starts in seconds.
 */
export const WALK_BAND_OPTIONS = { samples: 0 } as const;

export function startWalk(tree: Tree, board: Board, boardFile: string, substitutions: Record<string, string | number>, folder: string): WalkRun {
  const { machine, walk } = createWalkMachine(tree, board, { ...WALK_BAND_OPTIONS, substitutions });
  mkdirSync(folder, { recursive: true });
  const file = newSessionFile(folder, tree.id, new Date(), existsSync);
  const actor = createActor(machine);
  return { actor, walk, tree, board, boardFile, file };
}

export function resumeFromFile(file: string, trees: Tree[], board: Board, boardFile: string): WalkRun {
  const session = loadSession(file);
  const tree = trees.find((t) => t.id === session.treeId);
  if (!tree) {
    throw new UserInputError({ code: 'session.unknown-tree', file, message: `the session is on tree "${session.treeId}", which is not installed`, accepted: trees.map((t) => t.id).join(', ') });
  }
  // A session remembers the board file it ran on; reopen that one when it differs from the open board.
  const onBoard = session.boardFile && session.boardFile !== boardFile ? loadBoard(session.boardFile) : board;
  const made = resumeWalk(session, tree, onBoard, WALK_BAND_OPTIONS, file);
  return { actor: made.actor, walk: made.walk, tree, board: onBoard, boardFile: session.boardFile ?? boardFile, file };
}

/** Writes the walk as it stands (temp file, then rename: see saveSession). */
export function autosave(run: WalkRun): void {
  saveSession(run.file, createSession(run.tree, run.board, run.actor.getPersistedSnapshot(), { boardFile: run.boardFile }));
}

export function stepOf(run: WalkRun): WalkStep {
  const snap = run.actor.getSnapshot();
  return currentStep(run.walk, { value: snap.value, context: snap.context as WalkContext });
}

export function contextOf(run: WalkRun): WalkContext {
  return run.actor.getSnapshot().context as WalkContext;
}

/** A board with the person's part changes applied; throws UserInputError naming the part. */
export function substituted(board: Board, subs: Record<string, string | number>): Board {
  return withSubstitutions(board, subs);
}

export const engine = { readingEvent, answerEvent, probeEvent, parseReading, formatValue, describePart, meterAllowance };
export type { WalkStep, WalkEvent, Session, Tree, Board };
export { buildCaseSummary } from '../case/case-summary.js';
export { formatCaseSummary } from '../case/format-case-summary.js';
export { partValue as partValueOf } from '../../board/index.js';
export { warmDictionary, type WarmupState } from './dictionary-warmup.js';

/** Whether showing the current step runs the ranking (a conclusion, or a step that suggests a probe once readings exist). */
export function stepNeedsRanking(run: WalkRun): boolean {
  const snap = run.actor.getSnapshot();
  const node = run.walk.plans[String(snap.value)]?.node;
  const context = snap.context as WalkContext;
  const readings = Object.keys(context.readings).length + context.extraReadings.length;
  if (readings === 0 || !node) return false;
  return node.kind === 'conclude' || (node.kind === 'measure' && node.suggestProbe);
}
