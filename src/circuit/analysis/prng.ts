/**
 * A small seeded pseudo-random generator, so a Monte Carlo band is the same on every machine and
 * every run for the same seed. Math.random cannot be seeded; a 32-bit mixer is plenty for a few
 * thousand samples of a few hundred variables and costs a handful of integer operations per draw.
 *
 * The generator is mulberry32 (a Weyl sequence through a 32-bit avalanche mixer); its period is
 * 2^32, far beyond any run here.
 */

export interface Rng {
  /** Uniform on [0, 1). */
  next(): number;
  /** Uniform on [-1, 1). */
  symmetric(): number;
  /** Standard normal (mean 0, σ 1), Box–Muller. */
  normal(): number;
}

export function createRng(seed: number): Rng {
  let state = seed >>> 0;
  let spare: number | undefined;
  const next = (): number => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return {
    next,
    symmetric: () => next() * 2 - 1,
    normal: () => {
      if (spare !== undefined) {
        const s = spare;
        spare = undefined;
        return s;
      }
      // 1 - next() lies in (0, 1], so the logarithm is finite.
      const r = Math.sqrt(-2 * Math.log(1 - next()));
      const theta = 2 * Math.PI * next();
      spare = r * Math.sin(theta);
      return r * Math.cos(theta);
    },
  };
}
