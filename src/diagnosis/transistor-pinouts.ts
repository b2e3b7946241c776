/**
 * Leg order of TO-92 transistors, flat face towards you, left to right. A kit's footprint follows
 * the type it was drawn for; fitting another type with another order puts its pins on the wrong nets.
 * 2N3904/2N3906 E-B-C and BC547 family C-B-E from their datasheets (REFERENCES.md); 2SC1815/2SA1015
 * E-C-B from memory. An unknown type is taken as E-B-C.
 */
export type LegOrder = 'EBC' | 'CBE' | 'ECB';

const BY_TYPE: Array<[RegExp, LegOrder]> = [
  [/^2N(3904|3906|4401|4403|2222A?|2907A?|5088|5089|4124|4126)$/i, 'EBC'],
  [/^BC(54[6-9]|55[0-9]|56[0-9]|337|338|327|328)[ABC]?$/i, 'CBE'],
  [/^2S[AC](1015|1815|945|733)$/i, 'ECB'],
];

export const LEG_ORDERS: readonly LegOrder[] = ['EBC', 'CBE', 'ECB'];

export function legOrderOf(model: string | undefined): LegOrder {
  for (const [pattern, order] of BY_TYPE) if (model && pattern.test(model)) return order;
  return 'EBC';
}

/**
 * For a part of order `fitted` placed in a footprint drawn for `drawn`: each pin of the fitted part
 * and the drawn pin whose net it lands on. Fitting backwards (legs 1 and 3 swapped) is `drawn` reversed.
 */
export function pinLanding(drawn: string, fitted: string): Record<string, string> {
  const map: Record<string, string> = {};
  for (let leg = 0; leg < 3; leg++) map[fitted[leg]] = drawn[leg];
  return map;
}
