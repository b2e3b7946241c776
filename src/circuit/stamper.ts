/**
 * The one way any element writes into the MNA system A·x = b.
 *
 * Unknown indices are ints; ground is -1 and every write to it is skipped, so devices never test
 * for ground themselves. Every value is checked: a NaN or infinity throws StampError naming the
 * element (set in `owner` by the caller), instead of silently poisoning the solution.
 *
 * Row i of A is "sum of currents leaving node i = 0" for node unknowns, and the constraint
 * equation for branch unknowns. `recordPattern` marks every (row, col) a device touches, even
 * with a zero value, so the sparse factorisation can plan its fill-in once.
 */
import { StampError } from './errors.js';

export const GROUND_INDEX = -1;

export class Stamper {
  readonly size: number;
  readonly a: Float64Array;
  readonly b: Float64Array;
  owner = '';
  pattern: Uint8Array | null = null;
  private positions: Int32Array | null = null;

  constructor(size: number) {
    this.size = size;
    this.a = new Float64Array(size * size);
    this.b = new Float64Array(size);
  }

  clear(): void {
    const p = this.positions;
    if (p === null) {
      this.a.fill(0);
    } else {
      const a = this.a;
      for (let t = 0; t < p.length; t++) a[p[t]] = 0;
    }
    this.b.fill(0);
  }

  /**
   * Clear only these positions (row·size + column) from now on: every stamp must stay inside the
   * recorded pattern. The matrix must still be all zero when this is called.
   */
  restrictTo(positions: Int32Array): void {
    this.positions = positions;
  }

  /** Adds `value` at A[row][col]. */
  matrix(row: number, col: number, value: number): void {
    if (row < 0 || col < 0) return;
    if (!Number.isFinite(value)) throw new StampError(this.owner, `matrix entry (${row}, ${col})`, value);
    const k = row * this.size + col;
    this.a[k] += value;
    if (this.pattern !== null) this.pattern[k] = 1;
  }

  /** Adds `value` to b[row]. */
  rhs(row: number, value: number): void {
    if (row < 0) return;
    if (!Number.isFinite(value)) throw new StampError(this.owner, `right-hand side (${row})`, value);
    this.b[row] += value;
  }

  /** A conductance g between p and q. */
  conductance(p: number, q: number, g: number): void {
    this.matrix(p, p, g);
    this.matrix(q, q, g);
    this.matrix(p, q, -g);
    this.matrix(q, p, -g);
  }

  /** A current g·(v(cp) − v(cq)) flowing from p through the element to q. */
  transconductance(p: number, q: number, cp: number, cq: number, g: number): void {
    this.matrix(p, cp, g);
    this.matrix(p, cq, -g);
    this.matrix(q, cp, -g);
    this.matrix(q, cq, g);
  }

  /** A fixed current i flowing from p through the element to q (SPICE I-source sense). */
  current(p: number, q: number, i: number): void {
    this.rhs(p, -i);
    this.rhs(q, i);
  }

  /**
   * A branch unknown `br` carrying current from p through the element to q, with its own row
   * left for the caller's constraint; adds the branch's incidence in both directions.
   */
  branch(p: number, q: number, br: number): void {
    this.matrix(p, br, 1);
    this.matrix(q, br, -1);
    this.matrix(br, p, 1);
    this.matrix(br, q, -1);
  }
}
