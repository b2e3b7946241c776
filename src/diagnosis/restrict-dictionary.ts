import type { BuiltDictionary } from './dictionary.js';
import type { Hypothesis } from './dictionary-model.js';

/**
 * The part of a built dictionary that covers only some conditions, taken from one built for more
 * without solving anything: a condition's predictions never depend on which other conditions are
 * in the build (a faulty circuit that needs another start takes it from one fixed condition of the
 * board, solved whether or not it was asked for), so they are the numbers buildDictionary would give
 * for those conditions alone, in the order asked for. The walk keeps its ranking to the conditions its
 * tree measures in; when the whole board's dictionary is already built (the terminal app builds it
 * in the background), this saves building a second one for those conditions.
 *
 * Kept per dictionary and condition list, so repeated rankings of one walk share one object (and
 * whatever the ranking caches against it).
 */
export function restrictDictionary(dict: BuiltDictionary, conditions: readonly string[]): BuiltDictionary {
  const key = JSON.stringify(conditions);
  let kept = made.get(dict);
  if (!kept) made.set(dict, (kept = new Map()));
  const known = kept.get(key);
  if (known) return known;
  const restricted = restrict(dict, conditions);
  kept.set(key, restricted);
  return restricted;
}

const made = new WeakMap<BuiltDictionary, Map<string, BuiltDictionary>>();

function restrict(dict: BuiltDictionary, conditions: readonly string[]): BuiltDictionary {
  const wanted = [...new Set(conditions)];
  const order = wanted.flatMap((condition) => dict.observables.flatMap((o, i) => (o.condition === condition ? [i] : [])));
  const pick = (values: number[]) => order.map((i) => values[i]);
  const hypotheses = dict.hypotheses.map((h): Hypothesis => {
    const out: Hypothesis = { ...h, predictions: pick(h.predictions) };
    if (h.halfWidths) out.halfWidths = pick(h.halfWidths);
    if (h.variants) out.variants = h.variants.map(pick);
    return out;
  });
  const inPlay = new Set(wanted);
  const unsettled = new Map<string, string[]>();
  for (const [id, where] of dict.unsettled) {
    const here = where.filter((c) => inPlay.has(c));
    if (here.length) unsettled.set(id, here);
  }
  return {
    ...dict,
    observables: order.map((i) => dict.observables[i]),
    hypotheses,
    unsettled,
    skippedConditions: dict.skippedConditions.filter((c) => inPlay.has(c)),
  };
}
