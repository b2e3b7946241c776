/**
 * Sparse LU for circuit matrices, with pivot orders planned once and reused.
 *
 * Values live in a dense row-major array (simple and fast at a few hundred unknowns), but the
 * elimination only visits the positions that can be nonzero: the circuit's pattern plus fill-in.
 * A plan chooses pivots by Markowitz's rule (fewest (rows−1)·(cols−1) updates) among entries
 * within PIVOT_THRESHOLD of their column's largest, and records the order and, per step, which
 * rows and columns it touches. Later factorisations replay a plan and only re-plan when a pivot
 * has become far too small relative to its column (REPLAY_THRESHOLD; an op-amp saturating, a
 * junction turning off).
 * Each instance keeps its recent plans, so a circuit flipping between states does not plan again.
 * Plans are not shared between instances: which plan factors a matrix decides its rounding, and
 * Newton lands anywhere within its tolerance, so a shared cache would make a new solver's answer
 * depend on whatever the process solved before. A caller that needs answers independent of the
 * order of its solves saves the plan list once (savePlans) and restores it before each solve.
 */
import { SingularMatrixError } from './errors.js';

const PIVOT_THRESHOLD = 1e-3;
/**
 * A kept plan is replayed while each pivot stays above this fraction of its column: looser than
 * the planning threshold, so a plan survives the swings of a Newton solve (an op-amp going into
 * saturation and back) instead of being planned again. Safe because no answer rests on one
 * factorisation alone: Newton only stops when its step is small and KCL holds with the devices'
 * true currents, so a less accurate step costs iterations, never a wrong operating point. Building
 * the demo board's fault dictionary (with plans then shared between solvers of one pattern) with
 * 1e-3, 1e-6, 1e-7, 1e-8 and 1e-9: 72.6k, 37.1k, 26.1k, 12.9k and 8.5k plans for 314k, 320k,
 * 334k, 341k and 450k factorisations; predictions lost to faulty circuits that did not settle: 46,
 * —, 23, 92, — of 163k. 1e-7 made a third of the plans for 6 % more factorisations, and settled
 * the most. Digits a small pivot costs are won back in solve() by one step of iterative refinement.
 */
const REPLAY_THRESHOLD = 1e-7;
const ABSOLUTE_PIVOT = 1e-300;
/**
 * Plans kept per instance. A board's LEDs and detector diodes switch on and off between faults and
 * conditions, and a plan that pivots on a conducting junction fails once it is off, so a circuit
 * meets many pivot layouts; a failed replay stops at the first small pivot (early in the order),
 * so trying more kept plans is cheap. Building the demo board's fault dictionary with 4 and 16
 * kept plans: 39.3k and 31.6k plans made, best of two 15.8 and 14.3 s CPU.
 */
const PLANS_KEPT = 16;

export interface LuPlan {
  pr: Int32Array;
  pc: Int32Array;
  lStart: Int32Array;
  lRows: Int32Array;
  uStart: Int32Array;
  uCols: Int32Array;
  /** Fill-in positions, zeroed before each replay. */
  fill: Int32Array;
}

/**
 * Working arrays of the planner, kept by an instance between plans (a circuit of n unknowns plans
 * many times; allocating these each time cost more than the pivot search). Row and column lists
 * are n slots each, as fill-in can grow a row to every column; the L, U and fill lists start at a
 * few times the pattern's size and double when a plan needs more.
 */
interface PlanScratch {
  rowIdx: Int32Array;
  colIdx: Int32Array;
  rowLen: Int32Array;
  colLen: Int32Array;
  rowActive: Uint8Array;
  colActive: Uint8Array;
  rowCnt: Int32Array;
  colCnt: Int32Array;
  colValid: Uint8Array;
  colBestR: Int32Array;
  colBestCost: Float64Array;
  colBestRatio: Float64Array;
  lBuf: Int32Array;
  uBuf: Int32Array;
  fillBuf: Int32Array;
  pr: Int32Array;
  pc: Int32Array;
  lStart: Int32Array;
  uStart: Int32Array;
}

