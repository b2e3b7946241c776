import { basename } from 'node:path';
import type { Command } from '../command.js';
import { parseOptions } from '../args.js';
import { bundledTreeFiles, loadTree } from '../../engine/index.js';

const HELP = `Usage: voltwalk trees [--json]

Lists the diagnostic trees shipped with voltwalk: one line each, id and symptom.
Walk one with \`voltwalk walk --tree ID --answers FILE\`, or in the terminal UI.

  --json   machine-readable output:
           {"trees": [{"id", "symptom", "description", "file", "steps"}]}

Examples:
  voltwalk trees
  voltwalk trees --json
`;

export const command: Command = {
  name: 'trees',
  summary: 'list the diagnostic trees',
  help: HELP,
  async run(args, io) {
    const { values } = parseOptions(args, { json: { type: 'boolean' } }, false);
    const trees = bundledTreeFiles().map((file) => ({ file, tree: loadTree(file) }));
    if (values.json) {
      const rows = trees.map(({ file, tree }) => ({ id: tree.id, symptom: tree.symptom, description: tree.description, file: basename(file), steps: Object.keys(tree.nodes).length }));
      io.stdout(`${JSON.stringify({ trees: rows }, null, 2)}\n`);
      return 0;
    }
    const width = Math.max(...trees.map(({ tree }) => tree.id.length));
    for (const { tree } of trees) io.stdout(`${tree.id.padEnd(width)}  ${tree.symptom}\n`);
    return 0;
  },
};
