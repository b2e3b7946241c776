import type { Command } from '../command.js';

// Placeholder until this command lands; it says so rather than pretending to work.
export const command: Command = {
  name: 'parts',
  summary: '',
  help: 'voltwalk parts: not built yet.',
  async run(_args, io) {
    io.stderr('voltwalk parts: not built yet\n');
    return 2;
  },
};
