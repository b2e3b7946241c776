import type { FaultDictionary, Hypothesis, Observable } from '../../src/diagnosis/dictionary-model.js';

/**
 * A hand-made dictionary for the arithmetic: a divider feeding a follower, three test points under
 * one condition. The numbers are invented for the check, not taken from any board.
 */
export function obs(testPoint: string, nominal: number, halfWidth: number, access: Observable['access'] = 'pad', condition = 'quiescent'): Observable {
  return { testPoint, condition, unit: 'V', access, nominal, halfWidth, span: 13 };
}

export function hyp(id: string, predictions: number[], prior = 1): Hypothesis {
  const [part, mode] = id === 'none' ? ['none', 'none'] : id.split('/');
  return { id, part, mode, fault: mode, prior, predictions };
}

export function smallDictionary(): FaultDictionary {
  return {
    observables: [obs('TP1', 6, 0.3), obs('TP2', 6, 0.3, 'leg'), obs('TP3', 0, 0.05, 'ic-pin')],
    hypotheses: [
      hyp('none', [6, 6, 0]),
      hyp('R1/open', [0, 0, 0]),
      hyp('R2/open', [12, 12, 0]),
      // R3 and C4 agree at TP1 and TP2 and part only at TP3: the probe that splits them.
      hyp('R3/short', [3, 3, -10.5]),
      hyp('C4/short', [3, 3, 10.5]),
    ],
  };
}
