import { NO_FAULT, rowView, spreadTable, toDomain, type FaultDictionary, type Reading } from './dictionary-model.js';
import { likelihoodSigma } from './likelihood-spread.js';
import type { MeterSpec } from './meter.js';
import type { Unexplained } from './rank-result.js';
import { figuresOf, healthyBand, showReading } from './why.js';

/**
 * How far (in the ranking's own standard deviations: band, meter and model allowance together) a
 * reading must sit from every candidate's prediction before no single modelled fault is said to
 * explain it. The ranking still ranks such readings — the nearest predictions first, through the
 * outlier share of the likelihood — but a list led by a few per cent reads as an answer, and the
 * honest answer is that none of the candidates fits: a slipped probe, a wrong meter range, two
 * faults at once, or one not modelled.
 *
 * Where a modelled fault is present this is a false alarm. `npm run accuracy` (2026-12-02) counts
 * it over every reading of every simulated board, 105,610 readings per seed, each board carrying one
 * modelled fault with drawn tolerances and meter error: beyond 4, 6 and 8 σ of every candidate,
 * 48, 27 and 12 readings on seed 1 and 70, 43 and 29 on seed 3. At 6 σ that is about one reading in
 * 3,000; a rail read at 11.2 V against a band of 11.74 V to 11.80 V lies 8.6 σ from the nearest
 * candidate (a shorted rail capacitor, 7.6 V) on the demo board and is reported.
 */
export const UNEXPLAINED_SIGMAS = 6;

/** For one reading: how near any prediction comes, and the prediction nearest in value. */
export interface NearestFit {
  /** The smallest distance from the reading to any hypothesis's prediction, in that hypothesis's σ. */
  sigmas: number;
  /** The hypothesis (index into dict.hypotheses) whose prediction is nearest in value; -1 when none predicts anything here. */
  hypothesis: number;
  predicted: number;
}

/**
 * Per reading, the nearest prediction of any hypothesis (no fault, any fault, any variant of one) in
 * the ranking's own standard deviations. A hypothesis the solver could not settle predicts nothing
 * here, so it neither explains a reading nor rules it out.
 */
export function nearestFits(dict: FaultDictionary, readings: Reading[], where: number[], meter: MeterSpec): NearestFit[] {
  const { rows, parent } = rowView(dict);
  const table = spreadTable(rows, meter);
  const sigma = likelihoodSigma(rows, meter);
  const width = table.width;
  return readings.map((reading, k) => {
    const i = where[k];
    const read = toDomain(dict.observables[i], reading.value, meter);
    // Nearest in σ decides whether anything fits; nearest in value is what a person means by "nearest".
    let sigmas = Infinity;
    let nearest = -1;
    let gap = Infinity;
    for (let r = 0; r < rows.hypotheses.length; r++) {
      const centre = table.centre[r * width + i];
      if (Number.isNaN(centre)) continue;
      const distance = Math.abs(read - centre);
      sigmas = Math.min(sigmas, distance / sigma[r * width + i]);
      if (distance < gap) [gap, nearest] = [distance, r];
    }
    return nearest < 0 ? { sigmas, hypothesis: -1, predicted: NaN } : { sigmas, hypothesis: parent[nearest], predicted: rows.hypotheses[nearest].predictions[i] };
  });
}

/** The readings that no hypothesis comes within UNEXPLAINED_SIGMAS of, each with a plain sentence for the person. */
export function unexplainedReadings(dict: FaultDictionary, readings: Reading[], where: number[], meter: MeterSpec): Unexplained[] {
  const fits = nearestFits(dict, readings, where, meter);
  return readings.flatMap((reading, k) => {
    const fit = fits[k];
    if (fit.hypothesis < 0 || !(fit.sigmas > UNEXPLAINED_SIGMAS)) return [];
    const obs = dict.observables[where[k]];
    const hyp = dict.hypotheses[fit.hypothesis];
    const show = (v: number) => showReading(v, obs.unit, meter, figuresOf(obs));
    const nearestText = hyp.id === NO_FAULT ? 'the nearest is the healthy board itself' : `the nearest is ${show(fit.predicted)} with ${hyp.part} ${hyp.fault}`;
    return [
      {
        testPoint: reading.testPoint,
        condition: reading.condition,
        value: reading.value,
        nearest: { id: hyp.id, predicted: fit.predicted },
        text:
          `${reading.testPoint} = ${show(reading.value)} fits no single modelled fault: a healthy board reads ${healthyBand(obs, meter)} and ${nearestText}. ` +
          'Check the probe placement and the meter range; if the reading stands, two faults at once or one not modelled (the supply itself, a cracked joint) are at work, and the suspects below are only the nearest fits.',
      },
    ];
  });
}
