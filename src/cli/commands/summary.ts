import { resolve } from 'node:path';
import type { Command } from '../command.js';
import { parseOptions } from '../args.js';
import { UsageError, UserInputError } from '../../errors.js';

const HELP = `Usage: voltwalk summary SESSION [--md | --json] [--customer] [--board FILE]

The case summary of a saved walk, short enough to paste into a support chat: board, symptom,
changed parts, each reading against its healthy band, the suspects with reasons, what to measure
next and the question to ask for that reading.

SESSION is a file in the sessions folder (.voltwalk-sessions/ under the current folder, or
VOLTWALK_HOME). A damaged session file is reported and left as it is.

Options:
  --md           Markdown (bold outcomes, a list of readings)
  --json         the summary as JSON
  --customer     word the question and the advice for a customer
  --board FILE   the board file, when the session does not name one (default: the demo board)
  -h, --help     this help

Examples:
  voltwalk summary .voltwalk-sessions/2026-12-02T10-15-00Z-first-power-up.json --md
  voltwalk summary case.json --customer --json
`;

export const command: Command = {
  name: 'summary',
  summary: 'case summary of a saved session, for a support chat',
  help: HELP,
  async run(args, io) {
    const { values, positionals } = parseOptions(args, {
      md: { type: 'boolean' },
      json: { type: 'boolean' },
      customer: { type: 'boolean' },
      board: { type: 'string' },
    });
    if (positionals.length !== 1) throw new UsageError(positionals.length === 0 ? 'summary needs a SESSION file' : `summary takes one SESSION file, found ${positionals.length}`);
    if (values.md && values.json) throw new UsageError('choose one of --md and --json');
    const file = resolve(io.cwd, positionals[0]);
    const [{ loadSession, resumeWalk }, { loadAllTrees }, { loadBoard, DEMO_BOARD_FILE }, { buildCaseSummary }, { formatCaseSummary }] = await Promise.all([
      import('../../engine/session.js'),
      import('../../engine/load-tree.js'),
      import('../../board/index.js'),
      import('../../ui/case/case-summary.js'),
      import('../../ui/case/format-case-summary.js'),
    ]);
    const session = loadSession(file);
    const tree = loadAllTrees().find((t) => t.id === session.treeId);
    if (!tree) throw new UserInputError({ code: 'session.unknown-tree', file, path: 'treeId', message: `the session is on tree "${session.treeId}", which is not installed`, accepted: 'a session saved by this version of voltwalk' });
    const boardFile = values.board ? resolve(io.cwd, values.board) : (session.boardFile ?? DEMO_BOARD_FILE);
    const board = loadBoard(boardFile);
    // Readings were routed on worst-case bands; the Monte Carlo interval adds nothing to a summary.
    const { actor, walk } = resumeWalk(session, tree, board, { samples: 0 }, file);
    const snapshot = actor.getSnapshot();
    const summary = buildCaseSummary(walk, { value: snapshot.value, context: snapshot.context }, values.customer ? 'customer' : 'technician');
    io.stdout(values.json ? `${JSON.stringify(summary, null, 2)}\n` : formatCaseSummary(summary, values.md ? 'md' : 'text'));
    return 0;
  },
};
