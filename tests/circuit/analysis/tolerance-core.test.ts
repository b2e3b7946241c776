import { describe, expect, it } from 'vitest';
import { createRng } from '../../../src/circuit/analysis/prng.js';
import { deviatedValue, drawDeviation } from '../../../src/circuit/analysis/deviation.js';
import { worstCase } from '../../../src/circuit/analysis/worst-case.js';
import { monteCarlo, percentile } from '../../../src/circuit/analysis/monte-carlo.js';

// A resistive divider: Vout = V · R2 / (R1 + R2) (textbook). With ±1 % parts the exact extremes are
// at R1 high / R2 low and R1 low / R2 high, which is what the corner search must find.
const V = 12;
const R1 = 10_000;
const R2 = 4_700;
const TOL = 0.01;
const divider = (u: Float64Array) => {
  const r1 = R1 * (1 + TOL * u[0]);
  const r2 = R2 * (1 + TOL * u[1]);
  return Float64Array.of((V * r2) / (r1 + r2));
};

describe('seeded PRNG', () => {
  it('repeats for a seed and differs between seeds', () => {
    const a = createRng(42);
    const b = createRng(42);
    const c = createRng(43);
    const sa = Array.from({ length: 20 }, () => a.next());
    expect(Array.from({ length: 20 }, () => b.next())).toEqual(sa);
    expect(Array.from({ length: 20 }, () => c.next())).not.toEqual(sa);
  });

  it('is uniform enough: mean 1/2 and variance 1/12 of U(0,1) within sampling error', () => {
    const rng = createRng(7);
    const n = 100_000;
    let s = 0;
    let s2 = 0;
    let outside = 0;
    for (let i = 0; i < n; i++) {
      const x = rng.next();
      if (!(x >= 0 && x < 1)) outside++;
      s += x;
      s2 += x * x;
    }
    expect(outside).toBe(0);
    const mean = s / n;
    // Standard error of the mean of U(0,1) is sqrt(1/12/n) ≈ 0.0009; allow 5 of them.
    expect(Math.abs(mean - 0.5)).toBeLessThan(0.0046);
    expect(Math.abs(s2 / n - mean * mean - 1 / 12)).toBeLessThan(0.002);
  });

  it('normal draws have σ 1 and the truncated deviation stays inside ±1 with σ near 1/3', () => {
    const rng = createRng(3);
    const n = 50_000;
    let s2 = 0;
    for (let i = 0; i < n; i++) s2 += rng.normal() ** 2;
    expect(Math.sqrt(s2 / n)).toBeCloseTo(1, 1);
    let d2 = 0;
    let widest = 0;
    for (let i = 0; i < n; i++) {
      const u = drawDeviation('gaussian', rng);
      widest = Math.max(widest, Math.abs(u));
      d2 += u * u;
    }
    expect(widest).toBeLessThanOrEqual(1);
    // Truncation at 3σ removes 0.27 % of the mass and trims σ by about 1.5 % (normal tables).
    expect(Math.sqrt(d2 / n)).toBeGreaterThan(0.32);
    expect(Math.sqrt(d2 / n)).toBeLessThan(0.335);
  });
});

describe('deviatedValue', () => {
  it('maps -1, 0, +1 onto the ends and the nominal of an asymmetric spread', () => {
    // 2N3904 hFE 100–300 at 10 mA (MCC datasheet) around 200.
    const d = { low: 100, nominal: 200, high: 300 };
    expect(deviatedValue(d, -1)).toBe(100);
    expect(deviatedValue(d, 0)).toBe(200);
    expect(deviatedValue(d, 1)).toBe(300);
    const e = { low: 50, nominal: 100, high: 400 };
    expect(deviatedValue(e, -0.5)).toBe(75);
    expect(deviatedValue(e, 0.5)).toBe(250);
  });
});

