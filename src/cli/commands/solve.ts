import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import type { Command } from '../command.js';
import type { Io } from '../io.js';
import { parseOptions } from '../args.js';
import { UsageError, UserInputError, whyUnreadable } from '../../errors.js';
import type { Board, Condition } from '../../schemas/board.js';
import { BOARD_FORMAT } from '../../schemas/board.js';
import { buildCircuit, findCondition, loadBoard, roleCondition } from '../../board/index.js';
import { ConvergenceError, SingularMatrixError, solveAC, solveDC, type Circuit, type DcSolution } from '../../circuit/index.js';
import { parseNetlist } from '../../circuit/spice/index.js';
import { formatValue, parseValue } from '../../units/index.js';

const HELP = `Usage: voltwalk solve FILE [--json] [--ac FREQ] [--condition NAME]

The DC operating point of a circuit: every node's voltage and every source's current. With --ac,
the small-signal response at one frequency instead (sources' AC specs as the excitation).

FILE is a SPICE-subset netlist (elements R C L V I D Q E G, our op-amp form X… TL072, .model D/NPN/PNP;
numbers as SPICE reads them: m is milli, meg is mega) or a board file ("format": "${BOARD_FORMAT}").
A board is solved as set up for one of its conditions: --condition, else its quiescent condition,
else its first powered one.

  --json            machine-readable output:
                    DC {"converged": true, "nodes": {node: volts}, "sourceCurrents": {source: amps}, "warnings": [...]}
                    AC {"frequency": hz, "nodes": {node: {"mag": m, "phaseDeg": p}}, "warnings": [...]}
                    node and source names are lower case; "0" is ground
  --ac FREQ         small-signal analysis at FREQ hertz, e.g. 1k, 1kHz, 20
  --condition NAME  board files only: the condition to solve under

Examples:
  voltwalk solve divider.cir
  voltwalk solve trees/boards/wenlow-tamp.json --condition dc-above --json
  voltwalk solve filter.cir --ac 1k
`;

export interface LoadedCircuit {
  circuit: Circuit;
  warnings: string[];
  /** Set when FILE was a board. */
  board?: Board;
  condition?: Condition;
}

/** The condition a board is solved or exported under when none is named. */
export function defaultCondition(board: Board): Condition {
  const quiescent = roleCondition(board, 'quiescent');
  if (quiescent?.powered) return quiescent;
  return board.conditions.find((c) => c.powered) ?? quiescent ?? board.conditions[0];
}

export function boardCircuit(board: Board, conditionId: string | undefined): { circuit: Circuit; condition: Condition } {
  const condition = conditionId === undefined ? defaultCondition(board) : findCondition(board, conditionId);
  return { circuit: buildCircuit(board, condition.id).circuit, condition };
}

function isBoardText(text: string): boolean {
  if (!text.trimStart().startsWith('{')) return false;
  try {
    const raw = JSON.parse(text) as unknown;
    return typeof raw === 'object' && raw !== null && (raw as { format?: unknown }).format === BOARD_FORMAT;
  } catch {
    return false;
  }
}

/** Reads FILE as a board or a netlist, telling them apart by content. */
export function loadCircuitFile(file: string, conditionId: string | undefined): LoadedCircuit {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (error) {
    throw new UserInputError({ code: 'solve.file', file, message: whyUnreadable(error), accepted: 'a SPICE-subset netlist or a board file' });
  }
  if (isBoardText(text)) {
    const board = loadBoard(file);
    const { circuit, condition } = boardCircuit(board, conditionId);
    return { circuit, warnings: [], board, condition };
  }
  if (text.trimStart().startsWith('{')) {
    throw new UserInputError({
      code: 'solve.not-a-board',
      file,
      message: `a JSON file without "format": "${BOARD_FORMAT}"`,
      accepted: `a board file ("format": "${BOARD_FORMAT}") or a SPICE-subset netlist`,
    });
  }
  if (conditionId !== undefined) throw new UsageError('--condition applies to board files only; this file is a netlist');
  const { circuit, warnings } = parseNetlist(text, file);
  return { circuit, warnings };
}

/** The solver's failures, which a user's circuit causes, as one-line input errors. */
export function solveOrExplain(circuit: Circuit, file: string): DcSolution {
  try {
    return solveDC(circuit);
  } catch (error) {
    if (error instanceof ConvergenceError) {
      throw new UserInputError({
        code: 'solve.no-convergence',
        file,
        message: error.message,
        accepted: 'a circuit with a DC operating point (check for a missing ground path, a part value off by 10^6, or a source loop)',
      });
    }
    if (error instanceof SingularMatrixError) {
      throw new UserInputError({
        code: 'solve.singular',
        file,
        message: 'the circuit has no unique operating point (a loop of voltage sources, or a node with no DC path)',
        accepted: 'every node with a DC path to ground and no loop made only of voltage sources',
      });
    }
    throw error;
  }
}

