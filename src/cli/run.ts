import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Command } from './command.js';
import type { Io } from './io.js';
import { UsageError, UserInputError } from '../errors.js';
import { PACKAGE_ROOT } from '../paths.js';

/**
 * Commands are loaded on demand so that `voltwalk` with no arguments (the terminal UI) does not pay
 * for the solver CLI's modules, and `voltwalk value 4k7` does not pay for ink.
 */
const COMMANDS: Record<string, { summary: string; load: () => Promise<{ command: Command }> }> = {
  check: { summary: 'validate a board or tree file and list every problem', load: () => import('./commands/check.js') },
  value: { summary: 'parse a part value or colour bands; show E-series neighbours and bands', load: () => import('./commands/value.js') },
  parts: { summary: "list a board's parts by stage", load: () => import('./commands/parts.js') },
  solve: { summary: 'DC operating point (or --ac FREQ) of a netlist or board file', load: () => import('./commands/solve.js') },
  export: { summary: 'write a board as a SPICE netlist for a condition', load: () => import('./commands/export.js') },
  expect: { summary: 'expected value and healthy band at every test point', load: () => import('./commands/expect.js') },
  trees: { summary: 'list the diagnostic trees', load: () => import('./commands/trees.js') },
  walk: { summary: 'replay a diagnostic tree from an answers file', load: () => import('./commands/walk.js') },
  rank: { summary: 'rank suspect parts from readings; suggest the next probe', load: () => import('./commands/rank.js') },
  summary: { summary: 'case summary of a saved session, for a support chat', load: () => import('./commands/summary.js') },
  ui: { summary: 'the guided walk in the terminal (the default)', load: () => import('./commands/ui.js') },
};

export function version(): string {
  const pkg = JSON.parse(readFileSync(join(PACKAGE_ROOT, 'package.json'), 'utf8')) as { version: string };
  return pkg.version;
}

export function usage(): string {
  const width = Math.max(...Object.keys(COMMANDS).map((n) => n.length));
  const lines = Object.entries(COMMANDS).map(([name, c]) => `  ${name.padEnd(width)}  ${c.summary}`);
  return [
    'voltwalk — guided, computed fault-finding for analog module kits',
    '',
    'Usage: voltwalk [COMMAND] [OPTIONS]',
    '       voltwalk            open the guided walk on the bundled demo board',
    '',
    'Commands:',
    ...lines,
    '',
    'Options:',
    '  -h, --help     this help (or `voltwalk COMMAND --help`)',
    '  -v, --version  print the version',
    '',
    'Examples:',
    '  voltwalk value 4k7',
    '  voltwalk expect --condition quiescent',
    '  voltwalk walk --tree no-gain-reduction --answers answers.json',
    '',
  ].join('\n');
}

/** Runs one command line; returns the exit code. Never throws for a user's mistake. */
export async function run(argv: string[], io: Io): Promise<number> {
  const [first, ...rest] = argv;
  if (first === '-h' || first === '--help' || first === 'help') {
    io.stdout(usage());
    return 0;
  }
  if (first === '-v' || first === '--version') {
    io.stdout(`${version()}\n`);
    return 0;
  }
  const name = first === undefined || first.startsWith('-') ? 'ui' : first;
  const args = first === undefined || first.startsWith('-') ? argv : rest;
  const entry = COMMANDS[name];
  if (!entry) {
    io.stderr(`voltwalk: unknown command "${name}" (accepted: ${Object.keys(COMMANDS).join(', ')}; see voltwalk --help)\n`);
    return 2;
  }
  try {
    const { command } = await entry.load();
    if (args.includes('--help') || args.includes('-h')) {
      io.stdout(command.help.endsWith('\n') ? command.help : `${command.help}\n`);
      return 0;
    }
    return await command.run(args, io);
  } catch (error) {
    return reportError(error, io, args.includes('--json'));
  }
}

function reportError(error: unknown, io: Io, json: boolean): number {
  if (error instanceof UserInputError) {
    if (json) io.stderr(`${JSON.stringify({ errors: error.problems })}\n`);
    else for (const p of error.message.split('\n')) io.stderr(`voltwalk: ${p}\n`);
    return 1;
  }
  if (error instanceof UsageError) {
    if (json) io.stderr(`${JSON.stringify({ errors: [{ code: 'usage', message: error.message }] })}\n`);
    else io.stderr(`voltwalk: ${error.message} (see --help)\n`);
    return 2;
  }
  // Anything else is our bug, not the user's: say so plainly, keep the detail for a report.
  const detail = error instanceof Error ? error.message : String(error);
  io.stderr(`voltwalk: internal error: ${detail}\nPlease report this with the command you ran.\n`);
  return 70;
}
