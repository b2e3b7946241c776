import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { UserInputError, whyUnreadable, type Problem } from '../errors.js';
import type { Board } from '../schemas/board.js';
import type { Tree } from '../schemas/tree.js';
import { TREES_DIR } from '../paths.js';
import { bundledBoards } from './bundled-boards.js';
import { validateTree } from './check-tree.js';

/** Reads and checks one tree file; the boards decide which roles count as defined (bundled boards by default). */
export function readTree(file: string, boards: Board[] = bundledBoards()): { tree?: Tree; problems: Problem[] } {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (error) {
    return { problems: [{ code: 'tree.unreadable', file, message: `tree file: ${whyUnreadable(error)}`, accepted: 'a path to a voltwalk-tree/1 JSON file' }] };
  }
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (error) {
    const detail = error instanceof Error ? error.message.split('\n')[0] : 'not JSON';
    return { problems: [{ code: 'tree.json', file, message: `not valid JSON: ${detail}`, accepted: 'a JSON object with format "voltwalk-tree/1"' }] };
  }
  return validateTree(raw, file, boards);
}

/** Loads one tree or throws a UserInputError listing every problem. */
export function loadTree(file: string, boards?: Board[]): Tree {
  const { tree, problems } = readTree(file, boards);
  if (!tree) throw new UserInputError(problems);
  return tree;
}

/** The tree files shipped in trees/ (boards live in trees/boards and are not trees). */
export function bundledTreeFiles(dir = TREES_DIR): string[] {
  return readdirSync(dir)
    .filter((f) => f.endsWith('.json'))
    .sort()
    .map((f) => join(dir, f));
}

export function loadAllTrees(boards?: Board[]): Tree[] {
  return bundledTreeFiles().map((f) => loadTree(f, boards));
}

/** A bundled tree by id, or a UserInputError naming the ids there are. */
export function findTree(id: string, boards?: Board[]): Tree {
  const trees = loadAllTrees(boards);
  const tree = trees.find((t) => t.id === id);
  if (!tree) {
    throw new UserInputError({ code: 'tree.unknown', path: '--tree', message: `no tree called "${id}"`, accepted: trees.map((t) => t.id).join(', ') });
  }
  return tree;
}
