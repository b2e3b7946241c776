/** Dense LU with partial pivoting, in place, for the small systems (and as a reference in tests). */
import { SingularMatrixError } from './errors.js';

export class DenseLu {
  readonly n: number;
  private readonly lu: Float64Array;
  private readonly perm: Int32Array;

  constructor(n: number) {
    this.n = n;
    this.lu = new Float64Array(n * n);
    this.perm = new Int32Array(n);
  }

  factor(a: Float64Array): void {
    const n = this.n;
    const lu = this.lu;
    lu.set(a);
    for (let i = 0; i < n; i++) this.perm[i] = i;
    for (let k = 0; k < n; k++) {
      let p = k;
      let best = Math.abs(lu[k * n + k]);
      for (let i = k + 1; i < n; i++) {
        const v = Math.abs(lu[i * n + k]);
        if (v > best) {
          best = v;
          p = i;
        }
      }
      if (!(best > 1e-300)) throw new SingularMatrixError(this.perm[k]);
      if (p !== k) {
        for (let j = 0; j < n; j++) {
          const t = lu[k * n + j];
          lu[k * n + j] = lu[p * n + j];
          lu[p * n + j] = t;
        }
        const t = this.perm[k];
        this.perm[k] = this.perm[p];
        this.perm[p] = t;
      }
      const pivot = lu[k * n + k];
      for (let i = k + 1; i < n; i++) {
        const f = lu[i * n + k] / pivot;
        if (f === 0) continue;
        lu[i * n + k] = f;
        for (let j = k + 1; j < n; j++) lu[i * n + j] -= f * lu[k * n + j];
      }
    }
  }

  solve(b: Float64Array, x: Float64Array): void {
    const n = this.n;
    const lu = this.lu;
    for (let i = 0; i < n; i++) {
      let s = b[this.perm[i]];
      for (let j = 0; j < i; j++) s -= lu[i * n + j] * x[j];
      x[i] = s;
    }
    for (let i = n - 1; i >= 0; i--) {
      let s = x[i];
      for (let j = i + 1; j < n; j++) s -= lu[i * n + j] * x[j];
      x[i] = s / lu[i * n + i];
    }
  }
}
