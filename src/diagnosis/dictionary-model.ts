import { clampOhms, meterAccuracy, type MeterSpec } from './meter.js';
import type { Access } from '../schemas/board.js';

/**
 * The fault dictionary as the ranking sees it: what each hypothesis (no fault, or one fault) predicts
 * at every observable (a test point under a condition). Kept apart from the board and the solver so
 * the Bayes and entropy arithmetic can be checked on hand-made dictionaries.
 */

export type { Access };

/** Easier probes first: a pad beats a leg beats an IC pin beats a header or jack contact. */
export const ACCESS_RANK: Record<Access, number> = { pad: 0, leg: 1, 'ic-pin': 2, header: 3, jack: 3 };

export interface Observable {
  testPoint: string;
  condition: string;
  unit: 'V' | 'Ω';
  access: Access;
  /** Healthy (no-fault) expected reading. */
  nominal: number;
  /** Half-width of the healthy tolerance band, in the reading's unit. */
  halfWidth: number;
  /**
   * The healthy band's edges as computed, which need not sit evenly about the nominal: shown to the
   * person (as the walk and `voltwalk expect` show them). The ranking's arithmetic takes nominal ±
   * halfWidth.
   */
  min?: number;
  max?: number;
  /** Largest magnitude a reading here can plausibly take (the rails, or the meter's top range). */
  span: number;
}

export const NO_FAULT = 'none';

/** A hypothesis or suspect in plain words, as every list shows it: "no fault", or the part and its fault ("R21 open"). */
export function faultLabel(h: { part: string; fault: string }): string {
  return h.part === NO_FAULT ? h.fault : `${h.part} ${h.fault}`;
}

export interface Hypothesis {
  /** "none" for the healthy board, else e.g. "R21/open". */
  id: string;
  /** Designator of the suspect part ("none" for the healthy board). */
  part: string;
  /** Machine name of the fault mode ("open", "reversed" …). */
  mode: string;
  /** Plain words: "open", "wrong value 47 kΩ". */
  fault: string;
  /** Relative prior weight (normalised by the ranking). */
  prior: number;
  /** Predicted reading per observable, same order; NaN where the solver could not settle, Infinity for an open circuit. */
  predictions: number[];
  /** Half-width of this hypothesis's own band per observable, when it was computed; else estimated. */
  halfWidths?: number[];
  /**
   * Other predictions the same fault may give, same layout as `predictions`, for a fault whose
   * readings hang on something the nominal models leave at zero (the sign of an op-amp's input
   * offset when the fault leaves it open loop). Which one holds is the same for every reading, so the
   * ranking weighs each vector whole. `distinguishable` (and so what `npm run accuracy` counts as
   * distinguishable) goes by `predictions` alone; ambiguity groups look at every vector.
   */
  variants?: number[][];
}

export interface FaultDictionary {
  observables: Observable[];
  /** hypotheses[0] is the healthy board. */
  hypotheses: Hypothesis[];
}

export interface Reading {
  testPoint: string;
  condition: string;
  value: number;
}

export const observableKey = (testPoint: string, condition: string) => `${condition}:${testPoint}`;

/**
 * A fault's band is not computed per fault by default (that would be a Monte Carlo run per fault);
 * it is estimated from the healthy band's relative width at that observable, applied to the fault's
 * own predicted value, and never narrower than the healthy band. Near 0 V a relative width means
 * little, so it is taken against at least 1 V (or 1 Ω), and capped at 30 % so a band around a few
 * millivolts of offset does not swallow a rail.
 */
export function modelHalfWidth(obs: Observable, h: Hypothesis, index: number, prediction: number): number {
  const own = h.halfWidths?.[index];
  if (own !== undefined && Number.isFinite(own)) return own;
  if (h.id === NO_FAULT) return obs.halfWidth;
  const relative = Math.min(obs.halfWidth / Math.max(Math.abs(obs.nominal), 1), 0.3);
  return Math.max(obs.halfWidth, relative * Math.abs(prediction), FAULT_MODEL_ALLOWANCE * Math.abs(prediction));
}

/**
 * A faulted circuit is simulated with nominal device models, and many faults drive an op-amp into
 * saturation, where the level depends on the part (the TL072 datasheet (ST) gives an output swing of
 * ±12 V minimum and ±13.5 V typical at ±15 V supplies). So a fault's prediction gets an allowance of
 * its own, whatever the healthy band's width. 2 % is a judgement: in `npm run accuracy` it gave the
 * best hit rates (top-1 89.9 %, top-3 92.5 %, against 87.3/89.4 % with none and 81.9/84.8 % with 5 %).
 */
export const FAULT_MODEL_ALLOWANCE = 0.02;

/**
 * Readings are compared in a domain where errors are roughly even: volts as they are, resistance as
 * ln(R + 1 Ω), since ohm errors are proportional and "OL" must sit at a finite place.
 */
export function toDomain(obs: Observable, value: number, meter: MeterSpec): number {
  if (obs.unit === 'V') return value;
  return Math.log(clampOhms(value, meter) + 1);
}

/** Half-width in the comparison domain of a band of `half` around `value`. */
export function halfInDomain(obs: Observable, value: number, half: number, meter: MeterSpec): number {
  if (obs.unit === 'V') return half;
  const r = clampOhms(value, meter);
  return half / (r + 1);
}

