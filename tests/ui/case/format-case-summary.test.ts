import { describe, expect, it } from 'vitest';
import { firstSentence, groupSuspects, nextQuestion, POWERED_CAUTION, type CaseSummary } from '../../../src/ui/case/case-summary.js';
import { DEMO_BOARD_FILE, loadBoard, testPointsFor } from '../../../src/board/index.js';
import type { WalkStep } from '../../../src/engine/step-view.js';
import { formatCaseSummary } from '../../../src/ui/case/format-case-summary.js';

// Demo numbers: a made-up case, only to check how it is written for the chat.
const base: CaseSummary = {
  board: { id: 'demo', name: 'Demo' },
  tree: { id: 'dark-meter', symptom: 'The level meter stays dark' },
  wording: 'technician',
  finished: false,
  substitutions: [],
  readings: [],
  answers: [],
  skipped: [],
  suspects: [],
  unexplained: [],
};

describe('case summary for the chat', () => {
  it('writes a rail reading and its band with the figures that keep the band apart', () => {
    const reading = { testPoint: 'TP1', label: '+12 V rail', condition: 'Powered', text: '', unit: 'V' as const, min: 11.74, max: 11.8, nominal: 11.77 };
    const text = formatCaseSummary({ ...base, readings: [{ ...reading, value: 11.77, outcome: 'in-band' }, { ...reading, testPoint: 'TP2', value: 11.2, outcome: 'low' }] }, 'text');
    expect(text).toContain('- TP1 +12 V rail, Powered: 11.77 V ok [11.74 V to 11.80 V]');
    expect(text).toContain('- TP2 +12 V rail, Powered: 11.2 V LOW [11.74 V to 11.80 V]');
  });

  it('names a reading no modelled fault explains', () => {
    expect(formatCaseSummary({ ...base, unexplained: ['TP1 = 11.2 V fits no single modelled fault.'] }, 'text')).toContain('Note: TP1 = 11.2 V fits no single modelled fault.');
  });

  it('quotes a check by the sentence that names it, not a short preamble', () => {
    expect(firstSentence("Power off. Check the meter LEDs' orientation: flat edge = cathode. Then go on.")).toBe("Check the meter LEDs' orientation: flat edge = cathode.");
    expect(firstSentence('Set the supply to 11.77 V and check the current. Then go on.')).toBe('Set the supply to 11.77 V and check the current.');
    expect(firstSentence('Looks fine?')).toBe('Looks fine?');
  });
});

describe('suspect groups in the case', () => {
  // Demo numbers: a made-up ranking on the demo board, only to check how groups are carried.
  const suspect = (part: string, fault: string, group: number, probability: number) => ({ part, fault, group, probability, why: `why ${part}`, mode: fault, id: `${part}/${fault}` });
  const shown = [suspect('none', 'no fault', 1, 0.1), suspect('R9', 'open', 2, 0.08), suspect('LED1', 'fitted backwards', 1, 0.02)];
  const labels = ['no fault', 'LED1 fitted backwards', ...Array.from({ length: 10 }, (_, k) => `D${k + 1} fitted backwards`)];
  const groups = [{ group: 1, probability: 0.55, members: labels.map((_, k) => `m${k}`), labels, parts: ['none', 'LED1', 'D1'] }];

  it("takes a group's members and probability from the ranking's whole group, not from the few suspects shown", () => {
    const board = loadBoard(DEMO_BOARD_FILE);
    const [first, second] = groupSuspects(board, shown, groups);
    expect(first).toMatchObject({ rank: 1, faults: labels, probability: 0.55, parts: ['LED1', 'D1'], why: 'why none' });
    expect(first.where).toEqual(['LED1', 'D1'].map((ref) => board.parts.find((p) => p.ref === ref)!.where));
    // A group the ranking did not send (an older result) falls back to the shown members.
    expect(second).toMatchObject({ rank: 2, faults: ['R9 open'], probability: 0.08, parts: ['R9'] });
  });
});

describe('the next reading asked for in the case', () => {
  const board = loadBoard(DEMO_BOARD_FILE);
  const powered = board.conditions.find((c) => c.powered)!;
  const unpowered = board.conditions.find((c) => !c.powered)!;
  const tp = (condition: string) => board.testPoints.find((t) => testPointsFor(board, condition).some((x) => x.id === t.id))!;
  const concluded = (condition: string) => ({ kind: 'conclude', suggestion: { testPoint: tp(condition).id, condition, expectedInformationBits: 1 } }) as unknown as WalkStep;

  it('opens a powered reading with the caution, in the wording of the walk', () => {
    for (const wording of ['technician', 'customer'] as const) {
      const next = nextQuestion(board, concluded(powered.id), wording)!;
      expect(next.caution).toBe(POWERED_CAUTION[wording]);
      expect(next.question.startsWith(POWERED_CAUTION[wording])).toBe(true);
    }
    expect(POWERED_CAUTION.customer).toMatch(/mains/);
    expect(POWERED_CAUTION.customer).toMatch(/±12 V/);
  });

  it('asks for an unpowered reading without it', () => {
    const next = nextQuestion(board, concluded(unpowered.id), 'customer')!;
    expect(next.caution).toBeUndefined();
    expect(next.question).not.toContain(POWERED_CAUTION.customer);
    expect(next.question).toMatch(/^Could you take one more reading\?/);
  });
});
