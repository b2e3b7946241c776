import { resolve } from 'node:path';
import type { Command } from '../command.js';
import type { Io } from '../io.js';
import { parseOptions } from '../args.js';
import { UsageError } from '../../errors.js';
import { DEMO_BOARD_FILE, loadBoard } from '../../board/index.js';
import { ConvergenceError, solveDC } from '../../circuit/index.js';
import { writeNetlist } from '../../circuit/spice/index.js';
import { boardCircuit } from './solve.js';

const FORMATS = ['spice'] as const;

const HELP = `Usage: voltwalk export [--board FILE] --format spice [--condition NAME] [--no-nodeset]

Writes a board, as set up for one condition, as a SPICE netlist on stdout: ngspice runs it as it is
(\`ngspice -b board.cir\`), and \`voltwalk solve\` reads it back. Pots become two resistors at their
setting, switches a resistor per closed contact, op-amps the same law voltwalk solves with.

  --board FILE      a board file (default: the bundled demo board)
  --format spice    the output format (spice is the only one)
  --condition NAME  the condition to set the board up for (default: its quiescent condition,
                    else its first powered one)
  --no-nodeset      leave out the .nodeset line. By default the netlist carries voltwalk's own
                    operating point as ngspice's starting guess: on some boards (the demo board
                    among them) ngspice's stepping does not find the operating point from 0 V.

Examples:
  voltwalk export --format spice > tamp.cir
  voltwalk export --board my-kit.json --format spice --condition dc-above
`;

export const command: Command = {
  name: 'export',
  summary: 'write a board as a SPICE netlist for a condition',
  help: HELP,
  async run(args: string[], io: Io): Promise<number> {
    const { values } = parseOptions(
      args,
      {
        board: { type: 'string' },
        format: { type: 'string' },
        condition: { type: 'string' },
        'no-nodeset': { type: 'boolean' },
      },
      false,
    );
    if (values.format === undefined) throw new UsageError(`export needs --format (accepted: ${FORMATS.join(', ')})`);
    if (!(FORMATS as readonly string[]).includes(values.format)) {
      throw new UsageError(`unknown --format "${values.format}" (accepted: ${FORMATS.join(', ')})`);
    }
    const file = values.board === undefined ? DEMO_BOARD_FILE : resolve(io.cwd, values.board);
    const board = loadBoard(file);
    const { circuit, condition } = boardCircuit(board, values.condition);
    let nodeset: Record<string, number> | undefined;
    if (!values['no-nodeset']) {
      try {
        nodeset = solveDC(circuit).nodes;
      } catch (error) {
        if (!(error instanceof ConvergenceError)) throw error;
        io.stderr(`voltwalk: warning: no operating point to offer ngspice as a starting guess (${error.message}); writing without .nodeset\n`);
      }
    }
    const text = writeNetlist(
      { ...circuit, title: `${board.name} — ${condition.id}: ${condition.label}` },
      nodeset ? { nodeset } : {},
    );
    io.stdout(text);
    return 0;
  },
};
