import type { Command } from '../command.js';

// Placeholder until this command lands; it says so rather than pretending to work.
export const command: Command = {
  name: 'check',
  summary: '',
  help: 'voltwalk check: not built yet.',
  async run(_args, io) {
    io.stderr('voltwalk check: not built yet\n');
    return 2;
  },
};
