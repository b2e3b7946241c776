import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { join } from 'node:path';
import { loadBoard } from '../../src/board/validate.js';
import { bundledBoardFiles } from '../../src/board/bundled.js';
import { testPointsFor } from '../../src/board/lookup.js';
import { measureAll } from '../../src/board/measure.js';
import { buildCircuit } from '../../src/board/build-circuit.js';
import { DEFAULT_OHMMETER, METER_NODE, OPEN_CIRCUIT_OHMS, ohmmeterReading } from '../../src/board/ohmmeter.js';
import { spiceNodeNames, writeNetlist } from '../../src/circuit/spice/index.js';
import { ngspiceOp, startNgspice, REFERENCE } from '../reference/ngspice.js';

const board = loadBoard(join(import.meta.dirname, '../fixtures/boards/small-amp.json'));
const editPart = (ref: string, edit: Record<string, unknown>) => ({
  ...board,
  parts: board.parts.map((p) => (p.ref === ref ? { ...p, ...edit } : p)),
});

// NXP 1N4148 SPICE model (REFERENCES.md) and kT/q at 27 °C, SPICE's nominal temperature (CODATA).
const IS = 4.352e-9;
const N = 1.906;
const RS = 0.6458;
const VT = 0.025865;

/** Diode voltage at a current, from the Shockley law with series resistance. */
const diodeVolts = (i: number) => N * VT * Math.log(i / IS + 1) + RS * i;

/** The meter (Voc behind Rs) into a forward diode, by hand: fixed-point on I = (Voc − Vd(I)) / Rs. */
function meterIntoDiode(): { volts: number; amps: number } {
  const { openCircuitVolts: voc, sourceResistance: rs } = DEFAULT_OHMMETER;
  let i = voc / rs;
  for (let k = 0; k < 100; k++) i = (voc - diodeVolts(i)) / rs;
  return { volts: diodeVolts(i), amps: i };
}

describe('simulated ohmmeter (unpowered)', () => {
  const readings = measureAll(board, 'unpowered');

  it('reads only the resistance test points', () => {
    expect(Object.keys(readings)).toEqual(['TP5', 'TP7', 'TP8']);
  });
  it('a resistor alone reads its value, whatever the meter\'s figures (ratiometric: V/I)', () => {
    expect(readings.TP8).toBeCloseTo(4700, 2);
    const other = measureAll(board, 'unpowered', { ohmmeter: { openCircuitVolts: 0.5, sourceResistance: 1e3 } });
    expect(other.TP8).toBeCloseTo(4700, 2);
  });
  it('a forward-biased silicon diode reads V/I at the meter\'s current, as hand arithmetic gives', () => {
    const hand = meterIntoDiode();
    // ≈0.486 V at ≈84 µA with 3 V behind 30 kΩ.
    expect(hand.volts).toBeCloseTo(0.486, 3);
    expect(readings.TP7).toBeCloseTo(hand.volts / hand.amps, -1);
    expect(Math.abs(readings.TP7 / (hand.volts / hand.amps) - 1)).toBeLessThan(1e-3);
    // Common practice, from memory: a silicon junction forward-biased on a 20 kΩ resistance range
    // shows a few kΩ (not its forward voltage, which is what the diode-test range shows).
    expect(readings.TP7).toBeGreaterThan(2e3);
    expect(readings.TP7).toBeLessThan(10e3);
  });
  it('the same diode reads differently with a stiffer meter, as on a real meter\'s other range', () => {
    const lowRange = measureAll(board, 'unpowered', { ohmmeter: { openCircuitVolts: 3, sourceResistance: 3e3 } });
    // More current, a little more voltage: a lower reading (V/I falls as I rises on a junction).
    expect(lowRange.TP7).toBeLessThan(readings.TP7 / 5);
  });
  it('a reverse-biased diode, and a net only capacitors reach, read as overload (Infinity)', () => {
    // The model's saturation current (4.35 nA) at 3 V would be ≈690 MΩ: beyond a handheld's top range.
    const reversed = editPart('D3', { pins: { A: 'gnd', K: 'probe' } });
    expect(measureAll(reversed, 'unpowered').TP7).toBe(Infinity);
    // +12v: C1 and C3 (open at DC, read at their charged end point) and D1 reverse-biased.
    expect(readings.TP5).toBe(Infinity);
  });
  it('ohmmeterReading: V/I, overload at and beyond OPEN_CIRCUIT_OHMS', () => {
    const m = { openCircuitVolts: 3, sourceResistance: 30e3 };
    // 10 kΩ by hand: I = 3 / 40k = 75 µA, V = 0.75 V.
    expect(ohmmeterReading(3, 0.75, 0, m)).toBeCloseTo(10e3, 6);
    expect(ohmmeterReading(3, 3, 0, m)).toBe(Infinity);
    // V/I = R for a resistor R: V = 3 R / (R + 30k).
    const at = (r: number) => ohmmeterReading(3, (3 * r) / (r + 30e3), 0, m);
    expect(at(OPEN_CIRCUIT_OHMS / 2)).toBeCloseTo(OPEN_CIRCUIT_OHMS / 2, -3);
    expect(at(OPEN_CIRCUIT_OHMS * 2)).toBe(Infinity);
  });
});

