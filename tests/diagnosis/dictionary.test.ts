import { describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { measureAll } from '../../src/board/index.js';
import { applyFault, buildDictionary, type BuiltDictionary } from '../../src/diagnosis/index.js';
import { loadDictionary, saveDictionary } from '../../src/cache/dictionary-cache.js';
import { tinyBoard } from './tiny-board.js';

describe('fault dictionary on the tiny board', () => {
  const board = tinyBoard();
  const dict = buildDictionary(board);

  it('holds the healthy board first and every candidate fault, none dropped', () => {
    expect(dict.hypotheses[0].id).toBe('none');
    expect(dict.hypotheses.map((h) => h.id).slice(1)).toEqual(dict.faults.map((f) => f.id));
    // A fault whose circuit did not settle is kept, predicting NaN under that condition only.
    for (const [id, conditions] of dict.unsettled) {
      const h = dict.hypotheses.find((x) => x.id === id)!;
      dict.observables.forEach((o, i) => expect(Number.isNaN(h.predictions[i])).toBe(conditions.includes(o.condition)));
    }
  });

  it('priors are a distribution, 5 % of it on "no fault" by default', () => {
    const total = dict.hypotheses.reduce((a, h) => a + h.prior, 0);
    expect(total).toBeCloseTo(1, 12);
    expect(dict.hypotheses[0].prior).toBeCloseTo(0.05, 12);
  });

  it('predictions are the solver’s readings of each faulty board', () => {
    const f = dict.faults.find((x) => x.id === 'R2/open')!;
    const h = dict.hypotheses.find((x) => x.id === 'R2/open')!;
    for (const condition of ['quiescent', 'unpowered']) {
      const direct = measureAll(applyFault(board, f), condition);
      dict.observables.forEach((o, i) => {
        if (o.condition === condition) expect(h.predictions[i]).toBeCloseTo(direct[o.testPoint], 4);
      });
    }
    const healthy = measureAll(board, 'quiescent');
    dict.observables.forEach((o, i) => {
      if (o.condition === 'quiescent') expect(dict.hypotheses[0].predictions[i]).toBeCloseTo(healthy[o.testPoint], 6);
    });
  });

  it('an open R2 raises the resistance from the divider to ground', () => {
    // R2 is the divider's direct path to ground; with it open the ohmmeter sees only the paths
    // through R1 and D1, so the reading must rise (parallel resistances only add up to less).
    const i = dict.observables.findIndex((o) => o.testPoint === 'TP6');
    const h = dict.hypotheses.find((x) => x.id === 'R2/open')!;
    expect(h.predictions[i]).toBeGreaterThan(dict.observables[i].nominal);
  });

  it('a bridge joining one amplifier’s inputs also predicts its offset at either end, and only such a bridge', () => {
    // Common practice: an op-amp whose inputs are joined has only its own input offset left to amplify,
    // open loop, so its output runs to the rail of the offset's sign; a TL072 swings to within about
    // 1.5–2 V of its rails (from memory: TL072 datasheet, ±13.5 V typical at ±15 V supplies).
    const h = dict.hypotheses.find((x) => x.id === 'U1/bridge/2-3')!;
    expect(h.variants).toHaveLength(2);
    const [plus, minus] = h.variants!;
    const out = dict.observables.findIndex((o) => o.testPoint === 'TP2' && o.condition === 'quiescent');
    expect(plus[out]).toBeGreaterThan(9);
    expect(minus[out]).toBeLessThan(-9);
    // No offset moves an ohmmeter reading of the unpowered board.
    dict.observables.forEach((o, i) => {
      if (o.condition === 'unpowered') for (const v of h.variants!) expect(v[i]).toBe(h.predictions[i]);
    });
    // Pins 3–4 join an input to a supply pin; a transistor's bridge or an open resistor leaves every amplifier's inputs apart.
    for (const id of ['U1/bridge/3-4', 'Q1/bridge/E-B', 'R2/open']) expect(dict.hypotheses.find((x) => x.id === id)!.variants).toBeUndefined();
  });

  it('is cached: the same board gives the same dictionary object', () => {
    expect(buildDictionary(tinyBoard())).toBe(dict);
  });
});

describe('dictionary kept on disk', () => {
  const hand: BuiltDictionary = {
    board: tinyBoard(),
    observables: [
      { testPoint: 'TP1', condition: 'quiescent', unit: 'V', access: 'pad', nominal: 5, halfWidth: 0.2, span: 13 },
      { testPoint: 'TP5', condition: 'unpowered', unit: 'Ω', access: 'header', nominal: 9000, halfWidth: 400, span: 2e7 },
      // A test point a healthy board reads as open (the meter shows OL): its nominal is Infinity.
      { testPoint: 'TP6', condition: 'unpowered', unit: 'Ω', access: 'pad', nominal: Infinity, halfWidth: 0, span: 2e7 },
    ],
    hypotheses: [
      { id: 'none', part: 'none', mode: 'none', fault: 'no fault', prior: 0.05, predictions: [5, 9000, Infinity] },
      { id: 'R1/open', part: 'R1', mode: 'open', fault: 'open', prior: 0.5, predictions: [NaN, Infinity, Infinity] },
      { id: 'U1/bridge/2-3', part: 'U1', mode: 'bridge', fault: 'solder bridge', prior: 0.45, predictions: [0.1, 9000, Infinity], variants: [[10.5, 9000, Infinity], [NaN, Infinity, Infinity]] },
    ],
    faults: [
      { id: 'R1/open', part: 'R1', kind: 'resistor', mode: 'open', fault: 'open', prior: 2 },
      { id: 'U1/bridge/2-3', part: 'U1', kind: 'opamp-dual', mode: 'bridge', fault: 'solder bridge', prior: 1, pins: ['2', '3'] },
    ],
    unsettled: new Map([['R1/open', ['quiescent']]]),
    skippedConditions: [],
  };

  it('round-trips NaN (unpredictable) and Infinity (open circuit)', () => {
    const dir = mkdtempSync(join(tmpdir(), 'voltwalk-dict-'));
    saveDictionary(dir, 'k', hand);
    const back = loadDictionary(dir, 'k', hand.board)!;
    expect(back.hypotheses[1].predictions[0]).toBeNaN();
    expect(back.hypotheses[1].predictions[1]).toBe(Infinity);
    expect(back.unsettled.get('R1/open')).toEqual(['quiescent']);
    expect(back.observables).toEqual(hand.observables);
    expect(back.observables[2].nominal).toBe(Infinity);
    expect(back.faults).toEqual(hand.faults);
    expect(back.hypotheses[2].variants![0]).toEqual([10.5, 9000, Infinity]);
    expect(back.hypotheses[2].variants![1][0]).toBeNaN();
    expect(back.hypotheses[2].variants![1][1]).toBe(Infinity);
    expect(back.hypotheses[1].variants).toBeUndefined();
  });

  it('a truncated or foreign file is ignored, not an error', () => {
    const dir = mkdtempSync(join(tmpdir(), 'voltwalk-dict-'));
    writeFileSync(join(dir, 'k.json'), '{"format": "voltwalk-dictionary/1", "hypotheses": [');
    expect(loadDictionary(dir, 'k', hand.board)).toBeUndefined();
    writeFileSync(join(dir, 'k.json'), JSON.stringify({ format: 'something-else' }));
    expect(loadDictionary(dir, 'k', hand.board)).toBeUndefined();
    // Valid JSON of the right format whose insides are wrong: a prediction that is text, an observable
    // without its unit, one fault too few.
    saveDictionary(dir, 'k', hand);
    const good = JSON.parse(readFileSync(join(dir, 'k.json'), 'utf8'));
    const damaged = (change: (d: typeof good) => void) => {
      const d = structuredClone(good);
      change(d);
      writeFileSync(join(dir, 'k.json'), JSON.stringify(d));
      return loadDictionary(dir, 'k', hand.board);
    };
    expect(damaged(() => {})).toBeDefined();
    expect(damaged((d) => (d.hypotheses[1].predictions[0] = 'five'))).toBeUndefined();
    expect(damaged((d) => delete d.observables[0].unit)).toBeUndefined();
    expect(damaged((d) => d.faults.pop())).toBeUndefined();
    expect(loadDictionary(dir, 'missing', hand.board)).toBeUndefined();
  });
});
