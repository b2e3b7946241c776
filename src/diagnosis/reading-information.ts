import { domainWidth, orderAt, spreadTable, type FaultDictionary } from './dictionary-model.js';
import { likelihoodSigma } from './likelihood-spread.js';
import { DEFAULT_METER, type MeterSpec } from './meter.js';
import { DEFAULT_OUTLIER, OUTLIER_SCALE } from './posterior.js';

/**
 * Expected information from one reading, in bits: the mutual information between the hypotheses and
 * the reading under the very likelihood the posterior uses (Gaussian around each prediction with the
 * σ of likelihood-spread.ts, plus the outlier share).
 *
 * Hard bins (binsAt) count two predictions 1.1 reaches apart as told apart for certain and 0.9
 * reaches apart as not at all, and where a boundary falls depends on the chain of neighbours: a
 * fault moving a reading by half a band could land in a bin of its own, so a probe there promised a
 * split the posterior then never made (one test point read under three conditions, each promising
 * 0.15 to 0.3 bits and moving nothing), while the one reading that would have shown a small fault looked
 * worth little. Worked from the overlap instead, a probe is worth what the posterior will learn.
 *
 * I(H; Y) = Σ_c p_c ∫ q_c(y) log(q_c(y) / m(y)) dy, m = Σ_c p_c q_c, over clusters c of hypotheses
 * predicting (nearly) the same spread here: the reading cannot move mass between members of a
 * cluster, so the members add nothing, and at most test points most faults predict the healthy
 * value, which keeps the sum short. The integral is a 5-node Gauss–Hermite rule on each cluster's
 * Gaussian part; the outlier part is left out of the integral (a reading no one foresaw tells
 * hypotheses apart only weakly) but kept in the densities, so no reading is worth more than the
 * posterior would make of it. A hypothesis predicting nothing here (NaN) has a flat density over the
 * domain: it only dilutes m.
 */
export function readingInformation(
  dict: FaultDictionary,
  probabilities: number[],
  obsIndex: number,
  meter: MeterSpec = DEFAULT_METER,
  live?: Uint8Array,
  outlier: number = DEFAULT_OUTLIER,
): number {
  return informationOf(readingClusters(dict, probabilities, obsIndex, meter, live), outlier);
}

export interface ReadingClusters {
  /** Probability of each cluster, normalised over everything live (loose mass included). */
  mass: Float64Array;
  centre: Float64Array;
  sigma: Float64Array;
  count: number;
  /** Density every reading gets from the hypotheses that predict nothing here. */
  flat: number;
  /** Entropy of the clusters (and the loose mass) in bits: no reading can tell more than this. */
  bound: number;
}

/**
 * Neighbours in the sorted predictions whose centres lie within a quarter of a σ of the cluster's
 * first and whose σ is within 25 % of it read alike: no reading moves probability between them by
 * more than a few per cent, so merging them costs a few hundredths of a bit at most.
 */
export function readingClusters(dict: FaultDictionary, p: number[], obsIndex: number, meter: MeterSpec = DEFAULT_METER, live?: Uint8Array): ReadingClusters {
  const table = spreadTable(dict, meter);
  const sigmas = likelihoodSigma(dict, meter);
  const order = orderAt(table, dict.hypotheses.length, obsIndex);
  const mass = new Float64Array(order.length);
  const centre = new Float64Array(order.length);
  const sigma = new Float64Array(order.length);
  let count = 0;
  let predicted = 0;
  for (let k = 0; k < order.length; k++) {
    const h = order[k];
    if (live && !live[h]) continue;
    const ph = p[h];
    if (!(ph > 0)) continue;
    predicted += ph;
    const at = h * table.width + obsIndex;
    const c = table.centre[at];
    const s = sigmas[at];
    const last = count - 1;
    if (count > 0 && c - centre[last] <= MERGE * sigma[last] && Math.abs(s - sigma[last]) <= MERGE * sigma[last]) {
      mass[last] += ph;
      continue;
    }
    mass[count] = ph;
    centre[count] = c;
    sigma[count] = s;
    count++;
  }
  let all = 0;
  if (live) {
    for (let h = 0; h < live.length; h++) if (live[h] && p[h] > 0) all += p[h];
  } else for (const x of p) if (x > 0) all += x;
  const loose = Math.max(all - predicted, 0);
  let bound = 0;
  if (all > 0) {
    for (let c = 0; c < count; c++) mass[c] /= all;
    for (let c = 0; c < count; c++) if (mass[c] > 0) bound -= mass[c] * Math.log2(mass[c]);
    if (loose > 0) bound -= (loose / all) * Math.log2(loose / all);
  }
  const flat = all > 0 ? loose / all / domainWidth(dict.observables[obsIndex], meter) : 0;
  return { mass, centre, sigma, count, flat, bound };
}

