/**
 * One way a built board can differ from its drawing: a resistor off by its tolerance, a transistor
 * with more or less current gain, an op-amp with some input offset. Every analysis here works on a
 * normalised deviation u in [-1, 1] per variable: u = 0 is the nominal part, u = ±1 the ends of its
 * stated spread. Worst case looks at u ∈ {-1, 0, +1}; Monte Carlo draws u from the variable's
 * distribution.
 *
 * What "±5 %" means in a Monte Carlo draw:
 * - 'gaussian': normal with 3σ at the stated limit (σ = 5 %/3), redrawn if it falls outside ±3σ, so
 *   no sample ever leaves the stated limits. Used for passive parts and op-amp offset (for the TL072
 *   this puts σ near the datasheet's "typical" figure).
 * - 'uniform': flat over the stated limits. Used where a datasheet gives a min–max bin and nothing
 *   about the shape inside it (transistor current-gain groups, diode forward-voltage spread).
 */

export type Distribution = 'uniform' | 'gaussian';

export interface Deviation {
  /** Stable id, e.g. "R7", "Q1 BF", "U1A vos". */
  id: string;
  /** The board designator the variable belongs to. */
  part: string;
  /** Values at u = -1, 0 and +1 (SI or multiplier, as the applier expects). */
  low: number;
  nominal: number;
  high: number;
  distribution: Distribution;
  /**
   * 'linear' (the default) interpolates the value; 'log' interpolates its logarithm, for spreads
   * that are ratios of many times (a diode's saturation current across a forward-voltage spread).
   */
  scale?: 'linear' | 'log';
  /** Where the spread comes from, in words ("board tolerance 1 %", "2N3904 datasheet hFE 100–300"). */
  source: string;
}

/** The value at normalised deviation u: from low to nominal for u < 0, nominal to high for u > 0. */
export function deviatedValue(d: Pick<Deviation, 'low' | 'nominal' | 'high' | 'scale'>, u: number): number {
  if (d.scale === 'log') return d.nominal * (u >= 0 ? d.high / d.nominal : d.nominal / d.low) ** u;
  return u >= 0 ? d.nominal + u * (d.high - d.nominal) : d.nominal + u * (d.nominal - d.low);
}

/** Truncated-normal draw in [-1, 1] with σ = 1/3 (3σ at the limit), or uniform. */
export function drawDeviation(distribution: Distribution, rng: { symmetric(): number; normal(): number }): number {
  if (distribution === 'uniform') return rng.symmetric();
  for (;;) {
    const z = rng.normal() / 3;
    if (z >= -1 && z <= 1) return z;
  }
}
