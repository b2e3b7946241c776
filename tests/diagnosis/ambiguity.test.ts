import { describe, expect, it } from 'vitest';
import { ambiguityGroups, distinguishable, separable } from '../../src/diagnosis/ambiguity.js';
import { hyp, obs } from './fixtures.js';

describe('ambiguity groups', () => {
  const dict = {
    observables: [obs('TP1', 6, 0.3), obs('TP2', 0, 0.05)],
    hypotheses: [
      hyp('none', [6, 0]),
      // Two series parts whose opening does the same thing everywhere: one group, not a false choice.
      hyp('R1/open', [0, 0]),
      hyp('R5/open', [0.01, 0]),
      hyp('R2/open', [12, 0]),
      hyp('U1/rotated', [NaN, NaN]),
    ],
  };

  it('joins faults no reading can separate, and only those', () => {
    const groups = ambiguityGroups(dict, [0, 1, 2, 3, 4]);
    expect(groups.get(1)).toBe(groups.get(2));
    expect(new Set([groups.get(0), groups.get(1), groups.get(3), groups.get(4)]).size).toBe(4);
  });

  it('never merges a hypothesis the solver could not settle', () => {
    expect(distinguishable(dict, 4, 0)).toBe(true);
  });

  it('uses measurable as well as measured points: TP2 alone parts these', () => {
    const d = { observables: [obs('TP1', 6, 0.3), obs('TP2', 0, 0.05)], hypotheses: [hyp('none', [6, 0]), hyp('D1/short', [6, 10])] };
    expect(distinguishable(d, 0, 1)).toBe(true);
  });

  it('does not chain near neighbours into one group (complete linkage)', () => {
    // Each step is within reach of the next, the ends are not.
    const d = {
      observables: [obs('TP1', 5, 0.1)],
      hypotheses: [hyp('none', [5]), hyp('A1/x', [5.25]), hyp('A2/x', [5.5])],
    };
    const groups = ambiguityGroups(d, [0, 1, 2]);
    expect(groups.get(0)).not.toBe(groups.get(2));
  });

  it('groups a fault with another that one of its variants cannot be told from', () => {
    // Invented numbers: a bridge that, depending on an offset's sign, reads like the output stuck high or low.
    const d = {
      observables: [obs('TP1', 5, 0.1), obs('TP2', 2, 0.1)],
      hypotheses: [
        hyp('none', [5, 2]),
        { ...hyp('U1/bridge', [5, 0]), variants: [[11, 0], [-11, 0]] },
        hyp('U1/stuck-high', [11, 0]),
        hyp('U1/stuck-low', [-11, 0]),
        hyp('R2/open', [11, 5]),
      ],
    };
    // The headline's test goes by the nominal prediction alone; grouping looks at every variant.
    expect(distinguishable(d, 1, 2)).toBe(true);
    expect(separable(d, 1, 2)).toBe(false);
    expect(separable(d, 1, 3)).toBe(false);
    expect(separable(d, 1, 4)).toBe(true);
    const groups = ambiguityGroups(d, [2, 1, 3, 4, 0]);
    expect(groups.get(1)).toBe(groups.get(2));
    expect(groups.get(3)).not.toBe(groups.get(2));
    expect(new Set([groups.get(0), groups.get(2), groups.get(4)]).size).toBe(3);
  });
});
