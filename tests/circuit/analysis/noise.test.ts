import { describe, expect, it } from 'vitest';
import type { Circuit, OpAmpParams } from '../../../src/circuit/netlist.js';
import { solveAC } from '../../../src/circuit/index.js';
import { outputNoise, thermalNoiseDensity, toDbu } from '../../../src/circuit/analysis/index.js';

// Boltzmann constant, SI 2019 (exact).
const K = 1.380649e-23;
const T27 = 300.15;
const sqrt4kTR = (r: number, t = T27) => Math.sqrt(4 * K * t * r);

/** An op-amp close to ideal, with the noise figures under test (the en default is the TL072's 15 nV/√Hz, ST datasheet). */
const amp = (over: Partial<OpAmpParams> = {}): OpAmpParams => ({
  gain: 1e7,
  rout: 1,
  rin: 1e12,
  headroom: 1.5,
  iq: 0,
  vos: 0,
  en: 15e-9,
  in: 0,
  ...over,
});

const rails = [
  { kind: 'vsource' as const, name: 'vp', nodes: ['vp', '0'] as [string, string], dc: 12 },
  { kind: 'vsource' as const, name: 'vn', nodes: ['vn', '0'] as [string, string], dc: -12 },
];

describe('thermal noise', () => {
  it('is 4.07 nV/√Hz for 1 kΩ at 300 K (Johnson–Nyquist, REFERENCES.md)', () => {
    expect(thermalNoiseDensity(1000, 300)).toBeCloseTo(4.07e-9, 11);
  });

  it('of a lone resistor is √(4kTR) at the output and √(4kTR·B) over the band', () => {
    const c: Circuit = {
      title: 'one resistor',
      temperatureC: 26.85, // 300 K
      models: {},
      elements: [
        { kind: 'vsource', name: 'v1', nodes: ['a', '0'], dc: 0 },
        { kind: 'resistor', name: 'r1', nodes: ['a', 'out'], value: 1000 },
        { kind: 'resistor', name: 'rload', nodes: ['out', '0'], value: 1e15 },
      ],
    };
    const n = outputNoise(c, { output: 'out', include: (e) => e.name === 'r1' });
    expect(n.density).toBeCloseTo(4.07e-9, 11);
    // white noise over 20 Hz–20 kHz: density·√19 980 Hz
    expect(n.rms / (sqrt4kTR(1000, 300) * Math.sqrt(19_980))).toBeCloseTo(1, 3);
    // dBu: 0 dBu = 0.7746 V rms
    expect(toDbu(0.7746)).toBeCloseTo(0, 9);
    expect(n.dBu).toBeCloseTo(20 * Math.log10(n.rms / 0.7746), 9);
  });
});

describe('RC low-pass', () => {
  const R = 10_000;
  const C = 15.9e-9; // fc = 1/(2πRC) ≈ 1.0009 kHz
  const fc = 1 / (2 * Math.PI * R * C);
  const rc: Circuit = {
    title: 'rc low-pass',
    models: {},
    elements: [
      { kind: 'vsource', name: 'vin', nodes: ['in', '0'], dc: 0, ac: { mag: 1, phaseDeg: 0 } },
      { kind: 'resistor', name: 'r1', nodes: ['in', 'out'], value: R },
      { kind: 'capacitor', name: 'c1', nodes: ['out', '0'], value: C },
    ],
  };

  it('is 3 dB down at 1/(2πRC) (textbook) in the signal and in the noise', () => {
    expect(solveAC(rc, fc).nodes.out.mag).toBeCloseTo(Math.SQRT1_2, 6);
    const low = outputNoise(rc, { output: 'out', frequency: 1 });
    const corner = outputNoise(rc, { output: 'out', frequency: fc });
    expect(low.density).toBeCloseTo(sqrt4kTR(R), 13);
    expect(corner.density / low.density).toBeCloseTo(Math.SQRT1_2, 6);
  });

  it('integrates to 4kTR·fc·(atan(f2/fc) − atan(f1/fc)) over the band (textbook integral of a one-pole spectrum)', () => {
    const n = outputNoise(rc, { output: 'out', pointsPerDecade: 40 });
    const exact = Math.sqrt(4 * K * T27 * R * fc * (Math.atan(20_000 / fc) - Math.atan(20 / fc)));
    expect(Math.abs(20 * Math.log10(n.rms / exact))).toBeLessThan(0.01);
  });
});

describe('inverting amplifier', () => {
  // Rin 10 kΩ, Rf 100 kΩ: signal gain −Rf/Rin = −10, noise gain 1 + Rf/Rin = 11 (textbook).
  const Rin = 10_000;
  const Rf = 100_000;
  const circuit = (params: OpAmpParams): Circuit => ({
    title: 'inverting amplifier',
    models: {},
    elements: [
      ...rails,
      { kind: 'vsource', name: 'vin', nodes: ['in', '0'], dc: 0, ac: { mag: 1, phaseDeg: 0 } },
      { kind: 'resistor', name: 'rin', nodes: ['in', 'inv'], value: Rin },
      { kind: 'resistor', name: 'rf', nodes: ['inv', 'out'], value: Rf },
      { kind: 'opamp', name: 'u1', nodes: ['0', 'inv', 'out', 'vp', 'vn'], params },
    ],
  });

  it('has signal gain −Rf/Rin', () => {
    const ac = solveAC(circuit(amp()), 1000);
    expect(ac.nodes.out.mag).toBeCloseTo(10, 4);
    expect(Math.abs(Math.abs(ac.nodes.out.phaseDeg) - 180)).toBeLessThan(0.01);
  });

  it('multiplies the op-amp voltage noise by the noise gain 1 + Rf/Rin and each resistor by its own gain', () => {
    const n = outputNoise(circuit(amp({ in: 1e-12 })), { output: 'out' });
    const by = (s: string) => n.contributions.find((c) => c.source === s)!.density;
    expect(by('u1 en') / 15e-9).toBeCloseTo(11, 4);
    expect(by('rin') / (sqrt4kTR(Rin) * (Rf / Rin))).toBeCloseTo(1, 5);
    expect(by('rf') / sqrt4kTR(Rf)).toBeCloseTo(1, 5);
    // current noise into the − input flows through Rf: in·Rf; the + input is grounded: nothing
    expect(by('u1 in-') / (1e-12 * Rf)).toBeCloseTo(1, 5);
    expect(by('u1 in+')).toBeLessThan(1e-15);
    const total = Math.sqrt((15e-9 * 11) ** 2 + (sqrt4kTR(Rin) * 10) ** 2 + sqrt4kTR(Rf) ** 2 + (1e-12 * Rf) ** 2);
    expect(n.density / total).toBeCloseTo(1, 5);
    expect(n.contributions[0].source).toBe('u1 en'); // largest first
  });
});