describe('powered readings against hand arithmetic', () => {
  it('dc-in: divider, buffer, inverter and load, as the schematic gives', () => {
    const r = measureAll(board, 'dc-in');
    expect(Object.keys(r)).toEqual(['TP1', 'TP2', 'TP3', 'TP4', 'TP6']);
    const vin = (1 * 100e3) / (100e3 + 1e3); // 1 V behind 1 kΩ into R1 = 100 kΩ
    expect(r.TP3).toBeCloseTo(vin, 4); // a follower; open-loop gain 2e5 leaves 5 µV
    expect(r.TP4).toBeCloseTo(-2.2 * vin, 4); // -R3/R2
    // Level at 0: wiper on the inverter output; Load on: R4 into the 20 mΩ contact and R5.
    expect(r.TP6).toBeCloseTo((r.TP4 * (10e3 + 0.02)) / (4.7e3 + 0.02 + 10e3), 6);
  });
  it('quiescent rails: 12 V less D1\'s drop at the two amplifiers\' quiescent current', () => {
    const r = measureAll(board, 'quiescent');
    // TL072: 1.4 mA typical per amplifier (ST datasheet); the rest of the board draws next to nothing at rest.
    const drop = diodeVolts(2 * 1.4e-3);
    expect(r.TP1).toBeCloseTo(12 - drop, 3);
    expect(r.TP2).toBeCloseTo(-12 + drop, 3);
    expect(Math.abs(r.TP3)).toBeLessThan(1e-6);
  });
});

describe(`buildCircuit against the reference simulator (${REFERENCE})`, () => {
  beforeAll(async () => {
    await startNgspice();
  });
  afterAll(() => undefined);

  it('dc-in: every node within 1 mV of ngspice', async () => {
    const { circuit, netNode } = buildCircuit(board, 'dc-in');
    const ours = measureAll(board, 'dc-in');
    const ref = await ngspiceOp(writeNetlist(circuit));
    const names = spiceNodeNames(circuit);
    for (const tp of board.testPoints.filter((t) => t.quantity === 'voltage')) {
      const v = ref.nodes[names.get(netNode(tp.net))!];
      expect(v, tp.id).toBeDefined();
      expect(Math.abs(ours[tp.id] - v), tp.id).toBeLessThan(1e-3);
    }
  });
  it('the ohmmeter on the diode: same reading from ngspice\'s node voltages', async () => {
    const { circuit, netNode } = buildCircuit(board, 'unpowered', { ohmmeter: { testPoint: 'TP7' } });
    const ref = await ngspiceOp(writeNetlist(circuit));
    const names = spiceNodeNames(circuit);
    const at = (node: string) => ref.nodes[names.get(node)!];
    const reading = ohmmeterReading(at(METER_NODE), at(netNode('probe')), 0, DEFAULT_OHMMETER);
    expect(Math.abs(reading / measureAll(board, 'unpowered').TP7 - 1)).toBeLessThan(2e-3);
  });
  // Bundled boards hold transistors, LEDs and Schottky diodes the meter's current reaches unpowered;
  // the harder of these need measureAll's fallback solver options.
  for (const file of bundledBoardFiles()) {
    it(`every resistance test point of ${file.split('/').pop()} reads as ngspice's node voltages give`, async () => {
      const b = loadBoard(file);
      const unpowered = b.conditions.find((c) => !c.powered)!;
      const ours = measureAll(b, unpowered.id);
      for (const tp of testPointsFor(b, unpowered)) {
        const { circuit, netNode } = buildCircuit(b, unpowered.id, { ohmmeter: { testPoint: tp.id } });
        const ref = await ngspiceOp(writeNetlist(circuit));
        const names = spiceNodeNames(circuit);
        const at = (node: string) => (node === '0' ? 0 : ref.nodes[names.get(node)!]);
        const theirs = ohmmeterReading(at(METER_NODE), at(netNode(tp.net)), at(netNode(tp.refNet ?? b.ground)), DEFAULT_OHMMETER);
        if (theirs === Infinity) expect(ours[tp.id], tp.id).toBe(Infinity);
        else expect(Math.abs(ours[tp.id] / theirs - 1), `${tp.id}: ours ${ours[tp.id]}, ngspice ${theirs}`).toBeLessThan(1e-3);
      }
    });
  }
});
