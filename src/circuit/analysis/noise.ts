import type { Circuit, Element, OpAmp } from '../netlist.js';
import { GROUND } from '../netlist.js';
import { DBU_REFERENCE_VOLTS, toDbu } from '../../units/decibels.js';
import { createAcSolver, potResistances, solveDC, type AcSolver, type DcSolution } from '../index.js';

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
 * Method: each source gets its own small-signal solver (the circuit with that source as the only
 * excitation, linearised once) and is solved at every frequency of the grid. An adjoint solve
 * would give every transfer at once but needs the transposed system, which the AC solver does not
 * expose; for a board of a few dozen sources this costs well under a second. The output density is the
 * root-sum-square of each source's density times the magnitude of its transfer to the output; the
 * rms over a band integrates density² over frequency on a log grid, each interval taken as a power
 * law through its end points (exact for white noise and for the f^-2 tail of a single pole).
 * k = 1.380649e-23 J/K (SI, exact); T from the circuit (27 °C, SPICE's default, when absent).
 * 0 dBu = 0.7746 V rms (√0.6 V: 1 mW into 600 Ω).
 */

export const BOLTZMANN = 1.380649e-23;
export { DBU_REFERENCE_VOLTS, toDbu };

export interface NoiseOptions {
  /** Node whose voltage is the output (lower-case netlist name). */
  output: string;
  /** Node the output is measured against; ground by default. */
  reference?: string;
  /** Spot frequency for `density`, Hz; default 1 kHz. */
  frequency?: number;
  /** More spot frequencies, Hz: their total densities come back in `spectrum`. */
  frequencies?: number[];
  /** Band integrated for `rms`, Hz; default 20 Hz–20 kHz. */
  band?: [number, number];
  /** Frequency points per decade of the band; default 10 (each interval is integrated as a power law). */
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
  /** Total output density at each of `options.frequencies`. */
  spectrum: Array<{ frequency: number; density: number }>;
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

/** √(4kTR) in V/√Hz. */
export function thermalNoiseDensity(ohms: number, temperatureK: number): number {
  return Math.sqrt(4 * BOLTZMANN * temperatureK * ohms);
}

export function outputNoise(circuit: Circuit, options: NoiseOptions): NoiseResult {
  const frequency = options.frequency ?? 1000;
  const band = options.band ?? [20, 20000];
  const ppd = options.pointsPerDecade ?? 10;
  if (!(band[0] > 0 && band[1] > band[0])) throw new RangeError(`noise band must be 0 < low < high, got ${band[0]}–${band[1]} Hz`);
  const temperatureK = (circuit.temperatureC ?? 27) + 273.15;
  const op = options.op ?? solveDC(circuit);
  const out = options.output.toLowerCase();
  const ref = (options.reference ?? GROUND).toLowerCase();
  const sources = noiseSources(circuit, temperatureK, options.include ?? (() => true));

  const steps = Math.max(2, Math.ceil(Math.log10(band[1] / band[0]) * ppd));
  const grid = Array.from({ length: steps + 1 }, (_, i) => band[0] * (band[1] / band[0]) ** (i / steps));
  const spectrumSquares = (options.frequencies ?? []).map(() => 0);
  const contributions: NoiseContribution[] = sources.map((s) => {
    const ac = createAcSolver(s.circuit, { op: augmented(op, s.circuit) });
    const gain = (f: number) => transfer(ac, f, out, ref);
    const spot = s.density * gain(frequency);
    let integral = 0;
    let prev = (s.density * gain(grid[0])) ** 2;
    for (let i = 1; i < grid.length; i++) {
      const cur = (s.density * gain(grid[i])) ** 2;
      integral += powerLawArea(grid[i - 1], prev, grid[i], cur);
      prev = cur;
    }
    (options.frequencies ?? []).forEach((f, i) => (spectrumSquares[i] += (s.density * gain(f)) ** 2));
    return { source: s.source, element: s.element, density: spot, rms: Math.sqrt(integral) };
  });
  const spectrum = (options.frequencies ?? []).map((frequency, i) => ({ frequency, density: Math.sqrt(spectrumSquares[i]) }));
  contributions.sort((a, b) => b.rms - a.rms);
  const density = Math.sqrt(contributions.reduce((acc, c) => acc + c.density ** 2, 0));
  const rms = Math.sqrt(contributions.reduce((acc, c) => acc + c.rms ** 2, 0));
  return { frequency, density, spectrum, band, rms, rmsMicrovolts: rms * 1e6, dBu: toDbu(rms), temperatureK, contributions };
}

/** ∫ y df from f1 to f2 for y = y1·(f/f1)^a through (f1, y1) and (f2, y2). */
function powerLawArea(f1: number, y1: number, f2: number, y2: number): number {
  if (y1 <= 0 || y2 <= 0) return 0.5 * (y1 + y2) * (f2 - f1);
  const a = Math.log(y2 / y1) / Math.log(f2 / f1);
  if (Math.abs(a + 1) < 1e-9) return y1 * f1 * Math.log(f2 / f1);
  return (y2 * f2 - y1 * f1) / (a + 1);
}

function transfer(ac: AcSolver, f: number, out: string, ref: string): number {
  const nodes = ac.solve(f).nodes;
  const a = nodes[out] ?? { re: 0, im: 0 };
  const b = nodes[ref] ?? { re: 0, im: 0 };
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
