import { UserInputError } from '../errors.js';
import { domainWidth, NO_FAULT, observableKey, rowView, spreadTable, toDomain, type FaultDictionary, type Reading } from './dictionary-model.js';
import { DEFAULT_METER, type MeterSpec } from './meter.js';
import { likelihoodSigma } from './likelihood-spread.js';

export interface PosteriorOptions {
  meter?: MeterSpec;
  /**
   * Share of the likelihood given to "the model is wrong here" (a flat density over the whole
   * range), so one reading the simulation did not foresee lowers a hypothesis without erasing it.
   */
  outlier?: number;
  /**
   * The board is known to be faulty (a tree has concluded a fault from what the person saw): the
   * healthy board is no candidate, and its share goes to the faults in proportion. Readings cannot
   * say this by themselves: many faults read exactly as a healthy board does at every test point.
   */
  faultPresent?: boolean;
}

/**
 * 5 % is a judgement, checked against how far simulated boards actually read from their own fault's
 * prediction: over seed 1's distinguishable faults, 1.3 % of all readings, and 3.7 % of those where
 * the fault moves the reading off healthy, lie beyond 10 σ (a knife-edge circuit, a band estimated
 * too narrow), so 1 % let one such reading all but rule out the right fault. `npm run accuracy`
 * (2026-12-02, variant predictions in; top-1 / top-3 / mean probes): 1 % gave 91.6/95.2/4.41 on
 * seed 1 and 90.3/92.1/4.55 on seed 2; 3 % 91.2/96.9/4.55 and 90.7/93.8/4.61; 5 % 91.2/96.9/4.65
 * and 91.2/94.3/4.71; 10 % 91.2/96.5/4.80 and 89.9/93.0/4.87; 20 % 90.7/96.0/5.04 and 89.0/92.5/5.15.
 * Checked again once the fault allowance followed the shift and probes were chosen by
 * readingInformation (dictionaries as at commit c9b3561): 3 % gave 95.1/97.8/4.64 and 95.1/96.5/4.71;
 * 5 % 94.2/96.9/4.67 and 95.1/96.5/4.76; 10 % 94.2/96.4/4.89 and 94.7/96.0/4.94. Kept at 5 %: 3 % is
 * ahead by two faults of 225 on one seed only.
 */
export const DEFAULT_OUTLIER = 0.05;

/** Index of each reading's observable; an unknown pair is the user's typo, named in the error. */
export function locateReadings(dict: FaultDictionary, readings: Reading[]): number[] {
  const index = new Map(dict.observables.map((o, i) => [observableKey(o.testPoint, o.condition), i]));
  return readings.map((r, k) => {
    // Infinity is a real reading (OL on the ohms range); NaN is no reading at all.
    if (typeof r.value !== 'number' || Number.isNaN(r.value)) {
      throw new UserInputError({ code: 'rank.bad-reading', path: `readings[${k}].value`, message: `${r.testPoint}: the reading is not a number`, accepted: 'a meter reading, e.g. 4.2 (volts) or 4700 (ohms)' });
    }
    const i = index.get(observableKey(r.testPoint, r.condition));
    if (i === undefined) {
      const here = dict.observables.filter((o) => o.condition === r.condition).map((o) => o.testPoint);
      throw new UserInputError({
        code: 'rank.unknown-observable',
        path: `readings[${k}]`,
        message: `${r.testPoint} is not measured under condition "${r.condition}"`,
        accepted: here.length > 0 ? here.join(', ') : `a condition of the board: ${[...new Set(dict.observables.map((o) => o.condition))].join(', ')}`,
      });
    }
    return i;
  });
}