function parseFrequency(text: string): number {
  let hz: number;
  try {
    hz = parseValue(text, { unit: 'Hz', field: '--ac' }).value;
  } catch {
    throw new UsageError(`--ac "${text}" is not a frequency (accepted: hertz above 0, e.g. 20, 1k, 1kHz)`);
  }
  if (!(hz > 0) || !Number.isFinite(hz)) throw new UsageError(`--ac "${text}" must be above 0 Hz (accepted: e.g. 20, 1k, 1kHz)`);
  return hz;
}

function table(rows: string[][]): string[] {
  const widths = rows[0].map((_, i) => Math.max(...rows.map((r) => r[i].length)));
  return rows.map((r) => r.map((cell, i) => (i === 0 ? cell.padEnd(widths[i]) : cell.padStart(widths[i]))).join('   ').trimEnd());
}

function heading(loaded: LoadedCircuit): string {
  if (loaded.board && loaded.condition) return `${loaded.board.name} — ${loaded.condition.id}: ${loaded.condition.label}`;
  return loaded.circuit.title || '(untitled netlist)';
}

export const command: Command = {
  name: 'solve',
  summary: 'DC operating point (or --ac FREQ) of a netlist or board file',
  help: HELP,
  async run(args: string[], io: Io): Promise<number> {
    const { values, positionals } = parseOptions(args, {
      json: { type: 'boolean' },
      ac: { type: 'string' },
      condition: { type: 'string' },
    });
    if (positionals.length !== 1) throw new UsageError(positionals.length === 0 ? 'solve needs a FILE' : `solve takes one FILE, got ${positionals.length}`);
    const frequency = values.ac === undefined ? undefined : parseFrequency(values.ac);
    const file = resolve(io.cwd, positionals[0]);
    const loaded = loadCircuitFile(file, values.condition);
    const op = solveOrExplain(loaded.circuit, file);
    const warnings = [...loaded.warnings, ...op.warnings];

    if (frequency !== undefined) {
      const hasExcitation = loaded.circuit.elements.some((e) => (e.kind === 'vsource' || e.kind === 'isource') && e.ac && e.ac.mag !== 0);
      if (!hasExcitation) warnings.push('no source has an AC spec (e.g. "V1 in 0 dc 0 ac 1"), so every node is 0');
      const ac = solveAC(loaded.circuit, frequency, { op });
      const nodes = Object.fromEntries(Object.entries(ac.nodes).map(([n, p]) => [n, { mag: p.mag, phaseDeg: p.phaseDeg }]));
      if (values.json) {
        io.stdout(`${JSON.stringify({ frequency: ac.frequency, nodes, warnings })}\n`);
        return 0;
      }
      const rows = [['node', 'magnitude', 'dB', 'phase']];
      for (const [n, p] of Object.entries(nodes)) {
        if (n === '0') continue;
        rows.push([n, formatValue(p.mag, 'V', 4), p.mag > 0 ? `${(20 * Math.log10(p.mag)).toFixed(2)} dB` : '−∞ dB', `${p.phaseDeg.toFixed(2)}°`]);
      }
      io.stdout([`${heading(loaded)} — small-signal at ${formatValue(frequency, 'Hz', 4)}`, '', ...table(rows), ''].join('\n'));
      for (const w of warnings) io.stderr(`voltwalk: warning: ${w}\n`);
      return 0;
    }

    if (values.json) {
      io.stdout(`${JSON.stringify({ converged: true, nodes: op.nodes, sourceCurrents: op.sourceCurrents, warnings })}\n`);
      return 0;
    }
    const nodeRows = [['node', 'voltage']];
    for (const [n, v] of Object.entries(op.nodes)) if (n !== '0') nodeRows.push([n, formatValue(v, 'V', 4)]);
    const sourceRows = [['source', 'current']];
    for (const [s, i] of Object.entries(op.sourceCurrents)) sourceRows.push([s, formatValue(i, 'A', 4)]);
    const lines = [heading(loaded), '', ...table(nodeRows)];
    if (sourceRows.length > 1) lines.push('', ...table(sourceRows), '(source currents in SPICE\'s sense: positive flows into the + terminal through the source)');
    io.stdout(`${lines.join('\n')}\n`);
    for (const w of warnings) io.stderr(`voltwalk: warning: ${w}\n`);
    return 0;
  },
};
