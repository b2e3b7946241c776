/**
 * Property tests draw their cases from a fixed seed, so a run on a clean clone checks the same cases
 * as the run before it and a landing cannot hang on a rare draw. To explore new cases, set
 * VOLTWALK_PROPERTY_SEED to a number, or to "random" for a fresh seed each run; fast-check prints
 * the seed and path of any counterexample, and the failing case belongs in the test's `examples`.
 */
import fc from 'fast-check';

const FIXED_SEED = 20261202;

export function propertySeed(setting: string | undefined): number | undefined {
  if (setting === undefined || setting === '') return FIXED_SEED;
  if (setting === 'random') return undefined;
  const seed = Number(setting);
  if (!Number.isInteger(seed)) {
    throw new Error(`VOLTWALK_PROPERTY_SEED: expected a whole number or "random", got "${setting}"`);
  }
  return seed;
}

const seed = propertySeed(process.env.VOLTWALK_PROPERTY_SEED);
if (seed !== undefined) fc.configureGlobal({ ...fc.readConfigureGlobal(), seed });