describe('worst case over an abstract evaluator', () => {
  it('finds the exact extremes of a ±1 % divider (textbook formula at the corners)', () => {
    const r = worstCase(2, divider);
    const hi = (V * R2 * 1.01) / (R1 * 0.99 + R2 * 1.01);
    const lo = (V * R2 * 0.99) / (R1 * 1.01 + R2 * 0.99);
    expect(r.max[0]).toBeCloseTo(hi, 12);
    expect(r.min[0]).toBeCloseTo(lo, 12);
    expect(Array.from(r.maxAt[0])).toEqual([-1, 1]);
    expect(Array.from(r.minAt[0])).toEqual([1, -1]);
    // nominal, 4 one-at-a-time ends, 2 corners
    expect(r.solves).toBe(7);
    expect(r.sensitivity[0]).toBeLessThan(0); // raising R1 lowers the output
    expect(r.sensitivity[1]).toBeGreaterThan(0);
  });

  it('keeps a one-at-a-time end that beats the predicted corner on a non-monotonic response', () => {
    // y = -(u0 - 0.2)^2 + 0.1·u1: the max over u0 is interior (0.2), the ends both lower y, so the
    // corner search leaves u0 at nominal for the max; y(0, +1) = -0.04 + 0.1 = 0.06.
    const f = (u: Float64Array) => Float64Array.of(-((u[0] - 0.2) ** 2) + 0.1 * u[1]);
    const r = worstCase(2, f);
    expect(r.max[0]).toBeCloseTo(0.06, 12);
    expect(Array.from(r.maxAt[0])).toEqual([0, 1]);
    expect(r.min[0]).toBeCloseTo(-1.44 - 0.1, 12);
  });

  it('counts points that cannot be solved and keeps going', () => {
    const f = (u: Float64Array) => {
      if (u[0] > 0.5 && u[1] < -0.5) throw new Error('no convergence');
      return divider(u);
    };
    const r = worstCase(2, f);
    expect(r.failures).toBe(1);
    expect(r.max[0]).toBeGreaterThan(r.nominal[0]);
  });

  it('shares corners between outputs that agree', () => {
    const f = (u: Float64Array) => Float64Array.of(u[0] + u[1], 2 * u[0] + 3 * u[1], -(u[0] + u[1]));
    const r = worstCase(2, f);
    // 1 + 4 + two distinct corners (+,+) and (-,-)
    expect(r.solves).toBe(7);
    expect(Array.from(r.max)).toEqual([2, 5, 2]);
  });
});

describe('Monte Carlo over an abstract evaluator', () => {
  it('is reproducible for a seed and moves slightly with another seed', () => {
    const a = monteCarlo(['gaussian', 'gaussian'], divider, { samples: 1000, seed: 11 });
    const b = monteCarlo(['gaussian', 'gaussian'], divider, { samples: 1000, seed: 11 });
    const c = monteCarlo(['gaussian', 'gaussian'], divider, { samples: 1000, seed: 12 });
    expect(Array.from(b.low)).toEqual(Array.from(a.low));
    expect(Array.from(b.high)).toEqual(Array.from(a.high));
    expect(c.low[0]).not.toBe(a.low[0]);
    // "slightly": within 10 % of the interval width
    const width = a.high[0] - a.low[0];
    expect(Math.abs(c.low[0] - a.low[0])).toBeLessThan(0.1 * width);
    expect(Math.abs(c.high[0] - a.high[0])).toBeLessThan(0.1 * width);
  });

  it('lies inside the worst-case band on the divider', () => {
    const wc = worstCase(2, divider);
    for (const dist of ['uniform', 'gaussian'] as const) {
      const mc = monteCarlo([dist, dist], divider, { samples: 2000, seed: 5 });
      expect(mc.min[0]).toBeGreaterThanOrEqual(wc.min[0]);
      expect(mc.max[0]).toBeLessThanOrEqual(wc.max[0]);
      expect(mc.low[0]).toBeGreaterThan(wc.min[0]);
    }
  });

  it('gives the σ of a sum of uniforms that statistics predicts', () => {
    // Var(U(-1,1)) = 1/3, so u0 + u1 has σ = sqrt(2/3) ≈ 0.8165.
    const mc = monteCarlo(['uniform', 'uniform'], (u) => Float64Array.of(u[0] + u[1]), { samples: 20_000, seed: 9 });
    expect(mc.std[0]).toBeCloseTo(Math.sqrt(2 / 3), 1);
    expect(Math.abs(mc.median[0])).toBeLessThan(0.03);
  });

  it('reports progress and counts failed samples', () => {
    const calls: number[] = [];
    const mc = monteCarlo(
      ['uniform'],
      (u) => {
        if (u[0] > 0.9) throw new Error('no convergence');
        return Float64Array.of(u[0]);
      },
      { samples: 200, seed: 2, onProgress: (d) => calls.push(d) },
    );
    expect(calls).toEqual([50, 100, 150, 200]);
    expect(mc.failures).toBeGreaterThan(0);
    expect(mc.samples + mc.failures).toBe(200);
    expect(mc.max[0]).toBeLessThanOrEqual(0.9);
  });

  it('leaves a NaN reading out of that reading only', () => {
    const mc = monteCarlo(['uniform'], (u) => Float64Array.of(u[0], u[0] > 0.5 ? NaN : u[0]), { samples: 400, seed: 8 });
    expect(mc.failures).toBe(0);
    expect(mc.missing[0]).toBe(0);
    expect(mc.missing[1]).toBeGreaterThan(50);
    expect(mc.max[0]).toBeGreaterThan(0.9);
    expect(mc.max[1]).toBeLessThanOrEqual(0.5);
  });

  it('percentile interpolates between order statistics', () => {
    expect(percentile([1, 2, 3, 4, 5], 50)).toBe(3);
    expect(percentile([1, 2, 3, 4, 5], 25)).toBe(2);
    expect(percentile([0, 10], 99.5)).toBeCloseTo(9.95, 12);
  });
});
