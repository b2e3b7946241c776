import { describe, expect, it } from 'vitest';
import { nearestFits, unexplainedReadings, UNEXPLAINED_SIGMAS } from '../../src/diagnosis/unexplained.js';
import { DEFAULT_METER } from '../../src/diagnosis/meter.js';
import { hyp, obs } from './fixtures.js';

describe('readings that fit no modelled fault', () => {
  // Invented numbers: one test point, healthy 5 V ± 0.2 V, and one fault that sends it to 11 V.
  // σ by hand (likelihood-spread.ts): healthy hypot(0.2/2, meter/2) with the meter ±(0.5 % + 2 counts
  // of 10 mV) = ±45 mV at 5 V, so 0.1025 V; the fault hypot(0.44/2, 0.075/2, 0.1 × 6 V shift) = 0.640 V.
  const dict = {
    observables: [obs('TP1', 5, 0.2)],
    hypotheses: [hyp('none', [5]), hyp('R1/open', [11])],
  };
  const at = (value: number) => [{ testPoint: 'TP1', condition: 'quiescent', value }];

  it('measures the distance to the nearest prediction in that prediction\'s σ', () => {
    expect(UNEXPLAINED_SIGMAS).toBe(6);
    // 8 V: 3 V from the fault's 11 V is 3 / 0.640 = 4.7 σ; 3 V from healthy is 29 σ.
    const [fit] = nearestFits(dict, at(8), [0], DEFAULT_METER);
    expect(fit.sigmas).toBeCloseTo(3 / 0.640, 1);
  });

  it('lets pass what some candidate foresees, however far from healthy', () => {
    for (const value of [5.1, 8, 11.3]) expect(unexplainedReadings(dict, at(value), [0], DEFAULT_METER)).toEqual([]);
  });

  it('names a reading beyond every candidate, with the band and the prediction nearest in value', () => {
    // 16 V: 5 / 0.640 = 7.8 σ from the fault, 107 σ from healthy.
    const [high] = unexplainedReadings(dict, at(16), [0], DEFAULT_METER);
    expect(high).toMatchObject({ testPoint: 'TP1', value: 16, nearest: { id: 'R1/open', predicted: 11 } });
    expect(high.text).toMatch(/^TP1 = 16 V fits no single modelled fault: a healthy board reads 5\.00 V \(4\.80 V to 5\.20 V\) and the nearest is 11 V with R1 open\./);
    // 0 V: 17 σ from the fault, 49 σ from healthy — and nearer healthy in volts.
    const [low] = unexplainedReadings(dict, at(0), [0], DEFAULT_METER);
    expect(low.nearest.id).toBe('none');
    expect(low.text).toContain('the nearest is the healthy board itself');
  });

  it('treats a hypothesis the solver could not settle as predicting nothing, not everything', () => {
    const withUnsettled = { ...dict, hypotheses: [...dict.hypotheses, hyp('U1/dead', [NaN])] };
    expect(unexplainedReadings(withUnsettled, at(16), [0], DEFAULT_METER)).toHaveLength(1);
  });
});
