import type { Circuit, Element, OpAmp } from '../netlist.js';
import { GROUND } from '../netlist.js';
import { potResistances, solveAC, solveDC, type DcSolution } from '../index.js';

/**
 * Output noise of a circuit from its small-signal AC solution.
 *
 * Sources, all uncorrelated:
 * - every resistor and each pot segment: thermal (Johnson–Nyquist) noise, a current source across
 *   the part of density √(4kT/R) A/√Hz (equivalently √(4kTR) V/√Hz in series);
 * - every op-amp: its input voltage noise `en` in series with the + input, and its input current
 *   noise `in` from each input to ground. Values come from the op-amp model (src/board/defaults.ts:
 *   TL072 15 nV/√Hz per the ST datasheet; the board's `opampModels[].en/in` override).
 * Junction shot noise and 1/f noise are not modelled: the stages this serves are op-amps and resistors.
 *
 * Method: one AC solve per source per frequency (the circuit has a few dozen sources; an adjoint
 * solve would need a transposed system the AC solver does not expose). The output density is the
 * root-sum-square of each source's density times the magnitude of its transfer to the output; the
 * rms over a band integrates density² over frequency on a log grid (trapezoid in ln f).
 * k = 1.380649e-23 J/K (SI, exact); T from the circuit (27 °C, SPICE's default, when absent).
 * 0 dBu = 0.7746 V rms (√0.6 V: 1 mW into 600 Ω).
 */

export const BOLTZMANN = 1.380649e-23;
export const DBU_REFERENCE_VOLTS = 0.7746;

export interface NoiseOptions {
  /** Node whose voltage is the output (lower-case netlist name). */
  output: string;
  /** Node the output is measured against; ground by default. */
  reference?: string;
  /** Spot frequency for `density`, Hz; default 1 kHz. */
  frequency?: number;
  /** Band integrated for `rms`, Hz; default 20 Hz–20 kHz. */
  band?: [number, number];
  /** Frequency points per decade of the band; default 20. */
  pointsPerDecade?: number;
  /** Operating point, if already solved. */
  op?: DcSolution;
  /** Only these elements contribute (e.g. one stage's parts); all by default. */
  include?: (element: Element) => boolean;
}

export interface NoiseContribution {
  /** Element name and which of its sources: "r12", "rv3 a-w", "u2b en", "u2b in+", "u2b in-". */
  source: string;
  element: string;
  /** Output density at the spot frequency, V/√Hz. */
  density: number;
  /** Output rms over the band, V. */
  rms: number;
}

export interface NoiseResult {
  frequency: number;
  /** Output noise density at `frequency`, V/√Hz. */
  density: number;
  band: [number, number];
  /** Output noise over the band, V rms. */
  rms: number;
  rmsMicrovolts: number;
  dBu: number;
  temperatureK: number;
  /** Largest first. */
  contributions: NoiseContribution[];
}

interface NoiseSource {
  source: string;
  element: string;
  /** Density of the source itself (A/√Hz for a current, V/√Hz for a voltage). */
  density: number;
  /** The circuit with this source as the only AC excitation (unit magnitude). */
  circuit: Circuit;
}

export function toDbu(volts: number): number {
  return 20 * Math.log10(volts / DBU_REFERENCE_VOLTS);
}

/** √(4kTR) in V/√Hz. */
export function thermalNoiseDensity(ohms: number, temperatureK: number): number {
  return Math.sqrt(4 * BOLTZMANN * temperatureK * ohms);
}

export function outputNoise(circuit: Circuit, options: NoiseOptions): NoiseResult {
  const frequency = options.frequency ?? 1000;
  const band = options.band ?? [20, 20000];
  const ppd = options.pointsPerDecade ?? 20;
  if (!(band[0] > 0 && band[1] > band[0])) throw new RangeError(`noise band must be 0 < low < high, got ${band[0]}–${band[1]} Hz`);
  const temperatureK = (circuit.temperatureC ?? 27) + 273.15;
  const op = options.op ?? solveDC(circuit);
  const out = options.output.toLowerCase();
  const ref = (options.reference ?? GROUND).toLowerCase();
  const sources = noiseSources(circuit, temperatureK, options.include ?? (() => true));

  const steps = Math.max(2, Math.ceil(Math.log10(band[1] / band[0]) * ppd));
  const grid = Array.from({ length: steps + 1 }, (_, i) => band[0] * (band[1] / band[0]) ** (i / steps));
  const contributions: NoiseContribution[] = sources.map((s) => {
    const gain = (f: number) => transfer(s, f, op, out, ref);
    const spot = s.density * gain(frequency);
    // ∫ d² df = ∫ d² f d(ln f): trapezoid on the log grid.
    let integral = 0;
    let prev = (s.density * gain(grid[0])) ** 2 * grid[0];
    for (let i = 1; i < grid.length; i++) {
      const cur = (s.density * gain(grid[i])) ** 2 * grid[i];
      integral += 0.5 * (prev + cur) * Math.log(grid[i] / grid[i - 1]);
      prev = cur;
    }
    return { source: s.source, element: s.element, density: spot, rms: Math.sqrt(integral) };
  });
  contributions.sort((a, b) => b.rms - a.rms);
  const density = Math.sqrt(contributions.reduce((acc, c) => acc + c.density ** 2, 0));
  const rms = Math.sqrt(contributions.reduce((acc, c) => acc + c.rms ** 2, 0));
  return { frequency, density, band, rms, rmsMicrovolts: rms * 1e6, dBu: toDbu(rms), temperatureK, contributions };
}

