import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { SparseLu } from '../../src/circuit/sparse-lu.js';
import { DenseLu } from '../../src/circuit/dense-lu.js';
import { SingularMatrixError } from '../../src/circuit/errors.js';

// Solutions checked by the residual ‖A·x − b‖ (a definition, not another solver's output), and
// against dense partial-pivoting LU.
const matrix = fc.integer({ min: 1, max: 12 }).chain((n) =>
  fc.record({
    n: fc.constant(n),
    entries: fc.array(fc.tuple(fc.integer({ min: 0, max: n - 1 }), fc.integer({ min: 0, max: n - 1 }), fc.double({ min: -10, max: 10, noNaN: true }).filter((v) => Math.abs(v) > 1e-3)), { maxLength: 3 * n }),
    diag: fc.array(fc.double({ min: 0.5, max: 20, noNaN: true }), { minLength: n, maxLength: n }),
    // A random permutation: the big entries sit on (i, perm[i]), so many diagonals are zero and
    // pivoting is needed, yet the matrix always has a full transversal.
    perm: fc.shuffledSubarray(Array.from({ length: n }, (_, i) => i), { minLength: n, maxLength: n }),
    b: fc.array(fc.double({ min: -5, max: 5, noNaN: true }), { minLength: n, maxLength: n }),
  }),
);

describe('SparseLu', () => {
  it('solves random sparse systems, including zero diagonals, and agrees with dense LU', () => {
    fc.assert(
      fc.property(matrix, ({ n, entries, diag, perm, b }) => {
        const a = new Float64Array(n * n);
        const pattern = new Uint8Array(n * n);
        // Dominant entries of at least 50 on the permuted diagonal against at most 3n others of at
        // most 10 keep the draws comfortably regular.
        for (let i = 0; i < n; i++) a[i * n + perm[i]] += diag[i] * 100;
        for (const [i, j, v] of entries) a[i * n + j] += v;
        for (let k = 0; k < n * n; k++) if (a[k] !== 0) pattern[k] = 1;
        const dense = new DenseLu(n);
        try {
          dense.factor(a);
        } catch (e) {
          if (e instanceof SingularMatrixError) return; // rare singular draw: nothing to compare
          throw e;
        }
        const lu = new SparseLu(n, pattern);
        const bb = Float64Array.from(b);
        const x = new Float64Array(n);
        lu.factor(a);
        lu.solve(bb, x);
        const xd = new Float64Array(n);
        dense.solve(bb, xd);
        let scale = 0;
        for (let i = 0; i < n; i++) scale = Math.max(scale, Math.abs(xd[i]));
        for (let i = 0; i < n; i++) expect(Math.abs(x[i] - xd[i])).toBeLessThanOrEqual(1e-8 * (scale + 1));
        // Refactoring the same pattern with new values replays the plan.
        const a2 = a.map((v) => v * 1.5);
        lu.factor(a2);
        lu.solve(bb, x);
        for (let i = 0; i < n; i++) expect(Math.abs(x[i] * 1.5 - xd[i])).toBeLessThanOrEqual(1e-8 * (scale + 1));
      }),
      { numRuns: 300 },
    );
  });

  it('re-plans when a replayed pivot has become zero', () => {
    const pattern = Uint8Array.from([1, 1, 1, 1]);
    const lu = new SparseLu(2, pattern);
    const x = new Float64Array(2);
    lu.factor(Float64Array.from([2, 1, 1, 3]));
    lu.solve(Float64Array.from([3, 4]), x);
    expect(x[0]).toBeCloseTo(1, 12);
    lu.factor(Float64Array.from([0, 1, 1, 3]));
    lu.solve(Float64Array.from([1, 4]), x);
    // [0 1; 1 3]·x = [1; 4] → x = [1, 1]: the (0,0) pivot of the first plan is unusable now.
    expect(x[0]).toBeCloseTo(1, 12);
    expect(x[1]).toBeCloseTo(1, 12);
  });

  it('keeps a plan whose pivot has become small, and refines the answer back to full precision', () => {
    // A pattern no other test uses, so the plan is this instance's own: the third unknown first
    // (it touches nothing), then the (0,0) entry, the largest of its column.
    const pattern = Uint8Array.from([1, 1, 0, 1, 1, 0, 0, 0, 1]);
    const lu = new SparseLu(3, pattern);
    const x = new Float64Array(3);
    lu.factor(Float64Array.from([2, 1, 0, 1, 3, 0, 0, 0, 1]));
    const planned = lu.plansMade;
    // [ε 1; 1 1]·x = [1; 2] with ε = 1e-6: the plan's (0,0) pivot is now a millionth of its
    // column. Eliminating on it loses about six digits; one refinement step wins them back.
    const eps = 1e-6;
    lu.factor(Float64Array.from([eps, 1, 0, 1, 1, 0, 0, 0, 1]));
    expect(lu.plansMade).toBe(planned);
    lu.solve(Float64Array.from([1, 2, 5]), x);
    const x0 = 1 / (1 - eps);
    const x1 = 1 - eps * x0;
    expect(Math.abs(x[0] - x0)).toBeLessThanOrEqual(4e-16);
    expect(Math.abs(x[1] - x1)).toBeLessThanOrEqual(4e-16);
    expect(x[2]).toBe(5);
  });

  it('solves a random sparse 200 × 200 system whose elimination fills in far beyond its pattern', () => {
    // About four entries a row at random places, with a dominant diagonal: a random graph, so the
    // factors hold several times the pattern's entries (more than the planner's first list size,
    // which must grow). Checked by the residual and against dense LU.
    const n = 200;
    const a = new Float64Array(n * n);
    let seed = 12345;
    const rnd = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
    for (let i = 0; i < n; i++) {
      a[i * n + i] = 10;
      for (let t = 0; t < 3; t++) {
        const j = Math.floor(rnd() * n);
        if (j !== i) a[i * n + j] = rnd() - 0.5;
      }
    }
    const pattern = Uint8Array.from(a, (v) => (v !== 0 ? 1 : 0));
    const b = Float64Array.from({ length: n }, (_, i) => Math.sin(i));
    const lu = new SparseLu(n, pattern);
    const x = new Float64Array(n);
    lu.factor(a);
    lu.solve(b, x);
    const dense = new DenseLu(n);
    dense.factor(a);
    const xd = new Float64Array(n);
    dense.solve(b, xd);
    let worst = 0;
    for (let i = 0; i < n; i++) {
      let r = -b[i];
      for (let j = 0; j < n; j++) r += a[i * n + j] * x[j];
      worst = Math.max(worst, Math.abs(r), Math.abs(x[i] - xd[i]) / (1 + Math.abs(xd[i])));
    }
    // Threshold pivoting (any pivot within 1e-3 of its column's largest: SPICE's sparse solver's
    // default relative threshold, from memory) trades digits for less fill: here the residual is
    // ≈6e-11 against dense LU's 1e-15, far below the solver's 1 µV / 1 pA tolerances.
    expect(worst).toBeLessThan(1e-9);
  });

  it('reports a singular matrix', () => {
    const lu = new SparseLu(2, Uint8Array.from([1, 1, 1, 1]));
    expect(() => lu.factor(Float64Array.from([1, 2, 2, 4]))).toThrow(SingularMatrixError);
  });
});
