/**
 * The Wenlow Tamp demo board (trees/boards/wenlow-tamp.json): it loads, every condition solves, and
 * the solver's readings agree with hand analysis stage by stage and with ngspice node by node.
 *
 * The hand analysis works one stage at a time, from the part values in the file and the model
 * parameters the file declares, taking the previous stage's reading as its input — the way a bench
 * technician checks a stage. Each tolerance is sized to what the arithmetic beside it leaves out.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { BOARDS_DIR } from '../../src/paths.js';
import { loadBoard, measureAll, partValue } from '../../src/board/index.js';
import { CONDITION_ROLES, PART_ROLES, STAGE_ROLES, TEST_POINT_ROLES } from '../../src/schemas/roles.js';
import { startNgspice, REFERENCE } from '../reference/ngspice.js';
import { VT, deviceLaws, matchesNgspice, roleKindsFit, settingOf, withinRatings } from './bundled-checks.js';

const board = loadBoard(join(BOARDS_DIR, 'wenlow-tamp.json'));
const R = (ref: string) => partValue(board, ref);
const setting = (condition: string, ref: string) => settingOf(board, condition, ref);
const { params, diodeVolts, vbe } = deviceLaws(board);

// TL072 supply current, 1.4 mA typical per amplifier (ST datasheet; REFERENCES.md). Five packages: 4 × 2 + 4 = 12 amplifiers.
const TL072_IQ = 1.4e-3;
const AMPLIFIERS = 12;
// TL072 output swing: about 1.5 V short of each rail (ST datasheet ±13.5 V on ±15 V; REFERENCES.md).
const HEADROOM = 1.5;

const readings: Record<string, Record<string, number>> = {};
beforeAll(() => {
  for (const c of board.conditions) readings[c.id] = measureAll(board, c.id);
});
const at = (condition: string) => readings[condition];

describe('wenlow-tamp: the file', () => {
  it('loads with the id and conditions the trees and docs name', () => {
    expect(board.id).toBe('wenlow-tamp');
    expect(board.conditions.map((c) => c.id)).toEqual([
      'unpowered', 'quiescent', 'dc-below', 'dc-above', 'dc-above-ratio-max', 'dc-above-ratio-min',
      'threshold-min', 'threshold-max', 'sidechain-hp', 'release-min', 'makeup-min', 'makeup-max',
      'input-gain-min', 'input-gain-max',
    ]);
  });

  it('maps every role in the vocabulary: the demo kit has every stage a compressor needs', () => {
    // The Tamp has no bypass switch (the Nib has one); every other role is mapped.
    const absentParts = ['bypass-switch'];
    expect(Object.keys(board.roles.stages).sort()).toEqual(Object.keys(STAGE_ROLES).sort());
    expect(Object.keys(board.roles.testPoints).sort()).toEqual(Object.keys(TEST_POINT_ROLES).sort());
    expect(Object.keys(board.roles.parts).sort()).toEqual(Object.keys(PART_ROLES).filter((r) => !absentParts.includes(r)).sort());
    expect(Object.keys(board.roles.conditions).sort()).toEqual(Object.keys(CONDITION_ROLES).sort());
  });

  it('maps part roles to parts of a kind that can fill them', () => roleKindsFit(board));

  it('lists every part in exactly one stage', () => {
    const staged = board.stages.flatMap((s) => s.parts);
    expect(new Set(staged).size).toBe(staged.length);
    expect([...staged].sort()).toEqual(board.parts.map((p) => p.ref).sort());
  });
});

describe('wenlow-tamp: every condition solves', () => {
  it('gives a finite reading at every test point that applies', () => {
    for (const c of board.conditions) {
      const r = at(c.id);
      const expected = board.testPoints.filter((t) => (c.powered ? t.quantity === 'voltage' : t.quantity === 'resistance')).map((t) => t.id);
      expect(Object.keys(r).sort(), c.id).toEqual(expected.sort());
      for (const [tp, v] of Object.entries(r)) expect(Number.isFinite(v), `${c.id} ${tp}`).toBe(true);
    }
  });

  it('keeps every powered reading between the rails', () => {
    for (const c of board.conditions.filter((x) => x.powered)) {
      for (const [tp, v] of Object.entries(at(c.id))) {
        expect(v, `${c.id} ${tp}`).toBeLessThanOrEqual(at(c.id).TP1 + 1e-6);
        expect(v, `${c.id} ${tp}`).toBeGreaterThanOrEqual(at(c.id).TP2 - 1e-6);
      }
    }
  });

  it('keeps every part inside its power rating and every lit LED at 2–15 mA', () => {
    for (const c of board.conditions.filter((x) => x.powered)) {
      withinRatings(board, c.id);
    }
  });
});

describe('wenlow-tamp: hand analysis, stage by stage', () => {
  it('power entry: each rail is 12 V less a 1N5817 drop at the quiescent draw', () => {
    const q = at('quiescent');
    // Quiescent draw, +12 V: twelve TL072 amplifiers, the VCA's collector loads (tail current plus
    // the 2 × 6.5 V / 370 kΩ into R11–R14) and the meter ladder R35…R39.
    const tail = (q.TP11 - q.TP2) / R('R8');
    const ladder = q.TP1 / ['R35', 'R36', 'R37', 'R38', 'R39'].reduce((s, r) => s + R(r), 0);
    const collectorSide = (2 * q.TP12) / (R('R13') + R('R14'));
    const iPos = AMPLIFIERS * TL072_IQ + tail + collectorSide + ladder;
    // −12 V: twelve amplifiers, the tail current through R8, the tail base divider R10, the threshold chain R23 + RV4.
    const iNeg = AMPLIFIERS * TL072_IQ + tail + (q.TP10 - q.TP2) / R('R10') + (0 - q.TP2) / (R('R23') + R('RV4'));
    // Rail = 12 V − Vd(I), Vd from the board's 1N5817 model. Tolerance 3 mV: the hand sum leaves
    // out currents under 10 µA (base currents, op-amp input paths), worth well under 1 mV of drop.
    expect(q.TP1).toBeCloseTo(12 - diodeVolts('1N5817', iPos), 2);
    expect(Math.abs(q.TP1 - (12 - diodeVolts('1N5817', iPos)))).toBeLessThan(3e-3);
    expect(Math.abs(q.TP2 - (-12 + diodeVolts('1N5817', iNeg)))).toBeLessThan(3e-3);
    // The same rail at the IC pin: nothing in series between C1 and U1 pin 8.
    expect(q.TP3).toBe(q.TP1);
    // Common practice: a healthy rail after Schottky protection sits a few tenths of a volt inside ±12 V.
    expect(q.TP1).toBeGreaterThan(11.6);
    expect(q.TP2).toBeLessThan(-11.6);
  });

  it('quiescent: op-amp outputs sit near 0 V (common practice: a few mV at rest)', () => {
    const q = at('quiescent');
    for (const tp of ['TP8', 'TP14', 'TP16', 'TP17', 'TP19', 'TP20', 'TP25']) expect(Math.abs(q[tp]), tp).toBeLessThan(5e-3);
  });

  it('input stage: inverting gain −(R2 + RV1 track)/R1 on the injected level', () => {
    for (const [cond, vin] of [['dc-above', 1.0], ['dc-below', 0.3], ['input-gain-min', 1.0], ['input-gain-max', 1.0]] as const) {
      // RV1 is wired as a variable resistor: pin 1 to wiper = position × 50 kΩ (linear track).
      const gain = (R('R2') + setting(cond, 'RV1') * R('RV1')) / R('R1');
      // 1.00 V × (18k + 25k)/22k = 1.9545 V, inverted. Tolerance 1 mV: open-loop gain 2·10⁵ leaves ~10 µV.
      expect(Math.abs(at(cond).TP8 - -vin * gain), cond).toBeLessThan(1e-3);
    }
  });

  it('VCA tail: Q3 base from the R9/R10 divider less its base current, tail current = (Ve − V−)/R8', () => {
    const q = at('quiescent');
    // cv = 0 V at rest: Thevenin of R9/R10 = V−/2 behind 5 kΩ; Ib = Ie/(β+1) with β = BF = 200 (the board's model).
    const bf = params('2N3904').BF;
    let ie = 1e-3;
    let vb = 0;
    for (let k = 0; k < 20; k++) {
      vb = (q.TP2 * R('R9')) / (R('R9') + R('R10')) - (ie / (bf + 1)) * ((R('R9') * R('R10')) / (R('R9') + R('R10')));
      ie = (vb - vbe('2N3904', ie) - q.TP2) / R('R8');
    }
    // ≈ −5.91 V at the base, ≈ 1.02 mA. Tolerance 10 mV / 2 %: no Early effect or RB in the hand sum.
    expect(Math.abs(q.TP10 - vb)).toBeLessThan(10e-3);
    expect((q.TP11 - q.TP2) / R('R8')).toBeCloseTo(ie, 4);
    expect(Math.abs((q.TP11 - q.TP2) / R('R8') / ie - 1)).toBeLessThan(0.02);
  });

  it('VCA: differential pair output from its tail current and input (finite β and Early effect included)', () => {
    for (const cond of ['dc-above-ratio-min', 'dc-above', 'dc-above-ratio-max', 'threshold-min']) {
      const hand = vcaOutput(at(cond));
      // Textbook long-tailed pair: Ic1/Ic2 = exp(vd/Vt)·(1 + Vce1/VAF)/(1 + Vce2/VAF), vd = base divider
      // R4/(R3 + R4) less the base-current drops; the collectors feed a difference amplifier of gain R12/R11.
      // Tolerance 1 %: the hand sum takes the emitters at −0.65 V and ignores the base-width change with current.
      expect(Math.abs(at(cond).TP14 / hand - 1), cond).toBeLessThan(0.01);
    }
  });

  it('VCA: gain follows the tail current (gm = Ic/2Vt), so gain reduction shows as a DC level change', () => {
    const open = at('dc-above-ratio-min');
    for (const cond of ['dc-above', 'dc-above-ratio-max', 'threshold-min']) {
      const r = at(cond);
      const currentRatio = (r.TP11 - r.TP2) / (open.TP11 - open.TP2);
      const gainRatio = r.TP14 / r.TP8 / (open.TP14 / open.TP8);
      // First-order law only. Tolerance 8 %: the Early effect (the collectors rise by up to 4 V as the
      // tail current falls) and the base-current drops move the ratio by about 5 % over a 3:1 range of
      // tail current; the check above includes both and holds to 1 %.
      expect(Math.abs(gainRatio / currentRatio - 1), cond).toBeLessThan(0.08);
      expect(gainRatio, cond).toBeLessThan(0.9);
    }
    // No gain reduction below threshold or with the ratio at minimum: the tail stays at its rest current.
    for (const cond of ['dc-below', 'dc-above-ratio-min', 'threshold-max', 'sidechain-hp', 'release-min']) {
      expect(Math.abs(at(cond).TP11 - at('quiescent').TP11), cond).toBeLessThan(2e-3);
    }
  });

  it('sidechain high-pass: flat passes the DC level, high-pass blocks it (C13 is open at DC)', () => {
    expect(at('dc-above').TP15).toBeCloseTo(at('dc-above').TP8, 3);
    expect(Math.abs(at('sidechain-hp').TP15)).toBeLessThan(1e-3);
    expect(Math.abs(at('sidechain-hp').TP16)).toBeLessThan(1e-3);
  });

  it('rectifier: output = |input| (two-op-amp full wave: −(vin + 2·hw) with R19 = R20 = 2·R18)', () => {
    for (const cond of ['dc-below', 'dc-above', 'input-gain-max']) {
      const r = at(cond);
      // sc_in is negative here (the input stage inverts): hw = 0, output = −vin·R20/R19 = |vin|. Tolerance 1 mV.
      expect(Math.abs(r.TP16 - Math.abs(r.TP15)), cond).toBeLessThan(1e-3);
    }
  });

  it('detector: (rectified level − D5 drop) × (R22 + RV3)/(R21 + RV2 + R22 + RV3)', () => {
    for (const cond of ['dc-below', 'dc-above', 'release-min', 'input-gain-max']) {
      const r = at(cond);
      const rAttack = R('R21') + setting(cond, 'RV2') * R('RV2');
      const rRelease = R('R22') + setting(cond, 'RV3') * R('RV3');
      // At DC C14 is open and the follower U3A draws nothing: a divider behind a diode; fixed point on the diode current.
      let det = r.TP16;
      for (let k = 0; k < 30; k++) det = ((r.TP16 - diodeVolts('1N4148', det / rRelease)) * rRelease) / (rAttack + rRelease);
      // dc-above: (1.954 − 0.322) × 522k/548k ≈ 1.555 V. Tolerance 2 mV: no leakage terms in the hand sum.
      expect(Math.abs(r.TP17 - det), cond).toBeLessThan(2e-3);
    }
  });

  it('threshold: RV4 wiper from its Thevenin source loaded by R25 into a virtual ground', () => {
    for (const cond of ['quiescent', 'threshold-min', 'threshold-max']) {
      const r = at(cond);
      const x = setting(cond, 'RV4');
      const track = R('RV4');
      const open = (r.TP2 * (x * track)) / (track + R('R23'));
      const source = ((x * track) * ((1 - x) * track + R('R23'))) / (track + R('R23'));
      const loaded = (open * R('R25')) / (R('R25') + source);
      // Knob at noon: −11.77 × 5k/57k = −1.033 V open, 4.56 kΩ behind it, −0.988 V into 100 kΩ. Tolerance 1 mV.
      expect(Math.abs(r.TP18 - loaded), cond).toBeLessThan(1e-3);
    }
  });

  it('control voltage: knee = −(R26/R24)·(detector + threshold) above threshold, 0 below; cv = ratio × knee × (1 + R27/R28)', () => {
    for (const cond of ['dc-above', 'dc-above-ratio-max', 'dc-above-ratio-min', 'threshold-min', 'dc-below', 'threshold-max']) {
      const r = at(cond);
      const over = r.TP17 + r.TP18; // detector level above the (negative) threshold reference
      const knee = over > 0 ? (-R('R26') / R('R24')) * over : 0;
      // dc-above: −2.2 × (1.555 − 0.987) = −1.25 V; cv = 0.5 × −1.25 × 5.7 = −3.56 V.
      // Tolerance 3 mV: the U3A follower's input and D7's leakage are left out.
      expect(Math.abs(r.TP19 - knee), cond).toBeLessThan(3e-3);
      const cv = setting(cond, 'RV5') * knee * (1 + R('R27') / R('R28'));
      expect(Math.abs(r.TP20 - cv), cond).toBeLessThan(3e-3 * (1 + R('R27') / R('R28')));
    }
  });

  it('gain-reduction LED: current = (−cv − Vbe − Ib·R29)/R30, read as the emitter voltage over R30', () => {
    for (const cond of ['dc-above', 'dc-above-ratio-max', 'threshold-min']) {
      const r = at(cond);
      const bf = params('2N3906').BF;
      let i = 1e-3;
      for (let k = 0; k < 30; k++) i = (-r.TP20 - vbe('2N3906', i) - (i / bf) * R('R29')) / R('R30');
      // dc-above: (3.56 − 0.73 − 0.02)/1k ≈ 2.8 mA. Tolerance 3 %: no Early effect (the 2N3906 model's VAF is low).
      const sensed = -r.TP22 / R('R30');
      expect(Math.abs(sensed / i - 1), cond).toBeLessThan(0.03);
      // A visible, safe LED current (common practice for 3 mm indicator LEDs).
      expect(sensed, cond).toBeGreaterThan(2e-3);
      expect(sensed, cond).toBeLessThan(15e-3);
    }
    expect(Math.abs(at('dc-below').TP22)).toBeLessThan(1e-3);
  });

  it('makeup: −(R32 + RV6 track)/R31 on the VCA output', () => {
    for (const cond of ['makeup-min', 'makeup-max', 'dc-above', 'dc-below']) {
      const r = at(cond);
      const gain = (R('R32') + setting(cond, 'RV6') * R('RV6')) / R('R31');
      // makeup-max: 0.571 V × 35k/10k = 2.00 V. Tolerance 1 mV. The output jack is unloaded: no drop in R33.
      expect(Math.abs(r.TP25 - -r.TP14 * gain), cond).toBeLessThan(1e-3);
      expect(r.TP26, cond).toBeCloseTo(r.TP25, 6);
    }
  });

  it('meter: ladder tap and peak-hold level (output − D8 drop at R34\'s current)', () => {
    for (const cond of ['quiescent', 'dc-above', 'makeup-max']) {
      const r = at(cond);
      const total = ['R35', 'R36', 'R37', 'R38', 'R39'].reduce((s, x) => s + R(x), 0);
      // Top tap: 11.75 × 40.2k/115.2k ≈ 4.10 V. Tolerance 1 mV: comparator inputs draw nothing.
      expect(Math.abs(r.TP24 - (r.TP1 * (total - R('R35'))) / total), cond).toBeLessThan(1e-3);
    }
    for (const cond of ['dc-above', 'makeup-max', 'dc-below']) {
      const r = at(cond);
      let v = r.TP25;
      for (let k = 0; k < 30; k++) v = r.TP25 - diodeVolts('1N4148', v / R('R34'));
      expect(Math.abs(r.TP23 - v), cond).toBeLessThan(2e-3);
    }
  });

  it('unpowered: rail resistances below what the resistor chains alone give (other paths only lower them)', () => {
    const u = at('unpowered');
    const ladder = ['R35', 'R36', 'R37', 'R38', 'R39'].reduce((s, x) => s + R(x), 0);
    expect(u.TP5).toBeGreaterThan(1e3);
    expect(u.TP5).toBeLessThan(ladder);
    // −12 V to ground through R23 and the whole RV4 track: 57 kΩ.
    expect(u.TP6).toBeGreaterThan(1e3);
    expect(u.TP6).toBeLessThan(R('R23') + R('RV4'));
    expect(u.TP7).toBeGreaterThan(1e3);
  });
});

describe(`wenlow-tamp: every powered condition against ${REFERENCE}`, () => {
  beforeAll(startNgspice, 20_000);
  for (const c of board.conditions.filter((x) => x.powered)) {
    it(`${c.id}: every voltage test point within 1 mV of ngspice, rails held at the solved values`, async () => {
      await matchesNgspice(board, c.id);
    });
  }
});

/** Long-tailed pair and difference amplifier, solved by fixed point from the readings around it. */
function vcaOutput(r: Record<string, number>): number {
  const { BF: bf, VAF: vaf, RB: rb } = params('2N3904');
  const alpha = bf / (bf + 1);
  const itail = alpha * ((r.TP11 - r.TP2) / R('R8'));
  const vdiv = (r.TP8 * R('R4')) / (R('R3') + R('R4'));
  const rb1 = (R('R3') * R('R4')) / (R('R3') + R('R4')) + rb;
  const rb2 = R('R5') + rb;
  const vTail = -0.65;
  const vp = r.TP1;
  let c1 = vp / 2, c2 = vp / 2, ib1 = 0, ib2 = 0, out = 0;
  for (let k = 0; k < 60; k++) {
    const vd = vdiv - (ib1 * rb1 - ib2 * rb2);
    const k1 = Math.exp(vd / VT) * (1 + (c1 - vTail) / vaf);
    const k2 = 1 + (c2 - vTail) / vaf;
    const ic1 = (alpha * itail * k1) / (k1 + k2);
    const ic2 = (alpha * itail * k2) / (k1 + k2);
    ib1 = ic1 / bf;
    ib2 = ic2 / bf;
    c2 = (vp / R('R7') - ic2) / (1 / R('R7') + 1 / (R('R13') + R('R14')));
    const v = (c2 * R('R14')) / (R('R13') + R('R14'));
    c1 = (vp / R('R6') - ic1 + v / R('R11')) / (1 / R('R6') + 1 / R('R11'));
    out = v - (R('R12') * (c1 - v)) / R('R11');
  }
  return out;
}