/** The mutual information of readingInformation, from the clusters. */
export function informationOf(clusters: ReadingClusters, outlier: number = DEFAULT_OUTLIER): number {
  const { mass, centre, sigma, count, flat } = clusters;
  if (count < 2 && flat === 0) return 0;
  // Per cluster, the two parts of its density at y with its probability folded in:
  // p·(1 − ε)·N(y; μ, σ) and p·ε·Cauchy(y; μ, 10σ).
  const gaussWeight = new Float64Array(count);
  const cauchyWeight = new Float64Array(count);
  const inverse = new Float64Array(count);
  for (let c = 0; c < count; c++) {
    inverse[c] = 1 / sigma[c];
    gaussWeight[c] = (mass[c] * (1 - outlier)) / (sigma[c] * SQRT_2PI);
    cauchyWeight[c] = (mass[c] * outlier) / (Math.PI * OUTLIER_SCALE * sigma[c]);
  }
  let information = 0;
  for (let c = 0; c < count; c++) {
    // A cluster adds at most p·log2(1/p) bits: below a millionth that is under 2e-5 bits.
    if (!(mass[c] > 1e-6)) continue;
    let expectation = 0;
    for (let k = 0; k < NODES.length; k++) {
      const y = centre[c] + Math.SQRT2 * sigma[c] * NODES[k];
      const zc = Math.SQRT2 * NODES[k];
      const own = gaussWeight[c] * Math.exp(-0.5 * zc * zc) + cauchyWeight[c] / (1 + (zc * zc) / OUTLIER_SQUARED);
      let mixture = flat;
      for (let j = 0; j < count; j++) {
        const z = (y - centre[j]) * inverse[j];
        const z2 = z * z;
        // Beyond 8 σ a Gaussian is about 1e-14 of its peak: the outlier part is all that is left.
        mixture += (z2 < 64 ? gaussWeight[j] * Math.exp(-0.5 * z2) : 0) + cauchyWeight[j] / (1 + z2 / OUTLIER_SQUARED);
      }
      // `own` and `mixture` both carry the cluster's probability where the formula has it once.
      expectation += WEIGHTS[k] * Math.log(own / (mass[c] * mixture));
    }
    information += mass[c] * expectation;
  }
  return Math.max(((1 - outlier) * information) / Math.LN2, 0);
}

const MERGE = 0.25;
const OUTLIER_SQUARED = OUTLIER_SCALE * OUTLIER_SCALE;
const SQRT_2PI = Math.sqrt(2 * Math.PI);
/** Gauss–Hermite nodes and weights for 5 points (Abramowitz & Stegun, table 25.10), weights divided by √π. */
export const GAUSS_HERMITE_5: { nodes: readonly number[]; weights: readonly number[] } = {
  nodes: [-2.020182870456086, -0.958572464613819, 0, 0.958572464613819, 2.020182870456086],
  weights: [0.019953242059046, 0.393619323152241, 0.945308720482942, 0.393619323152241, 0.019953242059046].map((w) => w / Math.sqrt(Math.PI)),
};
const NODES = GAUSS_HERMITE_5.nodes;
const WEIGHTS = GAUSS_HERMITE_5.weights;
