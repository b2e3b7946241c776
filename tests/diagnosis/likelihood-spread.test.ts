import { describe, expect, it } from 'vitest';
import { spreadTable } from '../../src/diagnosis/dictionary-model.js';
import { likelihoodSigma, SHIFT_UNCERTAINTY } from '../../src/diagnosis/likelihood-spread.js';
import { DEFAULT_METER } from '../../src/diagnosis/meter.js';
import { posterior } from '../../src/diagnosis/posterior.js';
import { hyp, obs } from './fixtures.js';

/** A rail with a tight band that one fault leaves alone and another pulls to 0 V; a divider tap beside it. */
function railDictionary() {
  return {
    observables: [obs('TP1', 11.3, 0.025), obs('TP2', 6, 0.3)],
    hypotheses: [hyp('none', [11.3, 6]), hyp('R1/open', [11.3, 9]), hyp('D2/short', [0, 6])],
  };
}

describe('the spread the posterior gives a reading', () => {
  it('is the healthy one where a fault leaves the reading where it was', () => {
    const dict = railDictionary();
    const sigma = likelihoodSigma(dict, DEFAULT_METER);
    const width = dict.observables.length;
    expect(sigma[1 * width + 0]).toBeCloseTo(sigma[0], 12);
    // The dictionary's own spread gives the fault 2 % of 11.3 V besides: about three times the healthy σ.
    expect(spreadTable(dict, DEFAULT_METER).sigma[1 * width + 0]).toBeGreaterThan(2.5 * sigma[0]);
  });

  it('grows with how far a fault moves the reading', () => {
    const dict = railDictionary();
    const sigma = likelihoodSigma(dict, DEFAULT_METER);
    const width = dict.observables.length;
    // D2 short moves TP1 by 11.3 V: its σ there is at least the shift's share.
    expect(sigma[2 * width + 0]).toBeGreaterThanOrEqual(SHIFT_UNCERTAINTY * 11.3);
    expect(sigma[1 * width + 1]).toBeGreaterThan(sigma[0 * width + 1]);
  });

  it('a reading a fault does not move leaves that fault and a healthy board as they were', () => {
    const dict = railDictionary();
    const before = posterior(dict, []);
    const after = posterior(dict, [{ testPoint: 'TP1', condition: 'quiescent', value: 11.3 }]);
    // Bayes: equal likelihoods leave the odds at the prior odds.
    expect(after[1] / after[0]).toBeCloseTo(before[1] / before[0], 9);
    expect(after[2]).toBeLessThan(before[2] / 10);
  });
});
