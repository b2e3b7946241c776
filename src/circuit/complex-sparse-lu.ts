/**
 * Complex counterpart of SparseLu for the AC system: the same Markowitz plan with threshold
 * pivoting on |z|, made on the first frequency and replayed at the others (re-planned if a pivot
 * becomes too small). Real and imaginary parts are kept in separate dense row-major arrays.
 */
import { SingularMatrixError } from './errors.js';
import type { LuPlan as Plan } from './sparse-lu.js';

const PIVOT_THRESHOLD = 1e-3;
const ABSOLUTE_PIVOT = 1e-300;

export class ComplexSparseLu {
  readonly n: number;
  private readonly positions: Int32Array;
  private readonly pattern: Uint8Array;
  private readonly wr: Float64Array;
  private readonly wi: Float64Array;
  private plan: Plan | null = null;
  /** Plans made so far (for benchmarks). */
  plansMade = 0;

  constructor(n: number, pattern: Uint8Array, positions: Int32Array) {
    this.n = n;
    this.pattern = pattern;
    this.positions = positions;
    this.wr = new Float64Array(n * n);
    this.wi = new Float64Array(n * n);
  }

  /** Solves (re + j·im)·x = b; the matrix must be zero outside the pattern. */
  solve(re: Float64Array, im: Float64Array, bRe: Float64Array, bIm: Float64Array): { re: Float64Array; im: Float64Array } {
    if (!this.plan || !this.replay(re, im, this.plan)) this.plan = this.makePlan(re, im);
    return this.substitute(this.plan, bRe, bIm);
  }

  private load(re: Float64Array, im: Float64Array, fill: Int32Array): void {
    const { wr, wi, positions } = this;
    for (let t = 0; t < positions.length; t++) {
      const k = positions[t];
      wr[k] = re[k];
      wi[k] = im[k];
    }
    for (let t = 0; t < fill.length; t++) {
      wr[fill[t]] = 0;
      wi[fill[t]] = 0;
    }
  }

  private eliminate(r: number, c: number, rows: ArrayLike<number>, l0: number, l1: number, cols: ArrayLike<number>, u0: number, u1: number): void {
    const { n, wr, wi } = this;
    const pr = wr[r * n + c];
    const pi = wi[r * n + c];
    const d = pr * pr + pi * pi;
    for (let t = l0; t < l1; t++) {
      const base = rows[t] * n;
      const ar = wr[base + c];
      const ai = wi[base + c];
      const fr = (ar * pr + ai * pi) / d;
      const fi = (ai * pr - ar * pi) / d;
      wr[base + c] = fr;
      wi[base + c] = fi;
      if (fr === 0 && fi === 0) continue;
      for (let s = u0; s < u1; s++) {
        const cc = cols[s];
        const ur = wr[r * n + cc];
        const ui = wi[r * n + cc];
        wr[base + cc] -= fr * ur - fi * ui;
        wi[base + cc] -= fr * ui + fi * ur;
      }
    }
  }

  private replay(re: Float64Array, im: Float64Array, plan: Plan): boolean {
    const { n, wr, wi } = this;
    const { pr, pc, lStart, lRows, uStart, uCols } = plan;
    this.load(re, im, plan.fill);
    for (let k = 0; k < n; k++) {
      const r = pr[k];
      const c = pc[k];
      const ap = Math.hypot(wr[r * n + c], wi[r * n + c]);
      let colMax = ap;
      for (let t = lStart[k]; t < lStart[k + 1]; t++) {
        const idx = lRows[t] * n + c;
        const v = Math.hypot(wr[idx], wi[idx]);
        if (v > colMax) colMax = v;
      }
      if (!(ap > ABSOLUTE_PIVOT) || ap < PIVOT_THRESHOLD * colMax) return false;
      this.eliminate(r, c, lRows, lStart[k], lStart[k + 1], uCols, uStart[k], uStart[k + 1]);
    }
    return true;
  }

