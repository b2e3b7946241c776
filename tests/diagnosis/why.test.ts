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
});
