import type { Board } from '../../schemas/board.js';
import { UserInputError } from '../../errors.js';
import { buildCircuit, findCondition, findTestPoint, solvePatiently } from '../../board/index.js';
import { outputNoise, type NoiseResult } from './noise.js';

/**
 * The hiss a healthy board makes at a test point under a condition, and the band a measured hiss is
 * judged against: whether what the person hears is what this design must produce there, or a fault.
 *
 * Measured as an audio interface or AC millivoltmeter reads it: rms over 20 Hz–20 kHz, unweighted.
 *   nominal  every modelled source on the board (see noise.ts): each resistor's and pot segment's
 *            thermal noise, each op-amp's voltage and current noise at its datasheet typical.
 *   min      the resistors' thermal noise alone, HISS_BELOW_DB lower. Thermal noise is physics
 *            (4kTR): a board built from these resistors at this gain cannot be quieter, and the
 *            decibel below it allows for resistor tolerances and the instrument's own accuracy.
 *   max      the nominal, HISS_ABOVE_DB higher. Op-amp datasheets give noise as typical only, and
 *            transistor shot and 1/f noise are not modelled, so a healthy board may sit above the
 *            nominal; 6 dB (twice the voltage) is a judgement of how far, not a datasheet figure.
 */
export const HISS_BELOW_DB = 1;
export const HISS_ABOVE_DB = 6;

export interface HissBand {
  nominal: number;
  min: number;
  max: number;
  unit: 'V';
  /** The noise analysis behind the nominal, for reports (contributions, density, dBu). */
  noise: NoiseResult;
}

const RESISTIVE = new Set(['resistor', 'pot']);

export function hissBand(board: Board, testPointId: string, conditionId: string): HissBand {
  const condition = findCondition(board, conditionId);
  const tp = findTestPoint(board, testPointId);
  if (!condition.powered || tp.quantity !== 'voltage') {
    throw new UserInputError({
      code: 'noise.not-powered-voltage',
      path: `${tp.id} under ${condition.id}`,
      message: 'hiss is measured as a voltage on a powered board',
      accepted: 'a voltage test point under a powered condition',
    });
  }
  const { circuit, netNode } = buildCircuit(board, condition.id);
  // The operating point as every other figure finds it: with the board's fallbacks when plain solving fails.
  const noise = outputNoise(circuit, { output: netNode(tp.net), reference: netNode(tp.refNet ?? board.ground), op: solvePatiently(circuit) });
  const kinds = new Map(circuit.elements.map((e) => [e.name.toLowerCase(), e.kind]));
  const thermal = Math.sqrt(noise.contributions.filter((c) => RESISTIVE.has(kinds.get(c.element.toLowerCase()) ?? '')).reduce((a, c) => a + c.rms ** 2, 0));
  return { nominal: noise.rms, min: thermal * 10 ** (-HISS_BELOW_DB / 20), max: noise.rms * 10 ** (HISS_ABOVE_DB / 20), unit: 'V', noise };
}
