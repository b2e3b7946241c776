import { dirname, join, resolve } from 'node:path';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

/**
 * The package root, found by walking up from this module to the folder holding package.json, so
 * the same code finds `trees/` whether it runs from src/ (tests, tsx) or from dist/ (the bin).
 */
function findRoot(): string {
  let dir = dirname(fileURLToPath(import.meta.url));
  for (let i = 0; i < 6; i++) {
    if (existsSync(join(dir, 'package.json'))) return dir;
    dir = resolve(dir, '..');
  }
  throw new Error('voltwalk: cannot find the package root (package.json) above ' + fileURLToPath(import.meta.url));
}

export const PACKAGE_ROOT = findRoot();
export const TREES_DIR = join(PACKAGE_ROOT, 'trees');
export const BOARDS_DIR = join(TREES_DIR, 'boards');
