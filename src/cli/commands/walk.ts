import type { Command } from '../command.js';

// Placeholder until this command lands; it says so rather than pretending to work.
export const command: Command = {
  name: 'walk',
  summary: '',
  help: 'voltwalk walk: not built yet.',
  async run(_args, io) {
    io.stderr('voltwalk walk: not built yet\n');
    return 2;
  },
};
