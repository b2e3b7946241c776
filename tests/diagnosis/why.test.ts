import { describe, expect, it } from 'vitest';
import { explain } from '../../src/diagnosis/why.js';
import { hyp, obs } from './fixtures.js';

describe('why a suspect is ranked where it is', () => {
  // Invented numbers: a bridge whose amplifier output runs to either rail with the offset's sign.
  const dict = {
    observables: [obs('TP1', 5, 0.2)],
    hypotheses: [hyp('none', [5]), { ...hyp('U1/bridge', [5.5]), variants: [[11], [-11]] }],
  };

  it('quotes the variant the readings fit, not the nominal prediction', () => {
    const text = explain(dict, 1, [{ testPoint: 'TP1', condition: 'quiescent', value: -10.9 }], [0]);
    expect(text).toContain('would read -11');
    expect(text).not.toContain('5.5 V');
  });

  it('with readings near the nominal prediction, quotes that', () => {
    const text = explain(dict, 1, [{ testPoint: 'TP1', condition: 'quiescent', value: 5.45 }], [0]);
    expect(text).toContain('would read 5.5 V');
  });

  it('quotes a narrow band, the predictions and the reading with the figures that keep the band edges apart', () => {
    // A rail band 11.74 V … 11.80 V (halfWidth 0.03 about 11.77 V): to three figures its edges would read
    // 11.7 V and 11.8 V, and a prediction of 11.70 V would look like an edge. Four figures, by hand:
    // a step of 0.01 V, and 0.06 V spans 6 steps (≥ 4).
    const rail = {
      observables: [obs('TP1', 11.77, 0.03)],
      hypotheses: [hyp('none', [11.77]), hyp('D1/open', [11.7])],
    };
    const read = [{ testPoint: 'TP1', condition: 'quiescent', value: 11.75 }];
    expect(explain(rail, 0, [{ ...read[0], value: 11.2 }], [0])).toContain('TP1 should read 11.77 V (11.74 V to 11.80 V) on a healthy board; you read 11.2 V');
    const text = explain(rail, 1, read, [0]);
    expect(text).toContain('would read 11.7 V');
    expect(text).toContain('you read 11.75 V');
  });

  it('shows the healthy band with its computed edges where they sit unevenly about the nominal', () => {
    // Invented: a base voltage of -0.509 mV whose band runs from -1.08 mV to -0.30 mV (half-width 0.39 mV).
    const base = { ...obs('TP9', -0.509e-3, 0.39e-3), min: -1.08e-3, max: -0.3e-3 };
    const text = explain({ observables: [base], hypotheses: [hyp('none', [-0.509e-3])] }, 0, [{ testPoint: 'TP9', condition: 'quiescent', value: -0.8e-3 }], [0]);
    expect(text).toContain('TP9 should read -0.51 mV (-1.08 mV to -0.30 mV)');
  });
});
