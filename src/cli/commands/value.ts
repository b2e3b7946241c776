import type { Command } from '../command.js';

// Placeholder until this command lands; it says so rather than pretending to work.
export const command: Command = {
  name: 'value',
  summary: '',
  help: 'voltwalk value: not built yet.',
  async run(_args, io) {
    io.stderr('voltwalk value: not built yet\n');
    return 2;
  },
};
