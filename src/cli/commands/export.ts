import type { Command } from '../command.js';

// Placeholder until this command lands; it says so rather than pretending to work.
export const command: Command = {
  name: 'export',
  summary: '',
  help: 'voltwalk export: not built yet.',
  async run(_args, io) {
    io.stderr('voltwalk export: not built yet\n');
    return 2;
  },
};
