/**
 * The Wenlow Nib board (trees/boards/wenlow-nib.json), the second bundled kit, built differently from
 * the Tamp: a transistor shunt attenuator, a half-wave rectifier, a negative-going detector, a bypass
 * switch and one output LED. It loads, maps only the roles it has, every condition solves, and the
 * readings agree with hand analysis stage by stage and with ngspice node by node.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { BOARDS_DIR } from '../../src/paths.js';
import { loadBoard, measureAll, partValue } from '../../src/board/index.js';
import { startNgspice, REFERENCE } from '../reference/ngspice.js';
import { deviceLaws, matchesNgspice, roleKindsFit, settingOf, withinRatings } from './bundled-checks.js';

const board = loadBoard(join(BOARDS_DIR, 'wenlow-nib.json'));
const R = (ref: string) => partValue(board, ref);
const setting = (condition: string, ref: string) => settingOf(board, condition, ref);
const { params, diodeVolts, vbe } = deviceLaws(board);

// TL072 supply current, 1.4 mA typical per amplifier (ST datasheet; REFERENCES.md). Two duals: 4 amplifiers.
const TL072_IQ = 1.4e-3;
const AMPLIFIERS = 4;

const readings: Record<string, Record<string, number>> = {};
beforeAll(() => {
  for (const c of board.conditions) readings[c.id] = measureAll(board, c.id);
});
const at = (condition: string) => readings[condition];
const injected = (condition: string) => board.conditions.find((c) => c.id === condition)!.signal?.volts ?? 0;

describe('wenlow-nib: the file', () => {
  it('loads with its own id and conditions', () => {
    expect(board.id).toBe('wenlow-nib');
    expect(board.conditions.map((c) => c.id)).toEqual(['unpowered', 'quiescent', 'dc-low', 'dc-high', 'dc-high-threshold-max', 'dc-high-bypass']);
  });

  it('leaves unmapped the roles a kit without those controls cannot fill', () => {
    // No sidechain filter, no makeup stage, no input-gain, attack or ratio knob on this kit.
    expect(board.roles.stages['sidechain-filter']).toBeUndefined();
    expect(board.roles.stages['makeup-stage']).toBeUndefined();
    for (const role of ['input-gain-pot', 'attack-pot', 'ratio-pot', 'sidechain-hp-switch', 'makeup-gain-pot'] as const) {
      expect(board.roles.parts[role], role).toBeUndefined();
    }
    expect(board.roles.conditions['dc-injection-max-ratio']).toBeUndefined();
    // …and maps the ones every tree starts from.
    expect(board.roles.conditions.unpowered).toBe('unpowered');
    expect(board.roles.conditions.quiescent).toBe('quiescent');
    expect(board.roles.testPoints['pos-rail-resistance']).toBeDefined();
  });

  it('maps part roles to parts of a kind that can fill them', () => roleKindsFit(board));

  it('lists every part in exactly one stage', () => {
    const staged = board.stages.flatMap((s) => s.parts);
    expect(new Set(staged).size).toBe(staged.length);
    expect([...staged].sort()).toEqual(board.parts.map((p) => p.ref).sort());
  });
});

describe('wenlow-nib: every condition solves', () => {
  it('gives a reading at every test point that applies', () => {
    for (const c of board.conditions) {
      const expected = board.testPoints.filter((t) => (c.powered ? t.quantity === 'voltage' : t.quantity === 'resistance')).map((t) => t.id);
      expect(Object.keys(at(c.id)).sort(), c.id).toEqual(expected.sort());
      for (const [tp, v] of Object.entries(at(c.id))) {
        if (c.powered) expect(Number.isFinite(v), `${c.id} ${tp}`).toBe(true);
        else expect(v, `${c.id} ${tp}`).toBeGreaterThan(0);
      }
    }
  });

  it('keeps every part inside its power rating and every lit LED at 2–15 mA', () => {
    for (const c of board.conditions.filter((x) => x.powered)) withinRatings(board, c.id);
  });
});

describe('wenlow-nib: hand analysis, stage by stage', () => {
  it('power entry: each rail is 12 V less a 1N4001 drop at the quiescent draw', () => {
    const q = at('quiescent');
    // +12 V feeds four amplifiers and the threshold chain R15 + RV2 (the 13 µA into R17 is left out).
    const iPos = AMPLIFIERS * TL072_IQ + q.TP1 / (R('R15') + R('RV2'));
    // −12 V feeds the four amplifiers only.
    const iNeg = AMPLIFIERS * TL072_IQ;
    // 5.86 mA through the board's 1N4001 model: ≈0.664 V, so the rail is ≈11.34 V. Tolerance 2 mV.
    expect(Math.abs(q.TP1 - (12 - diodeVolts('1N4001', iPos)))).toBeLessThan(2e-3);
    expect(Math.abs(q.TP2 - (-12 + diodeVolts('1N4001', iNeg)))).toBeLessThan(2e-3);
    // Common practice: silicon rectifiers leave the rails about 0.6–0.8 V inside ±12 V.
    expect(12 - q.TP1).toBeGreaterThan(0.6);
    expect(12 - q.TP1).toBeLessThan(0.8);
  });

  it('quiescent: op-amp outputs and the control line sit near 0 V (common practice)', () => {
    const q = at('quiescent');
    for (const tp of ['TP7', 'TP10', 'TP11', 'TP12', 'TP14', 'TP19']) expect(Math.abs(q[tp]), tp).toBeLessThan(5e-3);
  });

  it('input buffer: non-inverting gain 1 + R3/R2', () => {
    for (const cond of ['dc-low', 'dc-high']) {
      // 0.50 V × (1 + 10k/10k) = 1.00 V. Tolerance 1 mV (open-loop gain 2·10⁵; R1 only loads the bench supply).
      expect(Math.abs(at(cond).TP7 - injected(cond) * (1 + R('R3') / R('R2'))), cond).toBeLessThan(1e-3);
    }
  });

  it('VCA, shunt transistor off: R4/R5 divide by 48 and U1B multiplies by 1 + R8/R7 = 48', () => {
    const r = at('dc-low');
    const att = (r.TP7 * R('R5')) / (R('R4') + R('R5'));
    // 1.00 V × 1k/48k = 20.8 mV. Tolerance 0.5 %: Q1's leakage and base current are left out.
    expect(Math.abs(r.TP8 / att - 1)).toBeLessThan(0.005);
    expect(Math.abs(r.TP10 / (att * (1 + R('R8') / R('R7'))) - 1)).toBeLessThan(0.005);
  });

  it('VCA, shunt transistor driven: the attenuator node drops, U1B still multiplies it by 48', () => {
    for (const cond of ['dc-high', 'dc-high-threshold-max', 'dc-low']) {
      const r = at(cond);
      expect(Math.abs(r.TP10 - r.TP8 * (1 + R('R8') / R('R7'))), cond).toBeLessThan(2e-3);
    }
    const off = at('dc-low').TP8 / at('dc-low').TP7;
    const strong = at('dc-high').TP8 / at('dc-high').TP7;
    const weak = at('dc-high-threshold-max').TP8 / at('dc-high-threshold-max').TP7;
    // More base current, more shunting: gain reduction at a DC level, deeper with the lower threshold.
    expect(strong).toBeLessThan(weak);
    expect(weak).toBeLessThan(off);
    expect(20 * Math.log10(strong / off)).toBeLessThan(-3);
    // The control current into Q1's base: (control line − base)/R6, positive when the line is above ≈0.6 V.
    expect((at('dc-high').TP14 - at('dc-high').TP9) / R('R6')).toBeGreaterThan(50e-6);
  });

  it('rectifier: hw = −input × R11/R10 for a positive input', () => {
    for (const cond of ['dc-low', 'dc-high']) {
      const r = at(cond);
      // 4.00 V in → −4.00 V. Tolerance 1 mV.
      expect(Math.abs(r.TP11 - (-r.TP7 * R('R11')) / R('R10')), cond).toBeLessThan(1e-3);
    }
  });

  it('detector: −(|hw| − D5 drop) × Rrel/(R13 + Rrel), Rrel = (R14 + RV1 track) ∥ R16 into the virtual ground', () => {
    for (const cond of ['dc-low', 'dc-high']) {
      const r = at(cond);
      const release = R('R14') + setting(cond, 'RV1') * R('RV1');
      const rRel = (release * R('R16')) / (release + R('R16'));
      let det = r.TP11;
      for (let k = 0; k < 30; k++) det = -((-r.TP11 - diodeVolts('1N4148', -det / rRel)) * rRel) / (R('R13') + rRel);
      // dc-high: −(4.00 − 0.457) × 74.8k/77.0k ≈ −3.44 V. Tolerance 2 mV.
      expect(Math.abs(r.TP12 - det), cond).toBeLessThan(2e-3);
    }
  });

  it('threshold: RV2 wiper from its Thevenin source, loaded by R17 into a virtual ground', () => {
    for (const cond of ['quiescent', 'dc-high-threshold-max']) {
      const r = at(cond);
      const x = setting(cond, 'RV2');
      const track = R('RV2');
      const open = (r.TP1 * x * track) / (track + R('R15'));
      const source = (x * track * ((1 - x) * track + R('R15'))) / (track + R('R15'));
      // Noon: 11.34 × 5k/43k = 1.318 V behind 4.42 kΩ, 1.262 V into 100 kΩ. Tolerance 1 mV.
      expect(Math.abs(r.TP13 - (open * R('R17')) / (R('R17') + source)), cond).toBeLessThan(1e-3);
    }
  });

  it('control line: (R18/R16)·(|detector| − threshold) above threshold, 0 below', () => {
    for (const cond of ['dc-low', 'dc-high', 'dc-high-threshold-max']) {
      const r = at(cond);
      const over = -r.TP12 - r.TP13;
      const line = over > 0 ? (R('R18') / R('R16')) * over : 0;
      // dc-high: 2.2 × (3.442 − 1.259) = 4.80 V. Tolerance 3 mV (D7 leakage, finite gain).
      expect(Math.abs(r.TP14 - line), cond).toBeLessThan(3e-3);
    }
  });

  it('gain-reduction LED: current = (line − Vbe − Ib·R20)/R21, read as the emitter voltage over R21', () => {
    for (const cond of ['dc-high', 'dc-high-threshold-max']) {
      const r = at(cond);
      const bf = params('2N3904').BF;
      let i = 1e-3;
      for (let k = 0; k < 30; k++) i = (r.TP14 - vbe('2N3904', i) - (i / bf) * R('R20')) / R('R21');
      // dc-high: (4.80 − 0.68 − 0.29)/680 Ω ≈ 5.6 mA. Tolerance 3 %: no Early effect in the hand sum.
      expect(Math.abs(r.TP16 / R('R21') / i - 1), cond).toBeLessThan(0.03);
    }
    expect(Math.abs(at('dc-low').TP16)).toBeLessThan(1e-3);
  });

  it('bypass switch: out follows the input buffer; the sidechain keeps working', () => {
    const r = at('dc-high-bypass');
    expect(Math.abs(r.TP19 - r.TP7)).toBeLessThan(1e-3);
    expect(Math.abs(r.TP14 - at('dc-high').TP14)).toBeLessThan(0.05);
    expect(Math.abs(at('dc-high').TP19 - at('dc-high').TP10)).toBeLessThan(1e-3);
  });

  it('output LED: dark below ≈0.6 V of base drive; lit, its current shows across R25', () => {
    for (const cond of ['dc-low', 'dc-high']) {
      const r = at(cond);
      // Q3 off: the base is the R23/R24 divider of the output. 1.71 V × 10k/32k = 0.534 V. Tolerance 2 mV.
      expect(Math.abs(r.TP17 - (r.TP19 * R('R24')) / (R('R23') + R('R24'))), cond).toBeLessThan(2e-3);
    }
    for (const cond of ['dc-high-threshold-max', 'dc-high-bypass']) {
      const r = at(cond);
      // LED current from the drop across R25: ≈ (11.30 − 2.22)/2.2k ≈ 4.1 mA, a visible, safe
      // indicator current (common practice 2–15 mA).
      const i = (r.TP1 - r.TP18) / R('R25');
      expect(i, cond).toBeGreaterThan(2e-3);
      expect(i, cond).toBeLessThan(15e-3);
      // Anode = LED drop at that current (board's GRN3MM model) + Q3's saturation voltage, under 0.3 V
      // for a 2N3904 driven this hard (MCC datasheet: VCE(sat) ≤ 0.2 V at 10 mA, IB = 1 mA).
      const vce = r.TP18 - diodeVolts('GRN3MM', i);
      expect(vce, cond).toBeGreaterThan(0);
      expect(vce, cond).toBeLessThan(0.3);
    }
    // Dark: no current through R25, its LED end sits at the rail. At 1.71 V out (dc-high) Q3's base is at
    // 0.534 V and it leaks a few µA (Is·e^(Vbe/Vt) ≈ 6.7 fA × e^20.6 ≈ 6 µA): still dark to the eye.
    for (const cond of ['quiescent', 'dc-low']) expect(Math.abs(at(cond).TP1 - at(cond).TP18), cond).toBeLessThan(1e-3);
    expect((at('dc-high').TP1 - at('dc-high').TP18) / R('R25')).toBeLessThan(20e-6);
  });

  it('unpowered: +12 V reads below R15 + RV2; −12 V reaches only capacitors and a reversed D2', () => {
    const u = at('unpowered');
    expect(u.TP5).toBeGreaterThan(1e3);
    expect(u.TP5).toBeLessThan(R('R15') + R('RV2'));
    // The op-amps are not part of the unpowered circuit (build-circuit's rule), so nothing else joins −12 V to ground.
    expect(u.TP6).toBe(Infinity);
  });
});

describe(`wenlow-nib: every powered condition against ${REFERENCE}`, () => {
  beforeAll(startNgspice, 20_000);
  for (const c of board.conditions.filter((x) => x.powered)) {
    it(`${c.id}: every voltage test point within 1 mV of ngspice, rails held at the solved values`, async () => {
      await matchesNgspice(board, c.id);
    });
  }
});
