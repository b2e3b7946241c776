import type { Command } from '../command.js';
import { parseOptions } from '../args.js';
import { colourAllowed } from '../io.js';
import { resolve } from 'node:path';
import { DEMO_BOARD_FILE } from '../../board/bundled.js';
import { sessionsFolder } from '../../ui/sessions/sessions-folder.js';

const HELP = `Usage: voltwalk [ui] [--board FILE] [--customer]

The guided walk in the terminal: pick a symptom, follow the cautions, type readings, end with
ranked suspects and a case summary to paste into a support chat.

Options:
  --board FILE   the board file to walk (default: the bundled demo board)
  --customer     word every step for a customer over chat (toggle with w on the start screen)
  -h, --help     this help

Keys: arrows choose, Enter confirms, Esc goes back, Tab skips a step you cannot do,
      y then Enter acknowledges a caution, s on the suspects screen writes the case summary,
      Ctrl-C quits at any time (nothing is lost).

Sessions: every answer is saved at once in .voltwalk-sessions/ under the current folder, or in
the folder named by VOLTWALK_HOME; an unfinished walk is offered for resume on the next start.
A session file that cannot be read is reported and left untouched.

When stdout is not a terminal, prints the board, the symptoms and how to walk a tree with
\`voltwalk walk\` instead of drawing screens.

Examples:
  voltwalk
  voltwalk --customer
  VOLTWALK_HOME=~/bench-sessions voltwalk --board boards/my-kit.json
`;

export const command: Command = {
  name: 'ui',
  summary: 'the guided walk in the terminal (the default)',
  help: HELP,
  async run(args, io) {
    const { values } = parseOptions(args, { board: { type: 'string' }, customer: { type: 'boolean' } }, false);
    const boardFile = values.board ? resolve(io.cwd, values.board) : DEMO_BOARD_FILE;
    const folder = sessionsFolder(io.env, io.cwd);
    // Screens need a keyboard as well as a screen: without either, print plain text.
    if (!io.isTTY || !process.stdin.isTTY) {
      const { plainStart } = await import('../../ui/app/plain-start.js');
      io.stdout(plainStart(boardFile, folder));
      return 0;
    }
    // ink draws nothing until exit when CI or CONTINUOUS_INTEGRATION is set (it reads them once, on
    // import). A keyboard and a screen are here, so a person is too: the screens must be drawn.
    for (const name of ['CI', 'CONTINUOUS_INTEGRATION']) if (name in process.env) process.env[name] = 'false';
    const { startUi } = await import('../../ui/app/start-ui.js');
    return startUi({ boardFile, folder, cwd: io.cwd, wording: values.customer ? 'customer' : 'technician', colour: colourAllowed(io) });
  },
};
