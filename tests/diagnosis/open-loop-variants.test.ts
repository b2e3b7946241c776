import { describe, expect, it } from 'vitest';
import { validateBoard } from '../../src/board/validate.js';
import { buildDictionary } from '../../src/diagnosis/index.js';
import type { Board, BoardInput } from '../../src/schemas/board.js';
import { TINY_BOARD_INPUT } from './tiny-board.js';

/**
 * The tiny test board with its second amplifier made a non-inverting stage of gain 5.7 (R6 from the
 * output to the − input, R7 from there to ground) whose + input sits at ground, so its output rests
 * near 0 V. Invented for this test.
 */
function feedbackBoard(): Board {
  const input = structuredClone(TINY_BOARD_INPUT) as BoardInput & { parts: Array<Record<string, unknown>> };
  input.parts = input.parts.map((p) => (p.ref === 'U1' ? { ...p, pins: { ...(p.pins as object), '6': 'fb' } } : p));
  input.parts.push(
    { ref: 'R6', kind: 'resistor', value: '47k', tolerance: 0.01, pins: { '1': 'outb', '2': 'fb' }, where: 'right of U1, upper' },
    { ref: 'R7', kind: 'resistor', value: '10k', tolerance: 0.01, pins: { '1': 'fb', '2': 'gnd' }, where: 'right of U1, lower' },
  );
  input.testPoints = [...input.testPoints, { id: 'TP7', label: 'stage B out', net: 'outb', quantity: 'voltage', probe: 'U1 pin 7', access: 'ic-pin' }];
  input.stages = [{ ...input.stages[0], parts: [...input.stages[0].parts, 'R6', 'R7'] }];
  const { board, problems } = validateBoard(input, 'feedback-board');
  if (!board) throw new Error(problems.map((p) => `${p.path}: ${p.message}`).join('\n'));
  return board;
}

describe('offset variants for faults that leave an amplifier open loop', () => {
  const dict = buildDictionary(feedbackBoard());
  const out = dict.observables.findIndex((o) => o.testPoint === 'TP7' && o.condition === 'quiescent');
  const hyp = (id: string) => dict.hypotheses.find((h) => h.id === id)!;

  it('an open feedback resistor, or a shorted one from the − input to ground, predicts the output at either rail', () => {
    // Common practice: with no feedback left (R6 open) or the − input pinned to the + input's level
    // (R7 shorted to ground), the amplifier compares its inputs open loop and its own input offset
    // decides the rail; a TL072 swings to within about 1.5–2 V of its rails (from memory: TL072
    // datasheet, ±13.5 V typical at ±15 V supplies).
    for (const id of ['R6/open', 'R7/short']) {
      const h = hyp(id);
      expect(h.variants, id).toHaveLength(2);
      const ends = h.variants!.map((v) => v[out]).sort((a, b) => a - b);
      expect(ends[0], id).toBeLessThan(-9);
      expect(ends[1], id).toBeGreaterThan(9);
    }
  });

  it('a shorted feedback resistor or an open ground leg leaves a follower: no variants', () => {
    for (const id of ['R6/short', 'R7/open']) expect(hyp(id).variants, id).toBeUndefined();
    // The healthy stage rests near its + input (0 V) times its gain, offset included.
    expect(Math.abs(dict.hypotheses[0].predictions[out])).toBeLessThan(0.1);
  });
});
