import { rowView, spreadTable, type FaultDictionary } from './dictionary-model.js';
import { DEFAULT_METER, type MeterSpec } from './meter.js';

/**
 * Two hypotheses can be told apart when, at some observable (measured or still measurable), their
 * predicted readings lie further apart than both bands and the meter's window together. A
 * hypothesis the solver could not settle is never merged: nothing says it looks like another.
 */
export function distinguishable(dict: FaultDictionary, a: number, b: number, meter: MeterSpec = DEFAULT_METER): boolean {
  const { centre, reach, width } = spreadTable(dict, meter);
  const ka = a * width;
  const kb = b * width;
  for (let i = 0; i < width; i++) {
    const ca = centre[ka + i];
    const cb = centre[kb + i];
    if (Number.isNaN(ca) || Number.isNaN(cb)) return true;
    if (Math.abs(ca - cb) > reach[ka + i] + reach[kb + i]) return true;
  }
  return false;
}

/**
 * Whether some reading can still tell two hypotheses apart whichever of their variant predictions
 * holds (see Hypothesis.variants): false as soon as one variant of each looks alike everywhere. A
 * fault joining an op-amp's inputs looks like that output stuck high or stuck low, depending on an
 * offset no reading reveals beforehand, and is shown with whichever it cannot be told from.
 * Without variants this is `distinguishable`.
 */
export function separable(dict: FaultDictionary, a: number, b: number, meter: MeterSpec = DEFAULT_METER): boolean {
  const { rows, first } = rowView(dict);
  if (rows === dict) return distinguishable(dict, a, b, meter);
  for (let ra = first[a]; ra < first[a + 1]; ra++) {
    for (let rb = first[b]; rb < first[b + 1]; rb++) if (!distinguishable(rows, ra, rb, meter)) return false;
  }
  return true;
}

/**
 * Ambiguity groups: sets of hypotheses no reading in play can separate. Judged with `separable`. Built greedily in the given
 * order (most probable first), a hypothesis joining the first group whose every member it cannot be
 * told apart from (complete linkage, so a chain of near neighbours never merges two distinct faults).
 * Returns, per hypothesis in `order`, its group number counted from 0.
 */
export function ambiguityGroups(dict: FaultDictionary, order: number[], meter: MeterSpec = DEFAULT_METER): Map<number, number> {
  const groups: number[][] = [];
  const groupOf = new Map<number, number>();
  for (const h of order) {
    let joined = -1;
    for (let g = 0; g < groups.length && joined < 0; g++) {
      if (groups[g].every((m) => !separable(dict, h, m, meter))) joined = g;
    }
    if (joined < 0) {
      groups.push([h]);
      joined = groups.length - 1;
    } else groups[joined].push(h);
    groupOf.set(h, joined);
  }
  return groupOf;
}
