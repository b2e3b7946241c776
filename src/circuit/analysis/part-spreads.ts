import type { Board, Part } from '../../schemas/board.js';
import { OPAMP_PACKAGES } from '../../board/pins.js';
import { modelNameFor, partTolerance, preparedPart, resolveModel, resolveOpAmp } from '../../board/values.js';
import type { Deviation } from './deviation.js';

/**
 * The production spread of every part on a board that can move a DC reading, as deviations
 * (see deviation.ts). Capacitors and inductors are left out: they do not change a DC operating point.
 *
 * Where each spread comes from, in order of precedence:
 * - resistors and pot tracks: the part's tolerance (board file, else its value text such as "4k7F",
 *   else the kind's default in src/board/defaults.ts); Gaussian, 3σ at the tolerance.
 * - transistor current gain (BF): the board's `models[name].spread.BF`, else the datasheet hFE bin of
 *   a known type below, else ±50 %; uniform over the bin. The bin is taken about its midpoint
 *   (100–300 → ×0.5…×1.5 of the model's BF), so a model whose BF is not the bin's middle keeps
 *   its own nominal and the bin's relative width.
 * - diode, LED saturation current (IS): the board's `spread.IS`, else a forward-voltage spread ±ΔV
 *   turned into IS × exp(∓ΔV / (N·Vt)) (Vt = 25.865 mV at 27 °C, CODATA); uniform in log(IS).
 * - zener breakdown (BV): the board's `spread.BV`, else ±5 %; uniform.
 * - op-amp input offset: ±vosMax of the op-amp model (board `opampModels[].vosMax`, else the built-in
 *   model's), one per amplifier; Gaussian, 3σ at vosMax (for the TL072, 10 mV max → σ 3.3 mV, near
 *   the datasheet's 3 mV typical).
 * Any other parameter named in a board's `spread` is applied as given (uniform, linear).
 */

/** Datasheet hFE bins, min–max, used when a board gives no spread of its own. */
export const HFE_BINS: Record<string, { min: number; max: number; source: string }> = {
  '2N3904': { min: 100, max: 300, source: '2N3904 datasheet (MCC): hFE 100–300 at IC 10 mA, VCE 1 V' },
  // 2N3906: same bin as its complement (from memory: onsemi 2N3906 datasheet, hFE 100–300 at −10 mA).
  '2N3906': { min: 100, max: 300, source: '2N3906 datasheet (onsemi, from memory): hFE 100–300 at IC −10 mA' },
  BC547: { min: 110, max: 800, source: 'BC547 datasheet (Fairchild): hFE 110–800, no group letter' },
  BC547A: { min: 110, max: 220, source: 'BC547 datasheet (Fairchild): group A hFE 110–220' },
  BC547B: { min: 200, max: 450, source: 'BC547 datasheet (Fairchild): group B hFE 200–450' },
  BC547C: { min: 420, max: 800, source: 'BC547 datasheet (Fairchild): group C hFE 420–800' },
  // BC557 groups mirror the BC547's (from memory: Fairchild BC556–BC560 datasheet).
  BC557: { min: 110, max: 800, source: 'BC557 datasheet (Fairchild, from memory): hFE 110–800' },
  BC557B: { min: 200, max: 450, source: 'BC557 datasheet (Fairchild, from memory): group B hFE 200–450' },
};
const GENERIC_HFE = { half: 0.5, source: 'no datasheet bin known for this model: ±50 % (2N3904-like 100–300 bin width)' };

/** Thermal voltage at 27 °C (300.15 K), CODATA constants (REFERENCES.md). */
export const VT_27C = 0.025865;

/**
 * Forward-voltage spreads at a fixed current, used when a board gives no IS spread.
 * LED: ±0.2 V — red LEDs span 1.8–2.2 V at 20 mA (typical datasheet ranges, REFERENCES.md).
 * Silicon small-signal diode: ±25 mV (from memory: part-to-part VF spread of 1N4148-class diodes at
 * a fixed current is a few tens of millivolts).
 */
export const VF_SPREAD = {
  led: { volts: 0.2, source: 'LED VF spread ±0.2 V (red 1.8–2.2 V at 20 mA, typical datasheet range)' },
  diode: { volts: 0.025, source: 'small-signal silicon diode VF spread ±25 mV (from memory)' },
} as const;
/** Zener voltage tolerance of the common "C" grade (±5 %, from memory: BZX79/BZX55 series datasheets). */
export const ZENER_BV_SPREAD = { fraction: 0.05, source: 'zener BV ±5 % (BZX79 C grade, from memory)' };

/** What a deviation changes in a built circuit. */
export type DeviationTarget =
  | { kind: 'value' }
  | { kind: 'model-param'; param: string }
  | { kind: 'vos'; amplifier: number };

