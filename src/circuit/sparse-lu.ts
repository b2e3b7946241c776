/**
 * Sparse LU for circuit matrices, with the pivot order planned once and reused.
 *
 * Values live in a dense row-major array (simple and fast at a few hundred unknowns), but the
 * elimination only visits the positions that can be nonzero: the circuit's pattern plus fill-in.
 * The first factorisation chooses pivots by Markowitz's rule (fewest (rows−1)·(cols−1) updates)
 * among entries within a factor PIVOT_THRESHOLD of their column's largest, and records the order
 * and, per step, which rows and columns it touches. Later factorisations of the same pattern
 * replay that plan and only re-plan if a pivot has become too small relative to its column.
 */
import { SingularMatrixError } from './errors.js';

const PIVOT_THRESHOLD = 1e-3;
const ABSOLUTE_PIVOT = 1e-300;

export class SparseLu {
  readonly n: number;
  private readonly pattern: Uint8Array;
  private readonly w: Float64Array;
  private readonly z: Float64Array;
  private planned = false;
  private pr = new Int32Array(0);
  private pc = new Int32Array(0);
  private lStart = new Int32Array(0);
  private lRows = new Int32Array(0);
  private uStart = new Int32Array(0);
  private uCols = new Int32Array(0);
  /** How many times a plan was made (for tests and benchmarks). */
  plans = 0;

  constructor(n: number, pattern: Uint8Array) {
    this.n = n;
    this.pattern = pattern;
    this.w = new Float64Array(n * n);
    this.z = new Float64Array(n);
  }

  factor(a: Float64Array): void {
    if (this.planned && this.replay(a)) return;
    this.plan(a);
  }

  private replay(a: Float64Array): boolean {
    const { n, w, pr, pc, lStart, lRows, uStart, uCols } = this;
    w.set(a);
    for (let k = 0; k < n; k++) {
      const r = pr[k];
      const c = pc[k];
      const piv = w[r * n + c];
      const ap = Math.abs(piv);
      const l0 = lStart[k];
      const l1 = lStart[k + 1];
      let colMax = ap;
      for (let t = l0; t < l1; t++) {
        const v = Math.abs(w[lRows[t] * n + c]);
        if (v > colMax) colMax = v;
      }
      if (!(ap > ABSOLUTE_PIVOT) || ap < PIVOT_THRESHOLD * colMax) return false;
      const u0 = uStart[k];
      const u1 = uStart[k + 1];
      const rowBase = r * n;
      for (let t = l0; t < l1; t++) {
        const base = lRows[t] * n;
        const f = w[base + c] / piv;
        w[base + c] = f;
        if (f === 0) continue;
        for (let s = u0; s < u1; s++) {
          const cc = uCols[s];
          w[base + cc] -= f * w[rowBase + cc];
        }
      }
    }
    return true;
  }

  private plan(a: Float64Array): void {
    const n = this.n;
    const w = this.w;
    w.set(a);
    const s = this.pattern.slice();
    const rowCols: number[][] = [];
    const colRows: number[][] = [];
    for (let i = 0; i < n; i++) {
      rowCols.push([]);
      colRows.push([]);
    }
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        if (s[i * n + j]) {
          rowCols[i].push(j);
          colRows[j].push(i);
        }
      }
    }
    const rowActive = new Uint8Array(n).fill(1);
    const colActive = new Uint8Array(n).fill(1);
    const rowCnt = new Int32Array(n);
    const colCnt = new Int32Array(n);
    for (let i = 0; i < n; i++) {
      rowCnt[i] = rowCols[i].length;
      colCnt[i] = colRows[i].length;
    }
    const pr = new Int32Array(n);
    const pc = new Int32Array(n);
    const lStart = new Int32Array(n + 1);
    const uStart = new Int32Array(n + 1);
    const lList: number[] = [];
    const uList: number[] = [];

    for (let k = 0; k < n; k++) {
      let bestR = -1;
      let bestC = -1;
      let bestCost = Infinity;
      let bestRatio = 0;
      for (let c = 0; c < n; c++) {
        if (!colActive[c]) continue;
        const rows = colRows[c];
        let colMax = 0;
        for (const r of rows) {
          if (!rowActive[r]) continue;
          const v = Math.abs(w[r * n + c]);
          if (v > colMax) colMax = v;
        }
        if (!(colMax > ABSOLUTE_PIVOT)) continue;
        for (const r of rows) {
          if (!rowActive[r]) continue;
          const v = Math.abs(w[r * n + c]);
          if (v < PIVOT_THRESHOLD * colMax || !(v > ABSOLUTE_PIVOT)) continue;
          const cost = (rowCnt[r] - 1) * (colCnt[c] - 1);
          const ratio = v / colMax;
          if (cost < bestCost || (cost === bestCost && ratio > bestRatio)) {
            bestCost = cost;
            bestRatio = ratio;
            bestR = r;
            bestC = c;
          }
        }
      }
      if (bestR < 0) {
        let row = 0;
        while (row < n && !rowActive[row]) row++;
        this.planned = false;
        throw new SingularMatrixError(row);
      }
      const r = bestR;
      const c = bestC;
      pr[k] = r;
      pc[k] = c;
      rowActive[r] = 0;
      colActive[c] = 0;
      for (const cc of rowCols[r]) colCnt[cc]--;
      for (const rr of colRows[c]) rowCnt[rr]--;
      lStart[k] = lList.length;
      uStart[k] = uList.length;
      const lRowsK: number[] = [];
      const uColsK: number[] = [];
      for (const rr of colRows[c]) if (rowActive[rr]) lRowsK.push(rr);
      for (const cc of rowCols[r]) if (colActive[cc]) uColsK.push(cc);
      lList.push(...lRowsK);
      uList.push(...uColsK);
      const piv = w[r * n + c];
      for (const rr of lRowsK) {
        const base = rr * n;
        const f = w[base + c] / piv;
        w[base + c] = f;
        for (const cc of uColsK) {
          const k2 = base + cc;
          if (!s[k2]) {
            s[k2] = 1;
            rowCols[rr].push(cc);
            colRows[cc].push(rr);
            rowCnt[rr]++;
            colCnt[cc]++;
          }
          w[k2] -= f * w[r * n + cc];
        }
      }
    }
    lStart[n] = lList.length;
    uStart[n] = uList.length;
    this.pr = pr;
    this.pc = pc;
    this.lStart = lStart;
    this.uStart = uStart;
    this.lRows = Int32Array.from(lList);
    this.uCols = Int32Array.from(uList);
    this.planned = true;
    this.plans++;
  }

  /** Solves with the last factorisation: x[unknown] from b[row]. */
  solve(b: Float64Array, x: Float64Array): void {
    const { n, w, z, pr, pc, lStart, lRows, uStart, uCols } = this;
    z.set(b);
    for (let k = 0; k < n; k++) {
      const zk = z[pr[k]];
      if (zk === 0) continue;
      const c = pc[k];
      for (let t = lStart[k]; t < lStart[k + 1]; t++) {
        const r = lRows[t];
        z[r] -= w[r * n + c] * zk;
      }
    }
    for (let k = n - 1; k >= 0; k--) {
      const r = pr[k];
      const base = r * n;
      let sum = z[r];
      for (let t = uStart[k]; t < uStart[k + 1]; t++) {
        const cc = uCols[t];
        sum -= w[base + cc] * x[cc];
      }
      x[pc[k]] = sum / w[base + pc[k]];
    }
  }
}
