import { bundledBoardFiles, loadBoard } from '../board/index.js';
import type { Board } from '../schemas/board.js';

let cache: Board[] | undefined;

/** The boards shipped in trees/boards, loaded once: they decide which roles a tree may name. */
export function bundledBoards(): Board[] {
  cache ??= bundledBoardFiles().map((f) => loadBoard(f));
  return cache;
}
