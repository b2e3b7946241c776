import type { Problem } from '../errors.js';
import { readTree } from './load-tree.js';

/** Validates a diagnostic tree file: shape, references, cycles, roles, reachability and the safety gate. */
export function checkTreeFile(file: string): Problem[] {
  return readTree(file).problems;
}
