import { parentPort, workerData } from 'node:worker_threads';
import { loadBoard, withSubstitutions } from '../../board/index.js';
import { buildDictionary } from '../../diagnosis/index.js';

/**
 * Builds the board's fault dictionary off the main thread and leaves it in the disk cache, so the
 * screens keep answering keys while the solver works through every fault (seconds to tens of
 * seconds, the first time on a board). The main thread then loads it from the cache in a moment.
 */
const { boardFile, substitutions, diskCache } = workerData as {
  boardFile: string;
  substitutions: Record<string, string | number>;
  diskCache: { dir: string; version: string };
};
try {
  const board = loadBoard(boardFile);
  const subject = Object.keys(substitutions).length ? withSubstitutions(board, substitutions) : board;
  buildDictionary(subject, { diskCache });
  parentPort?.postMessage({ ok: true });
} catch (error) {
  parentPort?.postMessage({ ok: false, problem: (error instanceof Error ? error.message : String(error)).split('\n')[0] });
}