/** ln of the likelihood of one reading under one hypothesis. */
export function logLikelihood(dict: FaultDictionary, h: number, obsIndex: number, value: number, options: PosteriorOptions = {}): number {
  const meter = options.meter ?? DEFAULT_METER;
  const outlier = options.outlier ?? DEFAULT_OUTLIER;
  const obs = dict.observables[obsIndex];
  const flat = 1 / domainWidth(obs, meter);
  const table = spreadTable(dict, meter);
  const at = h * table.width + obsIndex;
  const centre = table.centre[at];
  // A hypothesis the solver could not settle predicts nothing: every reading is as likely as any other.
  if (Number.isNaN(centre)) return Math.log(flat);
  // Not the spread table's σ: a fault's allowance for model error goes with how far it moves this
  // reading, so where it moves nothing it reads like a healthy board (see likelihood-spread.ts).
  const sigma = likelihoodSigma(dict, meter)[at];
  const z = (toDomain(obs, value, meter) - centre) / sigma;
  const gauss = Math.exp(-0.5 * z * z) / (sigma * Math.sqrt(2 * Math.PI));
  // The "model is wrong here" share is a wide Cauchy around the prediction rather than a flat density:
  // when no hypothesis foresaw a reading (10.5 V where one fault predicts 10.2 V and the rest 0 V),
  // the nearest predictions must still rank first instead of every hypothesis falling back to its prior.
  const scale = OUTLIER_SCALE * sigma;
  const cauchy = 1 / (Math.PI * scale * (1 + (z / OUTLIER_SCALE) ** 2));
  return Math.log((1 - outlier) * gauss + outlier * cauchy);
}

/**
 * Width of the outlier share, in multiples of the hypothesis's own σ. With a 5 % share, 10 gave
 * top-3 96.9/94.3 % on seeds 1/2 against 96.0/93.8 % with 5 and 96.5/93.4 % with 20.
 */
export const OUTLIER_SCALE = 10;

/**
 * Bayes' rule over single-fault hypotheses: P(h | readings) ∝ P(h) · Π P(reading | h), the readings
 * independent given h (each carries its own meter error). Worked in logs and normalised with the
 * log-sum-exp shift so a long run of readings cannot underflow. Returns one probability per hypothesis.
 * A hypothesis with variant predictions is the sum of its rows (see rowView): each row's readings
 * multiply together, so a fault cannot borrow one reading from one variant and the next from another.
 */
export function posterior(dict: FaultDictionary, readings: Reading[], options: PosteriorOptions = {}): number[] {
  return rowPosterior(dict, readings, options).hypotheses;
}

export interface RowPosterior {
  /** Per hypothesis of the dictionary. */
  hypotheses: number[];
  /** Per row of rowView(dict): what the next-probe look-ahead works on. */
  rows: number[];
}

export function rowPosterior(dict: FaultDictionary, readings: Reading[], options: PosteriorOptions = {}): RowPosterior {
  const where = locateReadings(dict, readings);
  const { rows, parent } = rowView(dict);
  const logs = rows.hypotheses.map((h) => (options.faultPresent && h.id === NO_FAULT ? -Infinity : Math.log(Math.max(h.prior, 0))));
  // Reading by reading: the reading's place in the comparison domain is worked out once.
  readings.forEach((r, k) => {
    for (let i = 0; i < logs.length; i++) logs[i] += logLikelihood(rows, i, where[k], r.value, options);
  });
  const p = normaliseLogs(logs);
  if (rows === dict) return { hypotheses: p, rows: p };
  const folded = new Array<number>(dict.hypotheses.length).fill(0);
  p.forEach((x, r) => (folded[parent[r]] += x));
  return { hypotheses: folded, rows: p };
}

export function normaliseLogs(logs: number[]): number[] {
  const top = Math.max(...logs);
  if (!Number.isFinite(top)) return logs.map(() => 1 / logs.length);
  const weights = logs.map((l) => Math.exp(l - top));
  const total = weights.reduce((a, b) => a + b, 0);
  return weights.map((w) => w / total);
}

/** Shannon entropy in bits. */
export function entropyBits(probabilities: number[]): number {
  let h = 0;
  for (const p of probabilities) if (p > 0) h -= p * Math.log2(p);
  return h;
}
