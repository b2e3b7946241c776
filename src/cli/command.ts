import type { Io } from './io.js';

/** One subcommand of the CLI. `run` returns the exit code: 0 success, 1 bad input, 2 usage. */
export interface Command {
  name: string;
  /** One line for the command list. */
  summary: string;
  /** Full help: usage line, options, an example. */
  help: string;
  run(args: string[], io: Io): Promise<number>;
}
