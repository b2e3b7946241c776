/** Errors the solver raises. Bad circuits (a user's file) become UserInputError elsewhere in ./validate.ts. */

/** Newton could not settle by any strategy; `nodes` names the unknowns that were still moving. */
export class ConvergenceError extends Error {
  readonly nodes: string[];
  readonly strategy: string;
  constructor(nodes: string[], strategy: string, detail = '') {
    const shown = nodes.slice(0, 8).join(', ') + (nodes.length > 8 ? `, … (${nodes.length} in all)` : '');
    super(
      `DC operating point did not converge after ${strategy}` +
        (nodes.length ? `; unsettled: ${shown}` : '') +
        (detail ? ` (${detail})` : ''),
    );
    this.name = 'ConvergenceError';
    this.nodes = nodes;
    this.strategy = strategy;
  }
}

/** A stamp value was NaN or infinite: a device law left its valid range. Caught by the Newton loop. */
export class StampError extends Error {
  readonly element: string;
  constructor(element: string, what: string, value: number) {
    super(`element ${element}: non-finite ${what} (${value}) in the circuit matrix`);
    this.name = 'StampError';
    this.element = element;
  }
}

/** The linearised circuit matrix is singular (e.g. a loop of voltage sources). */
export class SingularMatrixError extends Error {
  readonly row: number;
  constructor(row: number) {
    super(`circuit matrix is singular at row ${row}`);
    this.name = 'SingularMatrixError';
    this.row = row;
  }
}

/** Whether an error is the solver failing on a circuit (no operating point found), not a bug or bad input. */
export const isSolverFailure = (error: unknown): boolean =>
  error instanceof ConvergenceError || error instanceof SingularMatrixError || error instanceof StampError;
