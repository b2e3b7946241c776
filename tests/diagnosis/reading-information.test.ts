import { describe, expect, it } from 'vitest';
import { spreadTable } from '../../src/diagnosis/dictionary-model.js';
import { DEFAULT_METER } from '../../src/diagnosis/meter.js';
import { binsAt, expectedEntropyAfter, nextProbe } from '../../src/diagnosis/next-probe.js';
import { entropyBits, posterior } from '../../src/diagnosis/posterior.js';
import { GAUSS_HERMITE_5, readingInformation } from '../../src/diagnosis/reading-information.js';
import { hyp, obs } from './fixtures.js';

const even = (n: number) => new Array<number>(n).fill(1 / n);

/** Healthy at 5 V and one fault at 5 + offset at a single test point. */
function pair(offset: number) {
  return { observables: [obs('TP1', 5, 0.1)], hypotheses: [hyp('none', [5]), hyp('R1/low', [5 + offset])] };
}

/** The offset at which binsAt first puts the fault in a bin of its own. */
function binEdge(): number {
  let lo = 0;
  let hi = 5;
  for (let k = 0; k < 60; k++) {
    const mid = (lo + hi) / 2;
    if (binsAt(pair(mid), 0).count > 1) hi = mid;
    else lo = mid;
  }
  return hi;
}

describe('the five-point Gauss–Hermite rule', () => {
  it('gives the standard normal moments exactly up to the ninth power', () => {
    // An n-point Gauss–Hermite rule is exact for polynomials of degree ≤ 2n − 1 (Abramowitz &
    // Stegun 25.4.46); with x = √2·node it gives E[zᵏ] of a standard normal: 1, 0, 1, 0, 3, 0, 15, 0, 105
    // ((k − 1)!! for even k, textbook).
    const moments = [1, 0, 1, 0, 3, 0, 15, 0, 105];
    moments.forEach((m, k) => {
      const sum = GAUSS_HERMITE_5.nodes.reduce((a, x, i) => a + GAUSS_HERMITE_5.weights[i] * (Math.SQRT2 * x) ** k, 0);
      expect(sum, `E[z^${k}]`).toBeCloseTo(m, 9);
    });
  });
});

describe('expected information from one reading', () => {
  it('is nothing where every hypothesis predicts the same', () => {
    expect(readingInformation(pair(0), even(2), 0)).toBe(0);
  });

  it('is about one bit for two equally likely predictions far apart', () => {
    // Shannon: an even split told apart is one bit; the posterior's 5 % outlier share keeps a little back.
    const bits = readingInformation(pair(6), even(2), 0);
    expect(bits).toBeGreaterThan(0.9);
    expect(bits).toBeLessThanOrEqual(1);
  });

  it('never falls as the predictions move apart', () => {
    let last = -1;
    for (let offset = 0; offset <= 2; offset += 0.05) {
      const bits = readingInformation(pair(offset), even(2), 0);
      expect(bits).toBeGreaterThanOrEqual(last - 1e-9);
      last = bits;
    }
  });

  it('changes a little, not by a whole bit, where a hard bin boundary falls', () => {
    const edge = binEdge();
    const below = pair(edge * 0.97);
    const above = pair(edge * 1.03);
    // The hard bins jump from nothing to a full bit across the edge...
    const h = entropyBits(even(2));
    expect(h - expectedEntropyAfter(below, even(2), 0)).toBeCloseTo(0, 9);
    expect(h - expectedEntropyAfter(above, even(2), 0)).toBeCloseTo(1, 9);
    // ...while what the posterior will learn barely moves.
    const a = readingInformation(below, even(2), 0);
    const b = readingInformation(above, even(2), 0);
    expect(Math.abs(b - a)).toBeLessThan(0.1);
    expect(a).toBeGreaterThan(0.4);
  });

  it('a reading moving the likely fault by most of a band is chosen over one that finds an unlikely fault for certain', () => {
    const edge = binEdge();
    const dict = {
      observables: [obs('TP1', 5, 0.1), obs('TP2', 5, 0.1)],
      hypotheses: [hyp('none', [5, 5]), hyp('R1/low', [5 + 0.9 * edge, 5]), hyp('D2/short', [5, 0], 0.04)],
    };
    const p = posterior(dict, []);
    // The hard bins see nothing at TP1 (one bin) and a sure split of 2 % at TP2, so they would send
    // the person to TP2; the reading at TP1 tells far more about the two likely hypotheses.
    expect(entropyBits(p) - expectedEntropyAfter(dict, p, 0)).toBeCloseTo(0, 9);
    expect(entropyBits(p) - expectedEntropyAfter(dict, p, 1)).toBeGreaterThan(0.1);
    expect(nextProbe(dict, p)?.testPoint).toBe('TP1');
  });

  it('the probe suggested is the best of all, though most are never weighed in full', () => {
    // A small deterministic generator (Park–Miller minimal standard, common practice) for varied dictionaries.
    let seed = 12345;
    const rand = () => (seed = (seed * 48271) % 2147483647) / 2147483647;
    for (let trial = 0; trial < 25; trial++) {
      const observables = Array.from({ length: 12 }, (_, i) => obs(`TP${i + 1}`, 6 * rand() - 3, 0.05 + 0.3 * rand()));
      const hypotheses = [hyp('none', observables.map((o) => o.nominal))];
      for (let h = 0; h < 25; h++) {
        // Most faults leave most readings alone, as on a real board.
        const predictions = observables.map((o) => (rand() < 0.25 ? o.nominal + 8 * rand() - 4 : o.nominal));
        hypotheses.push(hyp(`R${h + 1}/open`, predictions, 0.2 + rand()));
      }
      const dict = { observables, hypotheses };
      spreadTable(dict, DEFAULT_METER);
      const p = posterior(dict, []);
      const best = Math.max(...observables.map((_, i) => readingInformation(dict, p, i)));
      const next = nextProbe(dict, p);
      // Within the 0.01-bit tie margin (the easier probe may win a near tie) and the 3-decimal rounding.
      expect(next!.expectedInformationBits).toBeGreaterThanOrEqual(best - 0.0105);
    }
  });
});
