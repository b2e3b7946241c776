import { beforeAll, describe, expect, it } from 'vitest';
import type { Circuit, OpAmp } from '../../../src/circuit/netlist.js';
import { opampSpiceLines } from '../../../src/circuit/index.js';
import { outputNoise } from '../../../src/circuit/analysis/index.js';
import { runNgspice, startNgspice } from '../../reference/ngspice.js';

/**
 * Cross-check of the noise analysis against ngspice's `.noise` (ngspice 45 via eecircuit-engine).
 * ngspice has no op-amp noise, so the op-amp's en and in are given to it as resistor noise:
 *   en: a resistor of en²/(4kT) in series with the + input (its DC drop is nil: the input draws
 *       only through rin = 10¹² Ω);
 *   in: a resistor of 4kT/in² across a 0 V source, whose current (the resistor's noise current)
 *       a current-controlled current source copies into the input node, so it loads nothing.
 * ngspice analyses at 27 °C (300.15 K).
 */
const K = 1.380649e-23;
const T = 300.15;
const EN = 15e-9; // TL072, ST datasheet
const IN = 1e-12; // larger than a TL072's so that it shows (test value)

const amp: OpAmp = {
  kind: 'opamp',
  name: 'u1',
  nodes: ['inp', 'inn', 'out', 'vp', 'vn'],
  params: { gain: 2e5, rout: 100, rin: 1e12, headroom: 1.5, iq: 1.4e-3, vos: 0, en: EN, in: IN },
};

// Non-inverting amplifier, gain 1 + Rf/Rg = 11, fed through Rs, with Cf across Rf (pole at 15.9 kHz).
const circuit: Circuit = {
  title: 'non-inverting amplifier',
  models: {},
  elements: [
    { kind: 'vsource', name: 'vp', nodes: ['vp', '0'], dc: 12 },
    { kind: 'vsource', name: 'vn', nodes: ['vn', '0'], dc: -12 },
    { kind: 'vsource', name: 'vin', nodes: ['in', '0'], dc: 0, ac: { mag: 1, phaseDeg: 0 } },
    { kind: 'resistor', name: 'rs', nodes: ['in', 'inp'], value: 10_000 },
    { kind: 'resistor', name: 'rg', nodes: ['inn', '0'], value: 1_000 },
    { kind: 'resistor', name: 'rf', nodes: ['out', 'inn'], value: 10_000 },
    { kind: 'capacitor', name: 'cf', nodes: ['out', 'inn'], value: 1e-9 },
    amp,
  ],
};

function spiceNetlist(): string {
  const inner: OpAmp = { ...amp, nodes: ['inp_en', ...amp.nodes.slice(1)] as OpAmp['nodes'] };
  return [
    'noise cross-check',
    'vp vp 0 12',
    'vn vn 0 -12',
    'vin in 0 dc 0 ac 1',
    'rs in inp 10k',
    'rg inn 0 1k',
    'rf out inn 10k',
    'cf out inn 1n',
    ...opampSpiceLines(inner),
    `ren inp inp_en ${(EN * EN) / (4 * K * T)}`,
    // current noise into each input
    `rinp xp 0 ${(4 * K * T) / (IN * IN)}`,
    'vinp xp 0 0',
    'finp 0 inp vinp 1',
    `rinn xn 0 ${(4 * K * T) / (IN * IN)}`,
    'vinn xn 0 0',
    'finn 0 inn vinn 1',
    '.end',
  ].join('\n');
}

describe('noise against ngspice .noise', () => {
  beforeAll(startNgspice, 120_000);

  it('agrees within 0.1 dB in density across the band and in the integrated total', async () => {
    const { result } = await runNgspice(spiceNetlist(), '.noise v(out) vin dec 10 20 20k', 'Noise Spectral Density Curves');
    if (result.dataType !== 'real') throw new Error('expected a real noise result');
    const freq = result.data.find((v) => v.name === 'frequency')!.values;
    const onoise = result.data.find((v) => v.name === 'onoise_spectrum')!.values;
    const ours = outputNoise(circuit, { output: 'out', pointsPerDecade: 10, frequencies: freq });
    ours.spectrum.forEach(({ density }, i) => expect(Math.abs(20 * Math.log10(density / onoise[i]))).toBeLessThan(0.1));
    // the pole of Rf·Cf (15.9 kHz) shows in both: the top of the band is below the bottom
    expect(onoise[onoise.length - 1]).toBeLessThan(0.9 * onoise[0]);
    // integrate ngspice's spectrum on its own grid (power law per interval, as ours does)
    let area = 0;
    for (let i = 1; i < freq.length; i++) {
      const [f1, f2, y1, y2] = [freq[i - 1], freq[i], onoise[i - 1] ** 2, onoise[i] ** 2];
      const a = Math.log(y2 / y1) / Math.log(f2 / f1);
      area += Math.abs(a + 1) < 1e-9 ? y1 * f1 * Math.log(f2 / f1) : (y2 * f2 - y1 * f1) / (a + 1);
    }
    expect(Math.abs(20 * Math.log10(ours.rms / Math.sqrt(area)))).toBeLessThan(0.1);
    // every source matters here: en·11, in+·Rs·11, Rs·11, in−·Rf, Rf, Rg·10
    expect(ours.contributions.filter((c) => c.rms > 0.05 * ours.rms).length).toBeGreaterThanOrEqual(4);
  }, 120_000);
});
