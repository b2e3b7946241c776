export { createRng, type Rng } from './prng.js';
export { deviatedValue, drawDeviation, type Deviation, type Distribution } from './deviation.js';
export { worstCase, type Evaluate, type WorstCaseOptions, type WorstCaseResult } from './worst-case.js';
export { monteCarlo, percentile, type MonteCarloOptions, type MonteCarloResult } from './monte-carlo.js';
export { boardDeviations, HFE_BINS, VF_SPREAD, ZENER_BV_SPREAD, type PartDeviation, type DeviationTarget } from './part-spreads.js';
export { boardEvaluator, type BoardEvaluator, type BoardOutput, type ConditionEvaluator } from './board-evaluator.js';
export { expectBands, expectReport, type Band, type ExpectOptions, type ExpectReport } from './expect-bands.js';
export {
  outputNoise,
  thermalNoiseDensity,
  toDbu,
  BOLTZMANN,
  DBU_REFERENCE_VOLTS,
  type NoiseOptions,
  type NoiseResult,
  type NoiseContribution,
} from './noise.js';
export { detectorTimes, detectorTimeBand, LN9, type DetectorTimes, type PathTime, type PathPart, type TimeBand } from './detector-times.js';
export { makeupNoise, type MakeupNoise, type MakeupNoiseOptions } from './makeup-noise.js';
export { hissBand, HISS_ABOVE_DB, HISS_BELOW_DB, type HissBand } from './hiss-band.js';
export { idleDraw, ledCurrents, unlessUnavailable } from './operating-figures.js';
export { boardFigures, BoardFiguresSchema, type BoardFigures, type FigureBand } from './board-figures.js';
export { signalGainDb, GAIN_FREQUENCY_HZ } from './signal-gain.js';