  private makePlan(re: Float64Array, im: Float64Array): Plan {
    const n = this.n;
    const { wr, wi } = this;
    this.load(re, im, new Int32Array(0));
    const s = this.pattern.slice();
    const rowCols: number[][] = Array.from({ length: n }, () => []);
    const colRows: number[][] = Array.from({ length: n }, () => []);
    for (const k of this.positions) {
      const i = Math.floor(k / n);
      rowCols[i].push(k - i * n);
      colRows[k - i * n].push(i);
    }
    const rowActive = new Uint8Array(n).fill(1);
    const colActive = new Uint8Array(n).fill(1);
    const rowCnt = Int32Array.from(rowCols.map((r) => r.length));
    const colCnt = Int32Array.from(colRows.map((c) => c.length));
    const pr = new Int32Array(n);
    const pc = new Int32Array(n);
    const lStart = new Int32Array(n + 1);
    const uStart = new Int32Array(n + 1);
    const lList: number[] = [];
    const uList: number[] = [];
    const fill: number[] = [];
    const mag = (idx: number) => Math.hypot(wr[idx], wi[idx]);
    for (let k = 0; k < n; k++) {
      let bestR = -1, bestC = -1, bestCost = Infinity, bestRatio = 0;
      for (let c = 0; c < n; c++) {
        if (!colActive[c]) continue;
        let colMax = 0;
        for (const r of colRows[c]) if (rowActive[r]) colMax = Math.max(colMax, mag(r * n + c));
        if (!(colMax > ABSOLUTE_PIVOT)) continue;
        for (const r of colRows[c]) {
          if (!rowActive[r]) continue;
          const v = mag(r * n + c);
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
        throw new SingularMatrixError(row);
      }
      const r = bestR, c = bestC;
      pr[k] = r;
      pc[k] = c;
      rowActive[r] = 0;
      colActive[c] = 0;
      for (const cc of rowCols[r]) colCnt[cc]--;
      for (const rr of colRows[c]) rowCnt[rr]--;
      lStart[k] = lList.length;
      uStart[k] = uList.length;
      const lRowsK = colRows[c].filter((rr) => rowActive[rr]);
      const uColsK = rowCols[r].filter((cc) => colActive[cc]);
      for (const rr of lRowsK) {
        for (const cc of uColsK) {
          const k2 = rr * n + cc;
          if (!s[k2]) {
            s[k2] = 1;
            wr[k2] = 0;
            wi[k2] = 0;
            fill.push(k2);
            rowCols[rr].push(cc);
            colRows[cc].push(rr);
            rowCnt[rr]++;
            colCnt[cc]++;
          }
        }
      }
      this.eliminate(r, c, lRowsK, 0, lRowsK.length, uColsK, 0, uColsK.length);
      lList.push(...lRowsK);
      uList.push(...uColsK);
    }
    lStart[n] = lList.length;
    uStart[n] = uList.length;
    this.plansMade++;
    return { pr, pc, lStart, uStart, lRows: Int32Array.from(lList), uCols: Int32Array.from(uList), fill: Int32Array.from(fill) };
  }

  private substitute(plan: Plan, bRe: Float64Array, bIm: Float64Array): { re: Float64Array; im: Float64Array } {
    const { n, wr, wi } = this;
    const { pr, pc, lStart, lRows, uStart, uCols } = plan;
    const zr = bRe.slice();
    const zi = bIm.slice();
    for (let k = 0; k < n; k++) {
      const r0 = pr[k];
      const ar = zr[r0], ai = zi[r0];
      if (ar === 0 && ai === 0) continue;
      const c = pc[k];
      for (let t = lStart[k]; t < lStart[k + 1]; t++) {
        const idx = lRows[t] * n + c;
        const fr = wr[idx], fi = wi[idx];
        zr[lRows[t]] -= fr * ar - fi * ai;
        zi[lRows[t]] -= fr * ai + fi * ar;
      }
    }
    const xr = new Float64Array(n);
    const xi = new Float64Array(n);
    for (let k = n - 1; k >= 0; k--) {
      const r = pr[k];
      const base = r * n;
      let sr = zr[r], si = zi[r];
      for (let t = uStart[k]; t < uStart[k + 1]; t++) {
        const cc = uCols[t];
        const ur = wr[base + cc], ui = wi[base + cc];
        sr -= ur * xr[cc] - ui * xi[cc];
        si -= ur * xi[cc] + ui * xr[cc];
      }
      const dr = wr[base + pc[k]], di = wi[base + pc[k]];
      const d = dr * dr + di * di;
      xr[pc[k]] = (sr * dr + si * di) / d;
      xi[pc[k]] = (si * dr - sr * di) / d;
    }
    return { re: xr, im: xi };
  }
}