export interface Spread {
  /** Centre in the comparison domain. */
  centre: number;
  /** Model band plus meter accuracy, half-width in the domain: the "cannot tell apart" reach. */
  reach: number;
  /** Standard deviation for the likelihood: the band and the meter window read as ±2σ each. */
  sigma: number;
}

/** A hypothesis's reach and spread at one observable; undefined where it predicts nothing (NaN). */
export function spreadOf(obs: Observable, h: Hypothesis, index: number, meter: MeterSpec): Spread | undefined {
  const raw = h.predictions[index];
  if (Number.isNaN(raw)) return undefined;
  // An open circuit predicts Infinity ohms: the meter shows OL, a reading like any other.
  const prediction = obs.unit === 'Ω' ? clampOhms(raw, meter) : raw;
  const model = halfInDomain(obs, prediction, modelHalfWidth(obs, h, index, prediction), meter);
  const reading = halfInDomain(obs, prediction, meterAccuracy(prediction, obs.unit, meter), meter);
  return {
    centre: toDomain(obs, prediction, meter),
    reach: model + reading,
    sigma: Math.hypot(model / 2, reading / 2),
  };
}

/** Width of the comparison domain: the denominator of the "anything could happen" likelihood. */
export function domainWidth(obs: Observable, meter: MeterSpec): number {
  if (obs.unit === 'V') return 2 * obs.span;
  return Math.log(meter.maxOhms + 1);
}

/** Every hypothesis's spread at every observable, worked out once per dictionary and meter (a dictionary is not changed once built). */
export interface SpreadTable {
  /** Index h * observables + i; NaN centre where the hypothesis predicts nothing. */
  centre: Float64Array;
  reach: Float64Array;
  sigma: Float64Array;
  width: number;
  /** Per observable, the hypotheses that predict something there, in order of predicted value (filled on first use). */
  order: Array<Int32Array | undefined>;
}

const tables = new WeakMap<FaultDictionary, Map<MeterSpec, SpreadTable>>();

export function spreadTable(dict: FaultDictionary, meter: MeterSpec): SpreadTable {
  let byMeter = tables.get(dict);
  if (!byMeter) tables.set(dict, (byMeter = new Map()));
  const found = byMeter.get(meter);
  if (found) return found;
  const width = dict.observables.length;
  const size = dict.hypotheses.length * width;
  const table: SpreadTable = { centre: new Float64Array(size), reach: new Float64Array(size), sigma: new Float64Array(size), width, order: [] };
  dict.hypotheses.forEach((h, k) => {
    dict.observables.forEach((obs, i) => {
      const s = spreadOf(obs, h, i, meter);
      const at = k * width + i;
      table.centre[at] = s ? s.centre : NaN;
      table.reach[at] = s ? s.reach : NaN;
      table.sigma[at] = s ? s.sigma : NaN;
    });
  });
  byMeter.set(meter, table);
  return table;
}

/** Hypotheses predicting something at one observable, sorted by their predicted value. */
export function orderAt(table: SpreadTable, hypotheses: number, obsIndex: number): Int32Array {
  const cached = table.order[obsIndex];
  if (cached) return cached;
  const list: number[] = [];
  for (let h = 0; h < hypotheses; h++) if (!Number.isNaN(table.centre[h * table.width + obsIndex])) list.push(h);
  list.sort((a, b) => table.centre[a * table.width + obsIndex] - table.centre[b * table.width + obsIndex]);
  const order = Int32Array.from(list);
  table.order[obsIndex] = order;
  return order;
}

/**
 * The dictionary with every prediction vector as a row of its own: a hypothesis with variants
 * becomes one row per vector (its nominal prediction first), its prior shared evenly among them
 * (nothing says which holds; giving the nominal row a tenth instead of a third lowered top-1 on
 * seed 2 from 90.3 to 89.0 % in `npm run accuracy` and changed nothing else).
 * `parent[r]` is the hypothesis of row r. The same object comes back for the same dictionary, so the
 * spread table worked out for the rows is kept; a dictionary without variants is its own view.
 */
export interface RowView {
  rows: FaultDictionary;
  parent: Int32Array;
  /** Rows of hypothesis h: first[h] up to first[h + 1]. */
  first: Int32Array;
}

const views = new WeakMap<FaultDictionary, RowView>();

export function rowView(dict: FaultDictionary): RowView {
  const found = views.get(dict);
  if (found) return found;
  const parent: number[] = [];
  const first: number[] = [];
  const hypotheses: Hypothesis[] = [];
  dict.hypotheses.forEach((h, k) => {
    first.push(hypotheses.length);
    const vectors = [h.predictions, ...(h.variants ?? [])];
    vectors.forEach((predictions) => {
      parent.push(k);
      hypotheses.push(vectors.length === 1 ? h : { ...h, prior: h.prior / vectors.length, predictions, variants: undefined });
    });
  });
  first.push(hypotheses.length);
  const view = {
    rows: hypotheses.length === dict.hypotheses.length ? dict : { observables: dict.observables, hypotheses },
    parent: Int32Array.from(parent),
    first: Int32Array.from(first),
  };
  views.set(dict, view);
  return view;
}
