/**
 * The circuit model every analysis reads: a flat list of elements joined by named nodes.
 *
 * Node names are lower case; "0" is ground (the reader and the board converter map "gnd" to it).
 * Element names are lower case and unique; for parts that come from a board they are derived
 * from the designator (R12 -> "r12"), so a fault or a substitution can find them again.
 * Values are SI numbers (ohms, farads, henries, volts, amps).
 */

export const GROUND = '0';

/** SPICE-style small-signal spec of an independent source: magnitude and phase in degrees. */
export interface AcSpec {
  mag: number;
  phaseDeg: number;
}

export interface Resistor {
  kind: 'resistor';
  name: string;
  nodes: [string, string];
  value: number;
  /** Watts; when set, results flag the resistor if it dissipates more. */
  powerRating?: number;
}

export interface Capacitor {
  kind: 'capacitor';
  name: string;
  nodes: [string, string];
  value: number;
  /**
   * Leakage conductance in siemens, used by fault models (an electrolytic fitted backwards
   * conducts); zero or absent means open at DC.
   */
  leakage?: number;
}

export interface Inductor {
  kind: 'inductor';
  name: string;
  nodes: [string, string];
  value: number;
}

/** SPICE convention: positive current flows into the + node, through the source, out of the - node. */
export interface VoltageSource {
  kind: 'vsource';
  name: string;
  nodes: [string, string];
  dc: number;
  ac?: AcSpec;
}

/** SPICE convention: the source drives `dc` amps from node + through itself to node - (out of - into the circuit). */
export interface CurrentSource {
  kind: 'isource';
  name: string;
  nodes: [string, string];
  dc: number;
  ac?: AcSpec;
}

export interface Diode {
  kind: 'diode';
  name: string;
  /** [anode, cathode] */
  nodes: [string, string];
  model: string;
  area?: number;
}

export interface Bjt {
  kind: 'bjt';
  name: string;
  /** [collector, base, emitter] */
  nodes: [string, string, string];
  model: string;
  area?: number;
}

/** E element: v(p) - v(n) = gain * (v(cp) - v(cn)). */
export interface Vcvs {
  kind: 'vcvs';
  name: string;
  nodes: [string, string, string, string];
  gain: number;
}

/** G element: current gm * (v(cp) - v(cn)) flows from p through the element to n. */
export interface Vccs {
  kind: 'vccs';
  name: string;
  nodes: [string, string, string, string];
  gm: number;
}

/** Behavioural op-amp with its supply pins; see src/circuit/devices/opamp.ts for the law. */
export interface OpAmpParams {
  /** Open-loop DC gain (V/V). */
  gain: number;
  /** Output resistance in ohms. */
  rout: number;
  /** Input resistance between the inputs, in ohms. */
  rin: number;
  /** How far short of each supply pin the output saturates, in volts. */
  headroom: number;
  /** Supply current drawn from V+ to V- at rest, in amps. */
  iq: number;
  /** Input offset voltage, in volts (added to the + input). */
  vos: number;
  /** Input voltage noise density (V/√Hz) and current noise density (A/√Hz), for noise analysis. */
  en: number;
  in: number;
}

export interface OpAmp {
  kind: 'opamp';
  name: string;
  /** [in+, in-, out, V+, V-] */
  nodes: [string, string, string, string, string];
  params: OpAmpParams;
}

export type Taper = 'linear' | 'log';

/** Three-terminal potentiometer: track from a to b, wiper w. position 0 = wiper at a, 1 = wiper at b. */
export interface Potentiometer {
  kind: 'pot';
  name: string;
  /** [a, wiper, b] */
  nodes: [string, string, string];
  value: number;
  position: number;
  taper: Taper;
}

/** A switch: named positions, each a list of terminal pairs (indices into nodes) that it connects. */
export interface Switch {
  kind: 'switch';
  name: string;
  nodes: string[];
  positions: Record<string, Array<[number, number]>>;
  position: string;
  /** Contact resistance when closed, in ohms. */
  ron: number;
}

export type Element =
  | Resistor
  | Capacitor
  | Inductor
  | VoltageSource
  | CurrentSource
  | Diode
  | Bjt
  | Vcvs
  | Vccs
  | OpAmp
  | Potentiometer
  | Switch;

export type ElementKind = Element['kind'];

export type ModelType = 'D' | 'NPN' | 'PNP';

/** A `.model` card: SPICE parameter names, upper case, SI values. */
export interface Model {
  name: string;
  type: ModelType;
  params: Record<string, number>;
}

export interface Circuit {
  title: string;
  elements: Element[];
  /** Keyed by lower-case model name. */
  models: Record<string, Model>;
  /** Analysis temperature in °C; SPICE's TNOM, 27 °C, when absent. */
  temperatureC?: number;
}

/** Every node name used by the circuit, ground excluded, in first-seen order. */
export function circuitNodes(circuit: Circuit): string[] {
  const seen = new Set<string>();
  for (const element of circuit.elements) {
    for (const node of element.nodes) {
      if (node !== GROUND) seen.add(node);
    }
  }
  return [...seen];
}
