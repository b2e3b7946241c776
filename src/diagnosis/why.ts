import { bandFigures, formatBand, formatValue } from '../units/index.js';
import { NO_FAULT, spreadOf, toDomain, type FaultDictionary, type Hypothesis, type Reading } from './dictionary-model.js';
import { DEFAULT_METER, type MeterSpec } from './meter.js';

/** A reading as a person sees it on the meter: volts to 3 figures (or as many as asked), ohms, or OL past the top range. */
export function showReading(value: number, unit: 'V' | 'Ω', meter: MeterSpec = DEFAULT_METER, figures = 3): string {
  if (unit === 'Ω' && !(value < meter.maxOhms)) return 'OL (open)';
  // Below the meter's last digit on its smallest range a value is a zero on the display, not picovolts.
  const resolution = (unit === 'V' ? 0.2 : 200) / meter.fullScale * (meter.fullScale / 2000);
  if (Math.abs(value) < resolution / 2) return formatValue(0, unit);
  return formatValue(value, unit, figures);
}

/**
 * The plain reason behind one hypothesis's place in the ranking, with numbers: the readings that
 * bear on it most — where its prediction differs most from the healthy value, or from what was read.
 * E.g. "TP6 would read 11.3 V with R21 open (healthy 5.90 V); you read 11.2 V".
 */
export function explain(dict: FaultDictionary, h: number, readings: Reading[], where: number[], meter: MeterSpec = DEFAULT_METER, twins: string[] = []): string {
  const hyp = closestVariant(dict, dict.hypotheses[h], readings, where, meter);
  const conditions = new Set(readings.map((r) => r.condition));
  const label = (i: number) => {
    const o = dict.observables[i];
    return conditions.size > 1 ? `${o.testPoint} (${o.condition})` : o.testPoint;
  };
  const healthy = dict.hypotheses[0];
  const scored = readings.map((r, k) => {
    const i = where[k];
    const obs = dict.observables[i];
    const mine = spreadOf(obs, hyp, i, meter);
    const ok = spreadOf(obs, healthy, i, meter);
    const read = toDomain(obs, r.value, meter);
    // How far this hypothesis's prediction sits from health, and how well it meets the reading.
    const telling = mine && ok ? Math.abs(mine.centre - ok.centre) / (mine.reach + ok.reach) : 0;
    const miss = mine ? Math.abs(read - mine.centre) / mine.reach : 0;
    return { k, i, obs, mine, telling, miss };
  });
  const you = (k: number) => {
    const obs = dict.observables[where[k]];
    return `you read ${showReading(readings[k].value, obs.unit, meter, figuresOf(obs))}`;
  };

  let text: string;
  if (hyp.id === NO_FAULT) {
    const worst = [...scored].sort((a, b) => b.miss - a.miss)[0];
    if (!worst) text = 'no readings yet';
    else if (worst.miss <= 1) text = `every reading is within its healthy band (e.g. ${label(worst.i)} should read ${healthyBand(worst.obs, meter)}; ${you(worst.k)})`;
    else text = `${label(worst.i)} should read ${healthyBand(worst.obs, meter)} on a healthy board; ${you(worst.k)}`;
  } else {
    const unsure = scored.filter((s) => !s.mine);
    const known = scored.filter((s) => s.mine).sort((a, b) => b.telling + b.miss - (a.telling + a.miss));
    const clauses = known.slice(0, 2).map((s) => {
      const figures = figuresOf(s.obs);
      const predicted = showReading(hyp.predictions[s.i], s.obs.unit, meter, figures);
      const healthyText = s.telling > 1 ? `healthy ${showReading(s.obs.nominal, s.obs.unit, meter, figures)}` : 'as on a healthy board';
      return `${label(s.i)} would read ${predicted} with ${hyp.part} ${hyp.fault} (${healthyText}); ${you(s.k)}`;
    });
    if (unsure.length > 0) {
      const where = [...new Set(unsure.map((s) => s.obs.condition))].join(', ');
      clauses.push(`the circuit with ${hyp.part} ${hyp.fault} cannot be solved in ${where}, so those readings neither confirm nor rule it out`);
    }
    text = clauses.length > 0 ? clauses.join('; ') : `${hyp.part} ${hyp.fault}: no reading bears on it yet`;
  }
  if (twins.length > 0) text += ` — no test point tells it from ${twins.slice(0, 3).join(', ')}${twins.length > 3 ? ` and ${twins.length - 3} more` : ''}`;
  return text;
}

/**
 * A fault with variant predictions is explained by the one the readings fit best (summed distance in
 * reaches), so the numbers quoted are the ones that put it where it is in the ranking.
 */
function closestVariant(dict: FaultDictionary, hyp: Hypothesis, readings: Reading[], where: number[], meter: MeterSpec): Hypothesis {
  if (!hyp.variants || readings.length === 0) return hyp;
  let best = hyp;
  let bestMiss = Infinity;
  for (const predictions of [hyp.predictions, ...hyp.variants]) {
    const row = { ...hyp, predictions };
    let miss = 0;
    readings.forEach((r, k) => {
      const obs = dict.observables[where[k]];
      const s = spreadOf(obs, row, where[k], meter);
      if (s) miss += Math.abs(toDomain(obs, r.value, meter) - s.centre) / s.reach;
    });
    if (miss < bestMiss) [best, bestMiss] = [row, miss];
  }
  return best;
}

type Observable = FaultDictionary['observables'][number];

/**
 * Every number quoted for a test point (band, predictions, the reading) carries the figures that keep
 * its healthy band's edges apart, as the step screen does: against a rail band of 11.74 V to 11.80 V,
 * "would read 11.7 V" or "you read 11.8 V" could not be placed inside or outside it.
 */
export function figuresOf(obs: Observable): number {
  return obs.halfWidth > 0 ? bandFigures(obs.nominal - obs.halfWidth, obs.nominal + obs.halfWidth) : 3;
}

export function healthyBand(obs: Observable, meter: MeterSpec): string {
  if (obs.unit === 'Ω' && !(obs.nominal < meter.maxOhms)) return 'OL (open)';
  if (obs.halfWidth <= 0) return showReading(obs.nominal, obs.unit, meter, figuresOf(obs));
  const [lo, hi] = obs.min !== undefined && obs.max !== undefined ? [obs.min, obs.max] : [obs.nominal - obs.halfWidth, obs.nominal + obs.halfWidth];
  const shown = formatBand(lo, hi, obs.nominal, obs.unit);
  return `${shown.nominal} (${shown.min} to ${shown.max})`;
}

/** An ambiguity group's members for a list line: the first few in plain words, then how many more. */
export function groupMembersText(labels: readonly string[], shown = 8): string {
  const head = labels.slice(0, shown).join(', ');
  return labels.length > shown ? `${head} and ${labels.length - shown} more` : head;
}
