import type { Command } from '../command.js';

// Placeholder until this command lands; it says so rather than pretending to work.
export const command: Command = {
  name: 'trees',
  summary: '',
  help: 'voltwalk trees: not built yet.',
  async run(_args, io) {
    io.stderr('voltwalk trees: not built yet\n');
    return 2;
  },
};
