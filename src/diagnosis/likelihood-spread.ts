import { halfInDomain, spreadTable, type FaultDictionary } from './dictionary-model.js';
import { clampOhms, meterAccuracy, type MeterSpec } from './meter.js';

/** Worked out once per dictionary, meter and share, like the spread table (a dictionary is not changed once built). */
const cache = new WeakMap<FaultDictionary, Map<MeterSpec, Map<number, Float64Array>>>();

/**
 * The standard deviation the posterior gives each hypothesis's reading at each observable, in the
 * comparison domain (index h * observables + i, like the spread table).
 *
 * The spread table gives every fault an allowance of 2 % of its predicted value (FAULT_MODEL_ALLOWANCE),
 * for what nominal models get wrong about a faulty circuit. Where a fault does not move a reading at
 * all (a rail 11.3 V whichever resistor in the detector is open) that allowance is the only thing
 * that makes its band wider than the healthy one, so every such reading favoured "no fault" over
 * every fault by the ratio of the two widths (about 3× at a ±12 V rail), whatever was read: after a
 * dozen readings that agree with a healthy board in places a fault does not touch, "no fault" led the
 * ranking from its 5 % prior, and a fault shown by one reading alone could not climb back.
 *
 * What the models get wrong is how far a fault moves a reading: how hard an amplifier saturates, how
 * much a divider with a wrong part actually shifts once its neighbours' tolerances are drawn. So the
 * allowance here is in proportion to the shift from the healthy prediction, not to the prediction:
 * σ² = (band/2)² + (meter/2)² + (SHIFT_UNCERTAINTY · shift)², the band being the healthy band's
 * relative width applied to the fault's value (or the fault's own band when the dictionary has one).
 * A fault that leaves a reading where it was now reads exactly like a healthy board there.
 */
export function likelihoodSigma(dict: FaultDictionary, meter: MeterSpec, shiftUncertainty = SHIFT_UNCERTAINTY): Float64Array {
  let byMeter = cache.get(dict);
  if (!byMeter) cache.set(dict, (byMeter = new Map()));
  let byShare = byMeter.get(meter);
  if (!byShare) byMeter.set(meter, (byShare = new Map()));
  const found = byShare.get(shiftUncertainty);
  if (found) return found;
  const table = spreadTable(dict, meter);
  const width = table.width;
  const sigma = new Float64Array(table.sigma.length);
  dict.hypotheses.forEach((h, k) => {
    dict.observables.forEach((obs, i) => {
      const at = k * width + i;
      const centre = table.centre[at];
      const healthy = table.centre[i];
      if (k === 0 || Number.isNaN(centre) || Number.isNaN(healthy)) {
        sigma[at] = table.sigma[at];
        return;
      }
      const raw = h.predictions[i];
      const prediction = obs.unit === 'Ω' ? clampOhms(raw, meter) : raw;
      const own = h.halfWidths?.[i];
      const relative = Math.min(obs.halfWidth / Math.max(Math.abs(obs.nominal), 1), 0.3);
      const band = own !== undefined && Number.isFinite(own) ? own : Math.max(obs.halfWidth, relative * Math.abs(prediction));
      const model = halfInDomain(obs, prediction, band, meter);
      const reading = halfInDomain(obs, prediction, meterAccuracy(prediction, obs.unit, meter), meter);
      sigma[at] = Math.hypot(model / 2, reading / 2, shiftUncertainty * (centre - healthy));
    });
  });
  byShare.set(shiftUncertainty, sigma);
  return sigma;
}

/**
 * Share of a fault's shift taken as the standard deviation of that shift: a judgement (a stage's gain
 * or a divider's ratio off by some 10 % once every part's tolerance is drawn), checked with
 * `npm run accuracy` on seeds 1 and 2 (2026-12-02, dictionaries as at commit c9b3561, probes
 * chosen by readingInformation; top-1 / top-3 / mean probes): 0 gave 92.9/97.3/4.18 and 92.9/96.0/4.32; 0.05 93.3/96.9/4.29 and
 * 94.2/96.5/4.36; 0.1 94.2/96.9/4.67 and 95.1/96.5/4.76; 0.15 93.3/97.3/5.10 and 94.2/95.6/5.20;
 * 0.2 93.3/96.9/5.52 and 93.8/95.6/5.64. A wider share makes the ranking slower to commit, so the
 * walk takes more probes.
 */
export const SHIFT_UNCERTAINTY = 0.1;

