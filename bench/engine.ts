/**
 * Walk engine: loading and checking the trees, compiling a tree into a machine, one reading through
 * the machine, and a whole replay. Bands are solved once per board and cached (see board-view.ts);
 * the first, cold compile pays for them, so it is reported apart from the warm medians.
 */
import { join } from 'node:path';
import { initialTransition, transition } from 'xstate';
import { loadBoard, measureAll } from '../src/board/index.js';
import { createWalkMachine, findTree, loadAllTrees, walkFromAnswers } from '../src/engine/index.js';
import { BOARDS_DIR } from '../src/paths.js';
import { fmt, median, timeRuns } from './timing.js';

export async function run(): Promise<void> {
  const board = loadBoard(join(BOARDS_DIR, 'wenlow-nib.json'));
  loadAllTrees();
  console.log(`load and check all trees (boards loaded): median ${fmt(median(timeRuns(() => loadAllTrees(), 10, 1)))}`);

  const tree = findTree('first-power-up');
  let t0 = performance.now();
  createWalkMachine(tree, board, { samples: 0 });
  console.log(`compile first-power-up on ${board.id}, cold (solves its bands): ${fmt(performance.now() - t0)}`);
  console.log(`compile, warm: median ${fmt(median(timeRuns(() => createWalkMachine(tree, board, { samples: 0 }), 20)))}`);

  const { machine } = createWalkMachine(tree, board, { samples: 0 });
  const [s0] = initialTransition(machine);
  const atOhms = machine.resolveState({ value: 'ohms-pos', context: s0.context });
  const reading = { type: 'user.reading' as const, value: 42.9e3, text: '42.9k' };
  console.log(`one reading through the machine: median ${fmt(median(timeRuns(() => transition(machine, atOhms, reading), 200)))}`);

  const answers: Record<string, string | boolean> = {};
  for (const [id, n] of Object.entries(tree.nodes)) {
    if (n.kind === 'caution' || n.kind === 'setup') answers[id] = true;
    else if (n.kind === 'inspect') answers[id] = 'ok';
    else if (n.kind === 'observe') answers[id] = 'no';
    else if (n.kind === 'measure') {
      const v = measureAll(board, board.roles.conditions[n.condition]!)[board.roles.testPoints[n.testPoint]!];
      answers[id] = Number.isFinite(v) ? v.toPrecision(4) : 'OL';
    }
  }
  t0 = performance.now();
  const replay = () => walkFromAnswers(tree, board, answers, { samples: 0, ranking: false });
  const steps = replay().entries.length;
  console.log(`replay of ${steps} steps to the conclusion, warm, no ranking: median ${fmt(median(timeRuns(replay, 10, 1)))}`);
}
