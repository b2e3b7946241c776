import { loadBoard } from '../../board/index.js';
import { loadAllTrees } from '../../engine/load-tree.js';
import { boardLineText } from '../screens/board-line.js';
import { readSessions } from './services.js';

/**
 * What `voltwalk` prints when stdout is not a terminal (a pipe, a script, a CI log): no frames, just
 * the board, the symptoms and how to walk a tree without the interactive screens.
 */
export function plainStart(boardFile: string, folder: string): string {
  const board = loadBoard(boardFile);
  const trees = loadAllTrees();
  const sessions = readSessions(folder, trees);
  const width = Math.max(...trees.map((t) => t.id.length), 4);
  const unfinished = sessions.filter((s) => s.status === 'unfinished');
  const corrupt = sessions.filter((s) => s.status === 'corrupt');
  const lines = [
    'voltwalk — guided fault-finding (plain output: not a terminal)',
    `Board: ${boardLineText({ name: board.name, rails: board.rails.map((r) => r.label), partCount: board.parts.length, file: boardFile })}`,
    '',
    'Symptoms (diagnostic trees):',
    ...trees.map((t) => `  ${t.id.padEnd(width)}  ${t.symptom}`),
    '',
    'Walk a tree without the interactive screens:',
    `  voltwalk walk --tree ${trees[0]?.id ?? 'TREE'} --answers answers.json`,
    '  (answers.json maps step ids to readings as typed, e.g. {"rail-pos": "11.9 V"}; see voltwalk walk --help)',
    'Run `voltwalk` in an interactive terminal for the guided walk.',
  ];
  if (unfinished.length > 0) {
    lines.push('', `Unfinished walks in ${folder}:`, ...unfinished.slice(0, 5).map((s) => `  ${s.file}  (voltwalk summary FILE for its case summary)`));
  }
  for (const c of corrupt) lines.push(`! ${c.file}: ${c.problem} (left as it is)`);
  return `${lines.join('\n')}\n`;
}
