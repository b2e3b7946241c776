/**
 * How far a handheld meter's reading may sit from the true value. The usual way a DMM maker states
 * it is ±(percent of reading + counts of the last digit); the last digit's weight depends on the
 * range the meter autoranges to. Default: ±(0.5 % + 2 counts) on a 2000-count meter, the common
 * DC-volts specification of a handheld multimeter (common practice; REFERENCES.md).
 */
export interface MeterSpec {
  /** Percent of reading. */
  percent: number;
  /** Counts of the last digit. */
  counts: number;
  /** Full-scale counts of the display (2000 for a "3½-digit" meter, 6000 for a "6000-count" one). */
  fullScale: number;
  /** Largest resistance the meter shows before "OL", in ohms. */
  maxOhms: number;
}

export const DEFAULT_METER: MeterSpec = { percent: 0.5, counts: 2, fullScale: 2000, maxOhms: 20e6 };

/**
 * The decade range an autoranging meter settles on: a 2000-count meter steps 200 mV, 2 V, 20 V …
 * and 200 Ω, 2 kΩ …; a 6000-count one 600 mV, 6 V … The smallest range is given for 2000 counts.
 */
function rangeFor(magnitude: number, fullScale: number, smallest2000: number): number {
  let range = smallest2000 * (fullScale / 2000);
  while (magnitude >= range && range < 1e12) range *= 10;
  return range;
}

/** Half-width of the meter's accuracy window for a reading of this size, in the reading's unit. */
export function meterAccuracy(value: number, unit: 'V' | 'Ω', spec: MeterSpec = DEFAULT_METER): number {
  const magnitude = Math.abs(value);
  const range = rangeFor(magnitude, spec.fullScale, unit === 'V' ? 0.2 : 200);
  const count = range / spec.fullScale;
  return (spec.percent / 100) * magnitude + spec.counts * count;
}

/** A resistance beyond the meter's top range reads "OL"; every such value is the same reading. */
export function clampOhms(value: number, spec: MeterSpec = DEFAULT_METER): number {
  if (!(value >= 0)) return spec.maxOhms;
  return Math.min(value, spec.maxOhms);
}
