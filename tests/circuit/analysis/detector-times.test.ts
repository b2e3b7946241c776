import { beforeAll, describe, expect, it } from 'vitest';
import { detectorTimeBand, detectorTimes, LN9 } from '../../../src/circuit/analysis/index.js';
import { smallBoard } from './fixtures/small-board.js';
import { runNgspice, startNgspice } from '../../reference/ngspice.js';

describe('detector time constants from roles', () => {
  const board = smallBoard();

  it('adds the attack resistor to the in-path part of the attack pot and multiplies by C', () => {
    const t = detectorTimes(board, 'quiescent');
    // RV1 wiper tied to pin 1: the path is wiper→pin 3, half of 10 kΩ at mid-rotation; + R5 1 kΩ.
    expect(t.attack.resistance).toBeCloseTo(6_000, 6);
    expect(t.attack.tau).toBeCloseTo(6e-3, 12);
    // 10–90 % of a first-order step is τ·ln 9 (textbook)
    expect(t.attack.riseTime).toBeCloseTo(6e-3 * Math.log(9), 12);
    expect(t.release.resistance).toBeCloseTo(100_000 + 500_000, 3);
  });

  it('follows the knob positions of the condition', () => {
    const t = detectorTimes(board, 'release-max');
    // RV2 at position 0: the whole 1 MΩ track is between wiper (pin 1 end) and pin 3.
    expect(t.release.tau).toBeCloseTo(1.1, 9);
    expect(t.release.parts.find((p) => p.ref === 'RV2')?.position).toBe(0);
  });

  it('gives a time as a band over part tolerances, with the knob at whichever end is fast or slow on this board', () => {
    // R6 100 kΩ (±1 %, the resistor default), RV2 1 MΩ track (±20 %, the pot default), C1 1 µF (±10 %, the
    // capacitor default); 10–90 % = (ΣR)(ΣC)·ln 9, worked by hand.
    const slow = detectorTimeBand(board, 'release', 'slowest');
    expect(slow.nominal).toBeCloseTo(1.1 * Math.log(9), 6); // 2.417 s: RV2's whole track in the path
    expect(slow.min).toBeCloseTo((99e3 + 800e3) * 0.9e-6 * Math.log(9), 6); // 1.778 s
    expect(slow.max).toBeCloseTo((101e3 + 1.2e6) * 1.1e-6 * Math.log(9), 6); // 3.145 s
    const fast = detectorTimeBand(board, 'release', 'fastest');
    expect(fast.nominal).toBeCloseTo(0.1 * Math.log(9), 6); // 0.2197 s: the pot's end adds next to nothing
    expect(fast.min).toBeCloseTo(99e3 * 0.9e-6 * Math.log(9), 6);
    expect(fast.max).toBeCloseTo(101e3 * 1.1e-6 * Math.log(9), 6);
    expect(fast).toMatchObject({ which: 'release', knob: 'fastest', capacitors: ['C1'] });
  });

  it('names the missing role when a board has no detector', () => {
    const bare = smallBoard((b) => ({ ...b, roles: { parts: {} } }));
    expect(() => detectorTimes(bare)).toThrow(/detector-capacitor/);
  });

  it('names the condition when it does not exist', () => {
    expect(() => detectorTimes(board, 'nope')).toThrow(/no condition "nope"/);
  });
});

describe('10–90 % time against ngspice', () => {
  beforeAll(startNgspice, 120_000);

  it('matches the transient step response of the same RC within 1 %', async () => {
    const t = detectorTimes(smallBoard(), 'quiescent').attack;
    const netlist = [
      'rc step',
      'v1 in 0 pulse(0 1 0 1n 1n 1 2)',
      `r1 in out ${t.resistance}`,
      `c1 out 0 ${t.capacitance} ic=0`,
      '.end',
    ].join('\n');
    // Reference: ngspice 45 (eecircuit-engine) transient, step 1/1000 of τ.
    const { result } = await runNgspice(netlist, `.tran ${t.tau / 1000} ${6 * t.tau} 0 ${t.tau / 1000} uic`, 'Transient Analysis');
    if (result.dataType !== 'real') throw new Error('expected a real transient result');
    const time = result.data.find((v) => v.name === 'time')!.values;
    const out = result.data.find((v) => v.name.toLowerCase() === 'v(out)')!.values;
    const crossing = (level: number) => {
      const i = out.findIndex((v) => v >= level);
      return time[i - 1] + ((level - out[i - 1]) / (out[i] - out[i - 1])) * (time[i] - time[i - 1]);
    };
    const rise = crossing(0.9) - crossing(0.1);
    expect(Math.abs(rise / t.riseTime - 1)).toBeLessThan(0.01);
    expect(t.riseTime / t.tau).toBeCloseTo(LN9, 12);
  }, 120_000);
});
