import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { BOARDS_DIR } from '../paths.js';

/** The demo board `voltwalk` opens when no --board is given. */
export const DEMO_BOARD_FILE = join(BOARDS_DIR, 'wenlow-tamp.json');

/** Every board file shipped in trees/boards, sorted by name. */
export function bundledBoardFiles(): string[] {
  try {
    return readdirSync(BOARDS_DIR)
      .filter((f) => f.endsWith('.json'))
      .sort()
      .map((f) => join(BOARDS_DIR, f));
  } catch {
    return [];
  }
}
