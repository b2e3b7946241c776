import { DEFAULT_METER, meterAccuracy, type MeterSpec } from '../diagnosis/index.js';
import type { MeasureNode, Outcome } from '../schemas/tree.js';

/** The expected reading at one test point under one condition, from the board's part values. */
export interface ExpectedBand {
  nominal: number;
  min: number;
  max: number;
  unit: 'V' | 'Ω';
  /** "noise": a hiss level in volts rms (see hiss-band.ts), judged on its band alone. Absent: a DC reading. */
  kind?: 'noise';
}

/**
 * How close to a rail a voltage must sit to count as "stuck at the rail": an op-amp on ±12 V
 * saturates about 1.5 V short of each rail (TL072 datasheet headroom, see REFERENCES.md), so a
 * window of 2.5 V catches a saturated output and a rail that leaked through, with room for meters.
 */
export const RAIL_WINDOW_V = 2.5;
/** Below this a voltage counts as "nothing there": well under a diode drop, above meter noise. */
export const NEAR_ZERO_V = 0.05;
/** Below this a resistance is a short: a solder bridge or a shorted part (common practice). */
export const NEAR_ZERO_OHMS = 1;

/**
 * Sorts a reading against its band. The band is widened by the meter's own accuracy at each edge
 * (±(0.5 % + 2 counts) by default, a handheld DMM's usual DC specification: common practice,
 * REFERENCES.md), so a good board read on an ordinary meter is never called out of band.
 * In-band wins over everything, so an op-amp output meant to sit near 0 V is not "near-zero";
 * then a rail (unless the band itself sits at that rail: a rail test point reading a little high
 * is "high", not "stuck"), then nothing, then low/high.
 */
export function classifyReading(value: number, band: ExpectedBand, railVolts: number[], meter: MeterSpec = DEFAULT_METER): Outcome {
  // A hiss level is neither at a rail nor a short: it is the design's own, or more, or less.
  if (band.kind === 'noise') return value < band.min ? 'low' : value > band.max ? 'high' : 'in-band';
  const { below, above } = meterAllowance(band, meter);
  if (value >= band.min - below && value <= band.max + above) return 'in-band';
  if (band.unit === 'V') {
    const nearRail = (v: number, r: number) => Math.abs(v - r) <= RAIL_WINDOW_V && Math.abs(r) > RAIL_WINDOW_V;
    if (railVolts.some((r) => nearRail(value, r) && !nearRail(band.nominal, r))) return 'stuck-at-rail';
    if (Math.abs(value) < NEAR_ZERO_V) return 'near-zero';
  } else if (value < NEAR_ZERO_OHMS) {
    return 'near-zero';
  }
  return value < band.min ? 'low' : 'high';
}

/** How far beyond each edge of a band a reading still counts as in band: the meter's own accuracy there. */
export function meterAllowance(band: ExpectedBand, meter: MeterSpec = DEFAULT_METER): { below: number; above: number } {
  // A DC meter's counts mean nothing for a hiss level; its band already allows for the instrument.
  if (band.kind === 'noise') return { below: 0, above: 0 };
  const slack = (edge: number) => (Number.isFinite(edge) ? meterAccuracy(edge, band.unit, meter) : 0);
  return { below: slack(band.min), above: slack(band.max) };
}

/**
 * The branch a tree takes for an outcome: its own branch when the tree has one, else the plain
 * direction (a rail or a zero is also "low" or "high"), else the default.
 */
export function branchFor(branches: MeasureNode['branches'], outcome: Outcome, value: number, band: ExpectedBand): keyof MeasureNode['branches'] {
  if (branches[outcome] !== undefined) return outcome;
  if (outcome === 'stuck-at-rail' || outcome === 'near-zero') {
    const direction = value < band.min ? 'low' : 'high';
    if (branches[direction] !== undefined) return direction;
  }
  return 'default';
}
