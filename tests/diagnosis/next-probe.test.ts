import { describe, expect, it } from 'vitest';
import { binsAt, expectedEntropyAfter, nextProbe } from '../../src/diagnosis/next-probe.js';
import { entropyBits, posterior } from '../../src/diagnosis/posterior.js';
import { hyp, obs, smallDictionary } from './fixtures.js';

describe('next-best probe (minimum expected entropy, de Kleer & Williams 1987)', () => {
  it('splits two faults that agree on everything measured so far', () => {
    const dict = smallDictionary();
    const readings = [{ testPoint: 'TP1', condition: 'quiescent', value: 3.02 }];
    const p = posterior(dict, readings);
    // Only R3/short and C4/short predict 3 V at TP1; TP2 agrees with TP1 for both, TP3 parts them.
    expect(p[3] + p[4]).toBeGreaterThan(0.99);
    const next = nextProbe(dict, p, { measured: new Set([0]) });
    expect(next?.testPoint).toBe('TP3');
    // Two equally likely candidates, far apart: one bit (Shannon), plus the little the under 1 % still
    // on the other hypotheses adds, less what the posterior's 5 % outlier share keeps back (a reading
    // the model did not foresee could belong to either, so no reading settles it completely).
    expect(next?.expectedInformationBits).toBeGreaterThan(0.9);
    expect(next?.expectedInformationBits).toBeLessThan(1.05);
  });

  it('an observable every hypothesis agrees on is worth nothing', () => {
    const dict = smallDictionary();
    const p = dict.hypotheses.map(() => 1 / dict.hypotheses.length);
    const before = entropyBits(p);
    // TP3 reads 0 V for the first three: it separates only R3 and C4 from them and from each other.
    const after = expectedEntropyAfter(dict, p, 2);
    expect(after).toBeLessThan(before);
    const flat = { observables: [obs('TP1', 1, 0.1)], hypotheses: [hyp('none', [1]), hyp('R1/open', [1])] };
    expect(expectedEntropyAfter(flat, [0.5, 0.5], 0)).toBeCloseTo(1, 12);
  });

  it('on a tie, suggests the easier probe: a pad before an IC pin', () => {
    const dict = {
      observables: [obs('TP7', 5, 0.1, 'ic-pin'), obs('TP2', 5, 0.1, 'pad')],
      hypotheses: [hyp('none', [5, 5]), hyp('R1/open', [0, 0])],
    };
    const next = nextProbe(dict, [0.5, 0.5]);
    expect(next?.testPoint).toBe('TP2');
  });

  it('suggests nothing once nothing left can be told apart', () => {
    const dict = smallDictionary();
    const next = nextProbe(dict, [1, 0, 0, 0, 0]);
    expect(next).toBeUndefined();
  });

  it('puts predictions within band-plus-meter reach in one bin and far ones apart', () => {
    const dict = {
      observables: [obs('TP1', 5, 0.1)],
      hypotheses: [hyp('none', [5]), hyp('R1/low', [5.05]), hyp('R2/open', [9])],
    };
    const { bin, count } = binsAt(dict, 0);
    expect(count).toBe(2);
    expect(bin[0]).toBe(bin[1]);
    expect(bin[2]).not.toBe(bin[0]);
  });
});