function planScratch(n: number, nonzeros: number): PlanScratch {
  const list = Math.min(n * n, 4 * nonzeros + n);
  return {
    rowIdx: new Int32Array(n * n),
    colIdx: new Int32Array(n * n),
    rowLen: new Int32Array(n),
    colLen: new Int32Array(n),
    rowActive: new Uint8Array(n),
    colActive: new Uint8Array(n),
    rowCnt: new Int32Array(n),
    colCnt: new Int32Array(n),
    colValid: new Uint8Array(n),
    colBestR: new Int32Array(n),
    colBestCost: new Float64Array(n),
    colBestRatio: new Float64Array(n),
    lBuf: new Int32Array(list),
    uBuf: new Int32Array(list),
    fillBuf: new Int32Array(list),
    pr: new Int32Array(n),
    pc: new Int32Array(n),
    lStart: new Int32Array(n + 1),
    uStart: new Int32Array(n + 1),
  };
}

/** `buffer` itself if it holds `needed` entries, else a copy twice as large (at least `needed`). */
function room(buffer: Int32Array, needed: number): Int32Array {
  if (needed <= buffer.length) return buffer;
  const grown = new Int32Array(Math.max(needed, 2 * buffer.length));
  grown.set(buffer);
  return grown;
}

/**
 * A plan's seven lists copied out of the planning scratch into one buffer: a circuit plans tens of
 * thousands of times in a fault dictionary, and seven allocations cost a third of a plan.
 */
function packPlan(...lists: Int32Array[]): LuPlan {
  const total = lists.reduce((sum, l) => sum + l.length, 0);
  const buffer = new Int32Array(total);
  const views: Int32Array[] = [];
  let at = 0;
  for (const l of lists) {
    buffer.set(l, at);
    views.push(buffer.subarray(at, at + l.length));
    at += l.length;
  }
  const [pr, pc, lStart, uStart, lRows, uCols, fill] = views;
  return { pr, pc, lStart, uStart, lRows, uCols, fill };
}

/** A fresh plan starts from the pattern alone: no fill-in positions to clear. */
const NO_FILL = new Int32Array(0);

/** Moves (or adds) a plan to the front of a most-recent-first list of at most `limit`. */
function remember(list: LuPlan[], plan: LuPlan, limit: number): void {
  const at = list.indexOf(plan);
  if (at >= 0) list.splice(at, 1);
  list.unshift(plan);
  if (list.length > limit) list.pop();
}

export class SparseLu {
  readonly n: number;
  private readonly pattern: Uint8Array;
  private readonly positions: Int32Array;
  private readonly w: Float64Array;
  private readonly z: Float64Array;
  /** Planning scratch: the pattern plus fill-in found so far. */
  private readonly mark: Uint8Array;
  /** This instance's recent plans, most recent first. */
  private plans: LuPlan[] = [];
  private current: LuPlan | null = null;
  /**
   * Whether the last factorisation replayed a pivot below PIVOT_THRESHOLD of its column; solve()
   * then refines its answer once against the matrix as given (kept in `a0`, pattern positions only).
   */
  private weak = false;
  private readonly a0: Float64Array;
  private readonly r: Float64Array;
  private readonly d: Float64Array;
  /** How many plans this instance made (for tests and benchmarks). */
  plansMade = 0;

  constructor(n: number, pattern: Uint8Array, positions?: Int32Array) {
    this.n = n;
    this.pattern = pattern;
    if (positions) {
      this.positions = positions;
    } else {
      const pos: number[] = [];
      for (let k = 0; k < pattern.length; k++) if (pattern[k]) pos.push(k);
      this.positions = Int32Array.from(pos);
    }
    this.w = new Float64Array(n * n);
    this.z = new Float64Array(n);
    this.a0 = new Float64Array(this.positions.length);
    this.r = new Float64Array(n);
    this.d = new Float64Array(n);
    this.mark = new Uint8Array(n * n);
  }

  /** The kept plans as they are now, for restorePlans. */
  savePlans(): readonly LuPlan[] {
    return this.plans.slice();
  }

  /** Puts back a saved plan list (an empty one: as a new instance). */
  restorePlans(saved: readonly LuPlan[]): void {
    this.plans = saved.slice();
  }

