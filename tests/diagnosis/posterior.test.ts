import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { entropyBits, normaliseLogs, posterior, rowPosterior } from '../../src/diagnosis/posterior.js';
import { UserInputError } from '../../src/errors.js';
import { hyp, obs, smallDictionary } from './fixtures.js';

describe('posterior over a hand-made dictionary', () => {
  it('sums to 1 for any readings, however far from every prediction', () => {
    const dict = smallDictionary();
    fc.assert(
      fc.property(fc.double({ min: -15, max: 15, noNaN: true }), fc.double({ min: -15, max: 15, noNaN: true }), (a, b) => {
        const p = posterior(dict, [
          { testPoint: 'TP1', condition: 'quiescent', value: a },
          { testPoint: 'TP3', condition: 'quiescent', value: b },
        ]);
        const total = p.reduce((x, y) => x + y, 0);
        return Math.abs(total - 1) < 1e-9 && p.every((x) => x >= 0 && Number.isFinite(x));
      }),
    );
  });

  it('with no readings returns the normalised priors', () => {
    const dict = smallDictionary();
    dict.hypotheses[1].prior = 3;
    const p = posterior(dict, []);
    expect(p[1]).toBeCloseTo(3 / 7, 12);
    expect(p[0]).toBeCloseTo(1 / 7, 12);
  });

  it('with a fault known present, "no fault" gets nothing and the faults keep their ratios', () => {
    const dict = smallDictionary();
    const readings = [{ testPoint: 'TP1', condition: 'quiescent', value: dict.hypotheses[0].predictions[0] }];
    const open = rowPosterior(dict, readings).hypotheses;
    const known = rowPosterior(dict, readings, { faultPresent: true }).hypotheses;
    expect(dict.hypotheses[0].id).toBe('none');
    expect(known[0]).toBe(0);
    expect(known.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 12);
    // Every fault's share is scaled by the same factor, 1 / (1 − P(no fault)).
    for (let i = 1; i < dict.hypotheses.length; i++) expect(known[i]).toBeCloseTo(open[i] / (1 - open[0]), 12);
    expect(open[0]).toBeGreaterThan(0.1);
  });

  it('a reading exactly at a fault prediction ranks that fault first', () => {
    const dict = smallDictionary();
    for (const [i, h] of dict.hypotheses.entries()) {
      if (h.id === 'R3/short' || h.id === 'C4/short') continue; // these two agree at TP1
      const p = posterior(dict, [{ testPoint: 'TP1', condition: 'quiescent', value: h.predictions[0] }]);
      const best = p.indexOf(Math.max(...p));
      expect(dict.hypotheses[best].id, `reading ${h.predictions[0]} V`).toBe(dict.hypotheses[i].id);
    }
  });

  it('moving a reading towards a prediction never lowers that hypothesis', () => {
    const dict = smallDictionary();
    const at = (v: number) => posterior(dict, [{ testPoint: 'TP1', condition: 'quiescent', value: v }])[2]; // R2/open predicts 12 V
    fc.assert(
      fc.property(fc.double({ min: 6, max: 12, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), (v, t) => {
        const closer = v + (12 - v) * t;
        return at(closer) >= at(v) - 1e-12;
      }),
    );
  });

  it('an unpredictable hypothesis is neither ruled in nor out by a reading', () => {
    const dict = smallDictionary();
    dict.hypotheses.push(hyp('U1/rotated', [NaN, NaN, NaN]));
    const near = posterior(dict, [{ testPoint: 'TP1', condition: 'quiescent', value: 6 }]);
    const far = posterior(dict, [{ testPoint: 'TP1', condition: 'quiescent', value: 9 }]);
    expect(near[5]).toBeGreaterThan(0);
    // Where no predictable hypothesis fits, the unpredictable one takes the lead.
    expect(far[5]).toBeGreaterThan(far[0]);
  });

  it('names an unknown test point or condition in a user error', () => {
    const dict = smallDictionary();
    expect(() => posterior(dict, [{ testPoint: 'TP9', condition: 'quiescent', value: 1 }])).toThrow(UserInputError);
    expect(() => posterior(dict, [{ testPoint: 'TP9', condition: 'quiescent', value: 1 }])).toThrow(/TP9.*quiescent/);
  });

  it('readings under several conditions multiply their evidence', () => {
    const dict = {
      observables: [obs('TP1', 6, 0.3), obs('TP1', 2, 0.1, 'pad', 'dc-high')],
      hypotheses: [hyp('none', [6, 2]), hyp('R1/open', [6, 0]), hyp('R2/open', [0, 2])],
    };
    const p = posterior(dict, [
      { testPoint: 'TP1', condition: 'quiescent', value: 6 },
      { testPoint: 'TP1', condition: 'dc-high', value: 0.01 },
    ]);
    expect(p[1]).toBeGreaterThan(0.99);
  });
});

describe('a fault with variant predictions', () => {
  // Invented numbers: a bridge whose amplifier runs to either rail, and a fault that puts one test
  // point at each rail at once.
  const dict = {
    observables: [obs('TP1', 5, 0.2), obs('TP2', 5, 0.2)],
    hypotheses: [
      hyp('none', [5, 5]),
      { ...hyp('U1/bridge', [5.5, 5.5]), variants: [[11, 11], [-11, -11]] },
      hyp('R9/short', [11, -11]),
    ],
  };
  const read = (a: number, b: number) => posterior(dict, [
    { testPoint: 'TP1', condition: 'quiescent', value: a },
    { testPoint: 'TP2', condition: 'quiescent', value: b },
  ]);

  it('is found at either of its variants', () => {
    expect(read(11, 11)[1]).toBeGreaterThan(0.99);
    expect(read(-11, -11)[1]).toBeGreaterThan(0.99);
  });

  it('is weighed one variant at a time: a reading from each does not add up to a fit', () => {
    const p = read(11, -11);
    expect(p[2]).toBeGreaterThan(0.99);
    expect(p.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 12);
  });

  it('shares its prior among its variants: with no readings it weighs what its prior says', () => {
    expect(read(5, 5).length).toBe(3);
    expect(posterior(dict, [])[1]).toBeCloseTo(1 / 3, 12);
  });
});

describe('entropy', () => {
  it('of a uniform distribution over N is log2 N (Shannon)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 4096 }), (n) => Math.abs(entropyBits(new Array(n).fill(1 / n)) - Math.log2(n)) < 1e-9),
    );
  });
  it('of a certainty is 0', () => {
    expect(entropyBits([1, 0, 0])).toBe(0);
  });
  it('log-sum-exp normalisation survives logs far below the float range', () => {
    const p = normaliseLogs([-5000, -5000 + Math.log(3)]);
    expect(p[1]).toBeCloseTo(0.75, 12);
  });
});

describe('bad readings', () => {
  it('a reading that is not a number is refused by name, not ranked', () => {
    const dict = smallDictionary();
    expect(() => posterior(dict, [{ testPoint: 'TP1', condition: 'quiescent', value: NaN }])).toThrow(/TP1: the reading is not a number/);
  });
});
