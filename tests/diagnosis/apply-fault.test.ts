import { describe, expect, it } from 'vitest';
import { validateBoard } from '../../src/board/validate.js';
import { applyFault, REVERSED_ELECTROLYTIC_OHMS } from '../../src/diagnosis/apply-fault.js';
import { faultsFor } from '../../src/diagnosis/faults-for.js';
import { OPEN_OHMS, SHORT_OHMS } from '../../src/diagnosis/board-edits.js';
import type { Fault } from '../../src/diagnosis/fault.js';
import { tinyBoard } from './tiny-board.js';

const byId = (faults: Fault[], id: string) => {
  const f = faults.find((x) => x.id === id);
  if (!f) throw new Error(`no fault ${id} in ${faults.map((x) => x.id).join(' ')}`);
  return f;
};
const partOf = (board: ReturnType<typeof tinyBoard>, ref: string) => board.parts.find((p) => p.ref === ref)!;
const added = (before: ReturnType<typeof tinyBoard>, after: ReturnType<typeof tinyBoard>) => after.parts.slice(before.parts.length);

describe('fault transforms on a tiny board', () => {
  const board = tinyBoard();
  const faults = faultsFor(board);

  it('a reversed diode swaps its anode and cathode nets', () => {
    const out = applyFault(board, byId(faults, 'D1/reversed'));
    expect(partOf(out, 'D1').pins).toEqual({ A: 'clamp', K: 'div' });
    expect(partOf(board, 'D1').pins).toEqual({ A: 'div', K: 'clamp' }); // the original is untouched
  });

  it('an open resistor has one pin on a net of its own, tied back only through an open-circuit resistance', () => {
    const out = applyFault(board, byId(faults, 'R1/open'));
    const r1 = partOf(out, 'R1');
    expect(r1.pins['1']).toBe('+12v');
    expect(r1.pins['2']).not.toBe('div');
    const [tie] = added(board, out);
    expect(tie.value).toBe(OPEN_OHMS);
    expect(Object.values(tie.pins).sort()).toEqual([r1.pins['2'], 'div'].sort());
  });

  it('a solder bridge joins the two neighbouring pins\' nets through a near-zero resistance', () => {
    const f = byId(faults, 'Q1/bridge/B-C');
    const out = applyFault(board, f);
    const [blob] = added(board, out);
    expect(blob.value).toBe(SHORT_OHMS);
    expect(Object.values(blob.pins).sort()).toEqual(['base', 'led-k']);
  });

  it('U1 pins 3 and 4 are DIP neighbours, so a bridge between them is a candidate', () => {
    expect(faults.some((f) => f.id === 'U1/bridge/3-4')).toBe(true);
    // Pins 1 and 2 share the net "out": bridging them changes nothing, so it is not listed.
    expect(faults.some((f) => f.id === 'U1/bridge/1-2')).toBe(false);
  });

  it('a dual op-amp fitted rotated puts chip pin k in hole k+4', () => {
    const out = applyFault(board, byId(faults, 'U1/rotated'));
    const u1 = partOf(out, 'U1');
    const was = partOf(board, 'U1').pins;
    for (let k = 1; k <= 8; k++) expect(u1.pins[String(k)]).toBe(was[String(((k + 3) % 8) + 1)]);
    expect(u1.pins['8']).toBe(was['4']); // V+ pin now on −12 V
  });

  it('a 2N3904 (E-B-C) fitted backwards swaps collector and emitter; an E-C-B type swaps base and collector', () => {
    // Pinouts: 2N3904 E-B-C, BC547 C-B-E (datasheets, REFERENCES.md); 2SC1815 E-C-B (from memory).
    const back = partOf(applyFault(board, byId(faults, 'Q1/reversed')), 'Q1').pins;
    expect(back).toEqual({ C: 'gnd', B: 'base', E: 'led-k' });
    const ecb = partOf(applyFault(board, byId(faults, 'Q1/other-pinout/ECB')), 'Q1').pins;
    expect(ecb).toEqual({ C: 'base', B: 'led-k', E: 'gnd' });
    // A C-B-E type in an E-B-C place is the same swap as fitting backwards: not listed twice.
    expect(faults.some((f) => f.id === 'Q1/other-pinout/CBE')).toBe(false);
  });

  it('an electrolytic fitted backwards is reversed and leaks', () => {
    const out = applyFault(board, byId(faults, 'C1/reversed'));
    expect(partOf(out, 'C1').pins).toEqual({ '+': 'gnd', '-': '+12v' });
    expect(added(board, out)[0].value).toBe(REVERSED_ELECTROLYTIC_OHMS);
  });

  it('a missing rail is gone from the supplies; a reversed cable swaps the rails', () => {
    const missing = applyFault(board, byId(faults, 'J1/rail-missing/neg12'));
    expect(missing.rails.map((r) => r.id)).toEqual(['pos12']);
    const reversed = applyFault(board, byId(faults, 'J1/rails-reversed'));
    expect(reversed.rails.map((r) => r.volts)).toEqual([-12, 12]);
  });

  it('a stuck output moves the amplifier inputs onto the supply pins', () => {
    const high = partOf(applyFault(board, byId(faults, 'U1/output-stuck-high/a')), 'U1').pins;
    expect([high['3'], high['2']]).toEqual(['+12v', '-12v']);
  });

  it('every faulty board is still a valid board file (a fault may leave a net with one pin on it)', () => {
    for (const f of faults) {
      const { problems } = validateBoard(applyFault(board, f), 'faulty');
      expect(problems.filter((p) => p.code !== 'board.dangling-net'), f.id).toEqual([]);
    }
  });
});

describe('candidate faults and priors', () => {
  const board = tinyBoard();
  const faults = faultsFor(board);

  it('ids are unique and every prior is positive', () => {
    expect(new Set(faults.map((f) => f.id)).size).toBe(faults.length);
    expect(faults.every((f) => f.prior > 0)).toBe(true);
  });

  it("the board's faultPriors override a mode, and a zero removes it", () => {
    const tuned = faultsFor({ ...board, faultPriors: { reversed: 10, 'resistor.short': 0 } });
    expect(byId(tuned, 'D1/reversed').prior).toBe(10);
    expect(tuned.some((f) => f.id === 'R1/short')).toBe(false);
    expect(byId(tuned, 'D1/short').prior).toBe(byId(faults, 'D1/short').prior);
  });

  it('misread values of a resistor share one weight', () => {
    const misreads = faults.filter((f) => f.part === 'R1' && f.mode === 'wrong-value');
    const total = misreads.reduce((a, f) => a + f.prior, 0);
    expect(total).toBeCloseTo(1, 12);
  });
});