  /** Factors `a`, which must be zero outside the pattern. */
  factor(a: Float64Array): void {
    for (let i = 0; i < this.plans.length; i++) {
      const plan = this.plans[i];
      if (this.replay(a, plan)) {
        if (i > 0) remember(this.plans, plan, PLANS_KEPT);
        this.current = plan;
        return;
      }
    }
    const plan = this.plan(a);
    remember(this.plans, plan, PLANS_KEPT);
    this.current = plan;
  }

  private load(a: Float64Array, fill: Int32Array): void {
    const { w, positions, a0 } = this;
    for (let t = 0; t < positions.length; t++) {
      const k = positions[t];
      w[k] = a[k];
      a0[t] = a[k];
    }
    for (let t = 0; t < fill.length; t++) w[fill[t]] = 0;
  }

  private replay(a: Float64Array, plan: LuPlan): boolean {
    const { n, w } = this;
    const { pr, pc, lStart, lRows, uStart, uCols } = plan;
    this.load(a, plan.fill);
    this.weak = false;
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
      if (!(ap > ABSOLUTE_PIVOT) || ap < REPLAY_THRESHOLD * colMax) return false;
      if (ap < PIVOT_THRESHOLD * colMax) this.weak = true;
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

  /** Planning scratch, made on the first plan: see PlanScratch. */
  private scratch: PlanScratch | null = null;

  private plan(a: Float64Array): LuPlan {
    const n = this.n;
    const w = this.w;
    this.load(a, NO_FILL);
    this.weak = false;
    const s = this.mark;
    s.set(this.pattern);
    const sc = (this.scratch ??= planScratch(n, this.positions.length));
    const { rowIdx, colIdx, rowLen, colLen, rowActive, colActive, rowCnt, colCnt, colValid, colBestR, colBestCost, colBestRatio } = sc;
    let { lBuf, uBuf, fillBuf } = sc;
    // Row i's columns are rowIdx[i·n …], column j's rows colIdx[j·n …], in pattern order with
    // fill-in appended: the order the tie-breaks below depend on.
    rowLen.fill(0);
    colLen.fill(0);
    const positions = this.positions;
    for (let t = 0; t < positions.length; t++) {
      const k = positions[t];
      const i = (k / n) | 0;
      const j = k - i * n;
      rowIdx[i * n + rowLen[i]++] = j;
      colIdx[j * n + colLen[j]++] = i;
    }
    rowActive.fill(1);
    colActive.fill(1);
    rowCnt.set(rowLen);
    colCnt.set(colLen);
    colValid.fill(0);
    const { pr, pc, lStart, uStart } = sc;
    let lEnd = 0;
    let uEnd = 0;
    let fillEnd = 0;

    // Each column's own best candidate (fewest updates, then largest pivot relative to the column,
    // then first in the column's list), kept until an elimination step touches the column. The
    // overall choice is the same as comparing every candidate in column order.
    const scoreColumn = (c: number) => {
      const base = c * n;
      const len = colLen[c];
      let colMax = 0;
      for (let t = 0; t < len; t++) {
        const r = colIdx[base + t];
        if (!rowActive[r]) continue;
        const v = Math.abs(w[r * n + c]);
        if (v > colMax) colMax = v;
      }
      let best = -1;
      let bestCost = Infinity;
      let bestRatio = 0;
      if (colMax > ABSOLUTE_PIVOT) {
        const colCost = colCnt[c] - 1;
        for (let t = 0; t < len; t++) {
          const r = colIdx[base + t];
          if (!rowActive[r]) continue;
          const cost = (rowCnt[r] - 1) * colCost;
          if (cost > bestCost) continue;
          const v = Math.abs(w[r * n + c]);
          if (v < PIVOT_THRESHOLD * colMax || !(v > ABSOLUTE_PIVOT)) continue;
          const ratio = v / colMax;
          if (cost < bestCost || (cost === bestCost && ratio > bestRatio)) {
            bestCost = cost;
            bestRatio = ratio;
            best = r;
          }
        }
      }
      colBestR[c] = best;
      colBestCost[c] = bestCost;
      colBestRatio[c] = bestRatio;
      colValid[c] = 1;
    };

    for (let k = 0; k < n; k++) {
      let bestR = -1;
      let bestC = -1;
      let bestCost = Infinity;
      let bestRatio = 0;
      for (let c = 0; c < n; c++) {
        if (!colActive[c]) continue;
        if (!colValid[c]) scoreColumn(c);
        const r = colBestR[c];
        if (r >= 0) {
          const cost = colBestCost[c];
          const ratio = colBestRatio[c];
          if (cost < bestCost || (cost === bestCost && ratio > bestRatio)) {
            bestCost = cost;
            bestRatio = ratio;
            bestR = r;
            bestC = c;
          }
        }
        if (bestCost === 0 && bestRatio === 1) break;
      }
      if (bestR < 0) {
        let row = 0;
        while (row < n && !rowActive[row]) row++;
        throw new SingularMatrixError(row);
      }
      const r = bestR;
      const c = bestC;
      pr[k] = r;
      pc[k] = c;
      rowActive[r] = 0;
      colActive[c] = 0;
      const rBase = r * n;
      const cBase = c * n;
      for (let t = 0; t < rowLen[r]; t++) colCnt[rowIdx[rBase + t]]--;
      for (let t = 0; t < colLen[c]; t++) rowCnt[colIdx[cBase + t]]--;
      lStart[k] = lEnd;
      uStart[k] = uEnd;
      lBuf = sc.lBuf = room(lBuf, lEnd + colLen[c]);
      uBuf = sc.uBuf = room(uBuf, uEnd + rowLen[r]);
      for (let t = 0; t < colLen[c]; t++) {
        const rr = colIdx[cBase + t];
        if (rowActive[rr]) lBuf[lEnd++] = rr;
      }
      for (let t = 0; t < rowLen[r]; t++) {
        const cc = rowIdx[rBase + t];
        if (colActive[cc]) uBuf[uEnd++] = cc;
      }
      const l0 = lStart[k];
      const u0 = uStart[k];
      const piv = w[rBase + c];
      fillBuf = sc.fillBuf = room(fillBuf, fillEnd + (lEnd - l0) * (uEnd - u0));
      for (let q = l0; q < lEnd; q++) {
        const rr = lBuf[q];
        const base = rr * n;
        const f = w[base + c] / piv;
        w[base + c] = f;
        for (let p = u0; p < uEnd; p++) {
          const cc = uBuf[p];
          const k2 = base + cc;
          if (!s[k2]) {
            s[k2] = 1;
            w[k2] = 0;
            fillBuf[fillEnd++] = k2;
            rowIdx[base + rowLen[rr]++] = cc;
            colIdx[cc * n + colLen[cc]++] = rr;
            rowCnt[rr]++;
            colCnt[cc]++;
          }
          w[k2] -= f * w[rBase + cc];
        }
      }
      // Rescore what this step changed: the updated columns (values, counts, the pivot row gone)
      // and every column holding an updated row (that row's count changed).
      for (let p = u0; p < uEnd; p++) colValid[uBuf[p]] = 0;
      for (let q = l0; q < lEnd; q++) {
        const rr = lBuf[q];
        const base = rr * n;
        for (let t = 0; t < rowLen[rr]; t++) colValid[rowIdx[base + t]] = 0;
      }
    }
    lStart[n] = lEnd;
    uStart[n] = uEnd;
    this.plansMade++;
    return packPlan(pr, pc, lStart, uStart, lBuf.subarray(0, lEnd), uBuf.subarray(0, uEnd), fillBuf.subarray(0, fillEnd));
  }

  /** Solves with the last factorisation: x[unknown] from b[row]. */
  solve(b: Float64Array, x: Float64Array): void {
    this.substitute(b, x);
    if (!this.weak) return;
    // One step of iterative refinement: a small pivot can cost digits, and the residual against
    // the matrix as given wins them back with the same factors.
    const { n, positions, a0, r, d } = this;
    r.set(b);
    for (let t = 0; t < positions.length; t++) {
      const k = positions[t];
      const row = (k / n) | 0;
      r[row] -= a0[t] * x[k - row * n];
    }
    this.substitute(r, d);
    for (let i = 0; i < n; i++) x[i] += d[i];
  }

  private substitute(b: Float64Array, x: Float64Array): void {
    const plan = this.current;
    if (!plan) throw new Error('SparseLu.solve before factor');
    const { n, w, z } = this;
    const { pr, pc, lStart, lRows, uStart, uCols } = plan;
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
