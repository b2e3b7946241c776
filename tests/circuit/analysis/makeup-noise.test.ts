import { describe, expect, it } from 'vitest';
import { makeupNoise } from '../../../src/circuit/analysis/index.js';
import { smallBoard } from './fixtures/small-board.js';

// Boltzmann constant, SI 2019 (exact); SPICE's default 27 °C.
const K = 1.380649e-23;
const T = 300.15;
const EN = 15e-9; // TL072 input voltage noise, ST datasheet (the built-in model's figure)

describe('makeup stage noise at a pot position', () => {
  const board = smallBoard();

  it("scales the op-amp's voltage noise by the noise gain 1 + Rf/Rin (inverting amplifier, textbook)", () => {
    for (const position of [0, 0.5, 1]) {
      const n = makeupNoise(board, { position });
      const rf = 10_000 + 25_000 * position; // R32 + the pot's track from pin 1 to the wiper
      const en = n.contributions.find((c) => c.source === 'u2a en')!;
      // to 1 part in 10⁴: the open-loop gain of 2·10⁵ leaves a loop-gain error of about 1/(Aβ)
      expect(en.density / (EN * (1 + rf / 10_000))).toBeCloseTo(1, 3);
      const r31 = n.contributions.find((c) => c.source === 'r31')!;
      expect(r31.density / (Math.sqrt(4 * K * T * 10_000) * (rf / 10_000))).toBeCloseTo(1, 4);
      expect(n).toMatchObject({ pot: 'RV6', position, testPoint: 'TP7', node: 'mkout', condition: 'quiescent' });
    }
  });

  it('rises with the makeup gain and reports µV rms and dBu over 20 Hz–20 kHz', () => {
    const low = makeupNoise(board, { position: 0 });
    const high = makeupNoise(board, { position: 1 });
    expect(high.rms).toBeGreaterThan(low.rms);
    expect(high.rmsMicrovolts).toBeCloseTo(high.rms * 1e6, 12);
    expect(high.dBu).toBeCloseTo(20 * Math.log10(high.rms / 0.7746), 9);
    // a white spectrum here (no capacitors in the stage): rms = density·√(19 980 Hz)
    expect(high.rms / (high.density * Math.sqrt(19_980))).toBeCloseTo(1, 4);
  });

  it('counts upstream parts only when asked', () => {
    const stage = makeupNoise(board, { position: 0.5 });
    const whole = makeupNoise(board, { position: 0.5, wholeBoard: true });
    // U1B buffers ground into the makeup stage's input resistor: upstream, not in the stage
    expect(stage.contributions.some((c) => c.element === 'u1b')).toBe(false);
    expect(whole.contributions.find((c) => c.source === 'u1b en')!.density).toBeGreaterThan(0);
    expect(whole.rms).toBeGreaterThan(stage.rms);
  });

  it('refuses a position off the track and a board without the roles', () => {
    expect(() => makeupNoise(board, { position: 1.5 })).toThrow(/from 0 to 1/);
    const bare = smallBoard((b) => ({ ...b, roles: { parts: {} } }));
    expect(() => makeupNoise(bare, { position: 0.5 })).toThrow(/makeup-gain-pot/);
  });
});
