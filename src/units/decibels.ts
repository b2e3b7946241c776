/**
 * dBu: decibels relative to 0.7746 V rms, the voltage that puts 1 mW into 600 Ω (√0.6 V), as audio
 * equipment reads a level (common practice).
 */
export const DBU_REFERENCE_VOLTS = 0.7746;

export function toDbu(volts: number): number {
  return 20 * Math.log10(volts / DBU_REFERENCE_VOLTS);
}

export function fromDbu(dbu: number): number {
  return DBU_REFERENCE_VOLTS * 10 ** (dbu / 20);
}
