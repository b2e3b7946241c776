import { resolve } from 'node:path';
import type { Command } from '../command.js';
import { parseOptions } from '../args.js';
import type { Board, Part } from '../../schemas/board.js';
import { DEMO_BOARD_FILE } from '../../board/bundled.js';
import { loadBoard } from '../../board/validate.js';
import { modelNameFor, preparedParts } from '../../board/values.js';
import { VALUE_RANGE } from '../../board/defaults.js';
import { bandsFor, formatValue } from '../../units/index.js';

const HELP = `Usage: voltwalk parts [--board FILE] [--json]

Lists a board's parts by stage: value, tolerance, where it sits, and for resistors the colour bands
a person should see (IEC 60062). Without --board, the bundled demo board.

  --board FILE   a board file (default: the bundled demo board)
  --json         machine-readable output:
                 {"board": id, "parts": [{"ref", "kind", "value", "tolerance", "stage", "where", ...}]}
                 value is in SI units (ohms, farads, henries) or null; tolerance a fraction or null

Examples:
  voltwalk parts
  voltwalk parts --board my-kit.json --json
`;

export interface PartRow {
  ref: string;
  kind: Part['kind'];
  value: number | null;
  tolerance: number | null;
  /** The first stage that lists the part (null when none does). */
  stage: string | null;
  /** Every stage that lists it: a dual op-amp can serve two. */
  stages: string[];
  where: string;
  label: string | null;
  model: string | null;
  bands: string[] | null;
}

export function partRows(board: Board): PartRow[] {
  return [...preparedParts(board).values()].map(({ part, value, tolerance }) => {
    const stages = board.stages.filter((s) => s.parts.includes(part.ref)).map((s) => s.id);
    const bands = part.kind === 'resistor' && value !== undefined ? bandsFor(value, tolerance) : [];
    return {
      ref: part.ref,
      kind: part.kind,
      value: value ?? null,
      tolerance: value === undefined ? null : (tolerance ?? null),
      stage: stages[0] ?? null,
      stages,
      where: part.where,
      label: part.label ?? null,
      model: modelNameFor(part) ?? null,
      bands: bands.length ? bands : null,
    };
  });
}

function valueText(row: PartRow): string {
  if (row.value !== null) return formatValue(row.value, VALUE_RANGE[row.kind]?.unit ?? '');
  return row.model ?? '';
}

function textReport(board: Board, rows: PartRow[]): string {
  const lines = [`${board.name} — ${rows.length} parts`];
  const groups: Array<{ label: string; rows: PartRow[] }> = board.stages.map((s) => ({ label: s.label, rows: rows.filter((r) => r.stages.includes(s.id)) }));
  const loose = rows.filter((r) => r.stages.length === 0);
  if (loose.length) groups.push({ label: 'In no stage', rows: loose });
  const refW = Math.max(...rows.map((r) => r.ref.length));
  const kindW = Math.max(...rows.map((r) => r.kind.length));
  const valW = Math.max(...rows.map((r) => valueText(r).length));
  for (const g of groups) {
    if (g.rows.length === 0) continue;
    lines.push('', g.label);
    for (const r of g.rows) {
      const tol = r.tolerance === null ? '' : `±${Number((r.tolerance * 100).toPrecision(3))} %`;
      const label = r.label ? `${r.label}; ` : '';
      const bands = r.bands ? `  [${r.bands.join(' ')}]` : '';
      lines.push(`  ${r.ref.padEnd(refW)}  ${r.kind.padEnd(kindW)}  ${valueText(r).padEnd(valW)}  ${tol.padEnd(7)}  ${label}${r.where}${bands}`);
    }
  }
  return `${lines.join('\n')}\n`;
}

export const command: Command = {
  name: 'parts',
  summary: "list a board's parts by stage",
  help: HELP,
  async run(args, io) {
    const { values } = parseOptions(args, { board: { type: 'string' }, json: { type: 'boolean' } }, false);
    const board = loadBoard(values.board !== undefined ? resolve(io.cwd, values.board) : DEMO_BOARD_FILE);
    const rows = partRows(board);
    if (values.json) io.stdout(`${JSON.stringify({ board: board.id, parts: rows }, null, 2)}\n`);
    else io.stdout(textReport(board, rows));
    return 0;
  },
};
