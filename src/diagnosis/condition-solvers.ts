import type { Board } from '../schemas/board.js';
import type { BuiltCircuit } from '../board/index.js';
import { createDcSolver, type DcSolver } from '../circuit/index.js';

/**
 * One compiled solver of a board per group of powered conditions whose circuits differ only in
 * values a solver can change in place: pot positions and source volts. A condition sets the pots
 * (position), switches (position) and test signal (net, source resistance, volts) of the board it
 * builds (build-circuit.ts); switches and the signal's presence, net and resistance shape the
 * netlist, the rest are values. Compiling costs about as much as a few Newton iterations, and a
 * faulty board is solved under a dozen conditions.
 *
 * A solver handed out is as one freshly compiled from that condition's circuit: its values are
 * written from the circuit (the same formulas compile uses) and its pivot plans emptied.
 */
export class ConditionSolvers {
  private readonly kept = new Map<string, { solver: DcSolver; names: string[] }>();

  constructor(private readonly board: Board) {}

  solverFor(conditionId: string, { circuit }: BuiltCircuit): DcSolver {
    const key = structureKey(this.board, conditionId);
    const names = circuit.elements.map((e) => e.name);
    const kept = key === undefined ? undefined : this.kept.get(key);
    if (!kept || kept.names.length !== names.length || kept.names.some((n, i) => n !== names[i])) {
      const solver = createDcSolver(circuit);
      if (key !== undefined) this.kept.set(key, { solver, names });
      return solver;
    }
    const { solver } = kept;
    for (const e of circuit.elements) {
      if (e.kind === 'pot') solver.setValue(e.name, 'position', e.position);
      else if (e.kind === 'vsource') solver.setValue(e.name, 'dc', e.dc);
    }
    solver.engine.lu.restorePlans([]);
    return solver;
  }
}

/** What of a powered condition shapes its netlist; undefined for an unknown or unpowered one. */
function structureKey(board: Board, conditionId: string): string | undefined {
  const condition = board.conditions.find((c) => c.id === conditionId);
  if (!condition?.powered) return undefined;
  const switches = board.parts.filter((p) => p.kind === 'switch').map((p) => condition.settings[p.ref] ?? null);
  const signal = condition.signal ? [condition.signal.net, condition.signal.sourceResistance] : null;
  return JSON.stringify([switches, signal]);
}
