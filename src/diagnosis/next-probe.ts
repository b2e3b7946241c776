import { ACCESS_RANK, orderAt, spreadTable, type FaultDictionary } from './dictionary-model.js';
import { DEFAULT_METER, type MeterSpec } from './meter.js';
import { informationOf, readingClusters } from './reading-information.js';

export interface NextProbe {
  testPoint: string;
  condition: string;
  /** Expected drop in the suspects' entropy from taking this reading, in bits. */
  expectedInformationBits: number;
}

export interface ProbeOptions {
  meter?: MeterSpec;
  /** Observables already read (indices into dict.observables). */
  measured?: Set<number>;
  /** Condition of the latest reading: staying in it spares the person a change of set-up. */
  currentCondition?: string;
  /** Gains closer than this count as equal, and the tie goes to the easier probe. */
  tieBits?: number;
  /** Below this expected gain no probe is worth suggesting. */
  minimumBits?: number;
}

/**
 * Splits the hypotheses by what a reading at one observable could tell apart: predictions sorted in
 * the comparison domain, a new bin opening where a prediction lies beyond the reach (band plus meter)
 * of the bin's first member. Returns, per hypothesis, its bin, or -1 when it predicts nothing there.
 */
export function binsAt(dict: FaultDictionary, obsIndex: number, meter: MeterSpec = DEFAULT_METER, live?: number[]): { bin: Int32Array; count: number } {
  const n = dict.hypotheses.length;
  const inPlay = live ? maskOf(live, n) : undefined;
  const bin = new Int32Array(n).fill(-1);
  const table = spreadTable(dict, meter);
  const order = orderAt(table, n, obsIndex);
  let count = 0;
  let startCentre = 0;
  let startReach = 0;
  for (let k = 0; k < order.length; k++) {
    const h = order[k];
    if (inPlay && !inPlay[h]) continue;
    const at = h * table.width + obsIndex;
    if (count === 0 || table.centre[at] - startCentre > startReach + table.reach[at]) {
      startCentre = table.centre[at];
      startReach = table.reach[at];
      count++;
    }
    bin[h] = count - 1;
  }
  return { bin, count };
}

function maskOf(members: number[], n: number): Uint8Array {
  const mask = new Uint8Array(n);
  for (const h of members) mask[h] = 1;
  return mask;
}

/**
 * Expected entropy of the hypotheses after reading one observable, with every prediction put in a
 * hard bin (binsAt): a quick estimate of the minimum-entropy measurement choice of de Kleer &
 * Williams (Artificial Intelligence 32, 1987). nextProbe weighs probes with readingInformation
 * instead (see reading-information.ts for why); this stays as the coarse figure.
 * A hypothesis that predicts nothing there is spread evenly over the bins.
 *
 * Worked per bin from two sums, the mass T and Σ p·log2 p, since the entropy of the normalised
 * bin is log2 T − (Σ p·log2 p)/T; the expectation Σ T·H is then Σ (T·log2 T − Σ p·log2 p).
 */
export function expectedEntropyAfter(dict: FaultDictionary, probabilities: number[], obsIndex: number, meter: MeterSpec = DEFAULT_METER, live?: number[]): number {
  const members = live ?? dict.hypotheses.map((_, i) => i);
  const { bin, count } = binsAt(dict, obsIndex, meter, members);
  const bins = Math.max(count, 1);
  const mass = new Float64Array(bins);
  const plogp = new Float64Array(bins);
  let loose = 0;
  let looseLog = 0;
  for (const h of members) {
    const p = probabilities[h];
    if (!(p > 0)) continue;
    const b = bin[h];
    if (b >= 0) {
      mass[b] += p;
      plogp[b] += p * Math.log2(p);
    } else {
      loose += p;
      looseLog += p * Math.log2(p / bins);
    }
  }
  let expected = 0;
  for (let b = 0; b < bins; b++) {
    // Each unpredictable hypothesis puts p/bins in every bin.
    const total = mass[b] + loose / bins;
    const sum = plogp[b] + looseLog / bins;
    if (total > 0) expected += total * Math.log2(total) - sum;
  }
  return Math.max(expected, 0);
}

/**
 * The unmeasured observable whose reading is expected to leave the least uncertainty: the greatest
 * expected information (readingInformation), a one-step look-ahead on the minimum-entropy choice of
 * de Kleer & Williams (1987), worked under the posterior's own likelihood.
 */
export function nextProbe(dict: FaultDictionary, probabilities: number[], options: ProbeOptions = {}): NextProbe | undefined {
  const meter = options.meter ?? DEFAULT_METER;
  const tie = options.tieBits ?? 0.01;
  const minimum = options.minimumBits ?? 0.01;
  // Hypotheses already ruled out change nothing; leaving them out keeps the look-ahead cheap.
  const most = Math.max(...probabilities);
  const live = probabilities.map((p, i) => (p > most * 1e-9 ? i : -1)).filter((i) => i >= 0);
  const total = live.reduce((a, i) => a + probabilities[i], 0);
  const normalised = probabilities.map((p) => p / total);
  const mask = new Uint8Array(probabilities.length);
  for (const i of live) mask[i] = 1;
  const gains = new Array<number>(dict.observables.length).fill(-Infinity);
  // No reading tells more than the entropy of what it could tell apart: working through the
  // observables from the highest such bound, the rest are skipped once the bound falls below the best
  // information found (less the tie margin, so every probe that could tie is still weighed).
  const candidates = dict.observables
    .map((_, index) => (options.measured?.has(index) ? undefined : { index, clusters: readingClusters(dict, normalised, index, meter, mask) }))
    .filter((c) => c !== undefined)
    .sort((a, b) => b.clusters.bound - a.clusters.bound);
  let found = -Infinity;
  for (const { index, clusters } of candidates) {
    if (clusters.bound < found - tie) break;
    gains[index] = informationOf(clusters);
    if (gains[index] > found) found = gains[index];
  }
  const top = Math.max(...gains);
  if (!(top >= minimum)) return undefined;
  // Among probes within `tie` of the best, the one least trouble to take.
  let best = -1;
  gains.forEach((gain, index) => {
    if (gain < top - tie) return;
    if (best < 0 || easier(dict, index, best, options.currentCondition) || (!easier(dict, best, index, options.currentCondition) && gain > gains[best])) best = index;
  });
  const obs = dict.observables[best];
  return { testPoint: obs.testPoint, condition: obs.condition, expectedInformationBits: round(gains[best]) };
}

/** Staying in the present set-up first (changing a condition means re-wiring the bench), then access. */
function easier(dict: FaultDictionary, a: number, b: number, current?: string): boolean {
  const oa = dict.observables[a];
  const ob = dict.observables[b];
  const stayA = oa.condition === current ? 0 : 1;
  const stayB = ob.condition === current ? 0 : 1;
  if (stayA !== stayB) return stayA < stayB;
  return ACCESS_RANK[oa.access] < ACCESS_RANK[ob.access];
}

const round = (bits: number) => Math.round(bits * 1000) / 1000;