export interface PartDeviation extends Deviation {
  target: DeviationTarget;
}

export function boardDeviations(board: Board): PartDeviation[] {
  const out: PartDeviation[] = [];
  for (const part of board.parts) {
    if (part.kind === 'resistor' || part.kind === 'pot') out.push(...valueDeviation(board, part));
    else if (part.kind === 'opamp-dual' || part.kind === 'opamp-quad') out.push(...offsetDeviations(board, part));
    else if (part.kind === 'npn' || part.kind === 'pnp' || part.kind === 'diode' || part.kind === 'led' || part.kind === 'zener')
      out.push(...modelDeviations(board, part));
  }
  return out;
}

function valueDeviation(board: Board, part: Part): PartDeviation[] {
  const tolerance = partTolerance(board, part.ref);
  const value = preparedPart(board, part.ref).value;
  if (!tolerance || value === undefined) return [];
  return [
    {
      id: part.ref,
      part: part.ref,
      low: value * (1 - tolerance),
      nominal: value,
      high: value * (1 + tolerance),
      distribution: 'gaussian',
      source: `${part.kind === 'pot' ? 'track ' : ''}tolerance ±${+(tolerance * 100).toPrecision(3)} %`,
      target: { kind: 'value' },
    },
  ];
}

function offsetDeviations(board: Board, part: Part): PartDeviation[] {
  const name = modelNameFor(part);
  const params = name ? resolveOpAmp(board, name) : undefined;
  const pkg = OPAMP_PACKAGES[part.kind];
  if (!params || !pkg || !params.vosMax) return [];
  const fromBoard = name !== undefined && board.opampModels[name]?.vosMax !== undefined;
  return pkg.amplifiers.map((amp, index) => ({
    id: `${part.ref}${amp.suffix.toUpperCase()} vos`,
    part: part.ref,
    low: params.vos - params.vosMax!,
    nominal: params.vos,
    high: params.vos + params.vosMax!,
    distribution: 'gaussian' as const,
    source: `${name} input offset ±${+(params.vosMax! * 1e3).toPrecision(3)} mV max (${fromBoard ? 'board file' : 'built-in model'})`,
    target: { kind: 'vos' as const, amplifier: index },
  }));
}

function modelDeviations(board: Board, part: Part): PartDeviation[] {
  const name = modelNameFor(part);
  const model = name ? resolveModel(board, name) : undefined;
  if (!name || !model) return [];
  const spreads = new Map<string, { low: number; high: number; scale: 'linear' | 'log'; source: string }>();
  const p = model.params;
  if (part.kind === 'npn' || part.kind === 'pnp') {
    const bf = p.BF ?? 100; // SPICE's default BF
    const bin = HFE_BINS[name.toUpperCase()];
    const mid = bin ? (bin.min + bin.max) / 2 : 1;
    const [lo, hi] = bin ? [bin.min / mid, bin.max / mid] : [1 - GENERIC_HFE.half, 1 + GENERIC_HFE.half];
    spreads.set('BF', { low: bf * lo, high: bf * hi, scale: 'linear', source: bin?.source ?? GENERIC_HFE.source });
  } else if (part.kind === 'zener' && p.BV !== undefined) {
    const f = ZENER_BV_SPREAD.fraction;
    spreads.set('BV', { low: p.BV * (1 - f), high: p.BV * (1 + f), scale: 'linear', source: ZENER_BV_SPREAD.source });
  } else if (part.kind === 'diode' || part.kind === 'led') {
    const is = p.IS ?? 1e-14; // SPICE's default IS
    const n = p.N ?? 1;
    const vf = part.kind === 'led' ? VF_SPREAD.led : VF_SPREAD.diode;
    const k = Math.exp(vf.volts / (n * VT_27C));
    spreads.set('IS', { low: is / k, high: is * k, scale: 'log', source: vf.source });
  }
  for (const [param, [lo, hi]] of Object.entries(model.spread ?? {})) {
    const nominal = p[param] ?? (param === 'BF' ? 100 : undefined);
    if (nominal === undefined) continue;
    spreads.set(param, {
      low: nominal * lo,
      high: nominal * hi,
      scale: param === 'IS' ? 'log' : 'linear',
      source: `board file: ${name} ${param} ×${lo}…×${hi}`,
    });
  }
  return [...spreads].map(([param, s]) => ({
    id: `${part.ref} ${param}`,
    part: part.ref,
    low: s.low,
    nominal: p[param] ?? (param === 'BF' ? 100 : param === 'IS' ? 1e-14 : 0),
    high: s.high,
    distribution: 'uniform' as const,
    scale: s.scale,
    source: s.source,
    target: { kind: 'model-param' as const, param },
  }));
}
