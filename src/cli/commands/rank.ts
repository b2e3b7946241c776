import type { Command } from '../command.js';

// Placeholder until this command lands; it says so rather than pretending to work.
export const command: Command = {
  name: 'rank',
  summary: '',
  help: 'voltwalk rank: not built yet.',
  async run(_args, io) {
    io.stderr('voltwalk rank: not built yet\n');
    return 2;
  },
};