function transfer(s: NoiseSource, f: number, op: DcSolution, out: string, ref: string): number {
  const ac = solveAC(s.circuit, f, { op: augmented(op, s.circuit) });
  const v = (n: string) => (n === GROUND ? { re: 0, im: 0 } : (ac.nodes[n] ?? { re: 0, im: 0 }));
  const a = v(out);
  const b = v(ref);
  return Math.hypot(a.re - b.re, a.im - b.im);
}

/** The operating point with the helper nodes added by an en source (they sit at their input's voltage). */
const augmentedCache = new WeakMap<Circuit, DcSolution>();
function augmented(op: DcSolution, circuit: Circuit): DcSolution {
  const extra = circuit.elements.find((e) => e.kind === 'vsource' && e.name.startsWith(NOISE_PREFIX));
  if (!extra) return op;
  let cached = augmentedCache.get(circuit);
  if (!cached) {
    const [inner, outer] = extra.nodes;
    cached = {
      ...op,
      nodes: { ...op.nodes, [inner]: op.nodes[outer] ?? 0 },
      sourceCurrents: { ...op.sourceCurrents, [extra.name]: 0 },
    };
    augmentedCache.set(circuit, cached);
  }
  return cached;
}

const NOISE_PREFIX = 'noise~';

/** Every independent source silenced for AC; the noise source is added on top. */
function silenced(circuit: Circuit): Element[] {
  return circuit.elements.map((e) => ((e.kind === 'vsource' || e.kind === 'isource') && e.ac ? { ...e, ac: undefined } : e));
}

function withCurrent(circuit: Circuit, name: string, from: string, to: string): Circuit {
  const unit = { kind: 'isource' as const, name: `${NOISE_PREFIX}${name}`, nodes: [from, to] as [string, string], dc: 0, ac: { mag: 1, phaseDeg: 0 } };
  return { ...circuit, elements: [...silenced(circuit), unit] };
}

function withSeriesVoltage(circuit: Circuit, amp: OpAmp): Circuit {
  const inner = `${NOISE_PREFIX}${amp.name}+`;
  const elements = silenced(circuit).map((e) =>
    e.name === amp.name && e.kind === 'opamp' ? { ...e, nodes: [inner, ...e.nodes.slice(1)] as OpAmp['nodes'] } : e,
  );
  elements.push({ kind: 'vsource', name: `${NOISE_PREFIX}${amp.name}-en`, nodes: [inner, amp.nodes[0]], dc: 0, ac: { mag: 1, phaseDeg: 0 } });
  return { ...circuit, elements };
}

function noiseSources(circuit: Circuit, temperatureK: number, include: (e: Element) => boolean): NoiseSource[] {
  const fourKT = 4 * BOLTZMANN * temperatureK;
  const out: NoiseSource[] = [];
  for (const e of circuit.elements) {
    if (!include(e)) continue;
    if (e.kind === 'resistor' && e.value > 0) {
      out.push({ source: e.name, element: e.name, density: Math.sqrt(fourKT / e.value), circuit: withCurrent(circuit, e.name, e.nodes[0], e.nodes[1]) });
    } else if (e.kind === 'pot') {
      const [raw, rwb] = potResistances(e);
      const [a, w, b] = e.nodes;
      if (raw > 0) out.push({ source: `${e.name} a-w`, element: e.name, density: Math.sqrt(fourKT / raw), circuit: withCurrent(circuit, `${e.name}-aw`, a, w) });
      if (rwb > 0) out.push({ source: `${e.name} w-b`, element: e.name, density: Math.sqrt(fourKT / rwb), circuit: withCurrent(circuit, `${e.name}-wb`, w, b) });
    } else if (e.kind === 'opamp') {
      if (e.params.en > 0) out.push({ source: `${e.name} en`, element: e.name, density: e.params.en, circuit: withSeriesVoltage(circuit, e) });
      if (e.params.in > 0) {
        out.push({ source: `${e.name} in+`, element: e.name, density: e.params.in, circuit: withCurrent(circuit, `${e.name}-in+`, e.nodes[0], GROUND) });
        out.push({ source: `${e.name} in-`, element: e.name, density: e.params.in, circuit: withCurrent(circuit, `${e.name}-in-`, e.nodes[1], GROUND) });
      }
    }
  }
  return out;
}
