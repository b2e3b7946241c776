import type { Board, Condition, Part } from '../schemas/board.js';
import { GROUND, type Circuit, type Element, type Model } from '../circuit/netlist.js';
import { UserInputError } from '../errors.js';
import { DEFAULT_POT_POSITION, SWITCH_CONTACT_RESISTANCE } from './defaults.js';
import { OPAMP_PACKAGES, switchPinsUsed } from './pins.js';
import { modelNameFor, preparedParts, resolveModel, resolveOpAmp } from './values.js';
import { DEFAULT_OHMMETER, METER_NODE, METER_RESISTOR, METER_SOURCE, type OhmmeterModel } from './ohmmeter.js';
import { findCondition, findTestPoint } from './lookup.js';
import { tieFloatingNodes } from './floating-nodes.js';

export interface BuildOptions {
  /** Put the simulated ohmmeter on this resistance test point (unpowered conditions only). */
  ohmmeter?: { testPoint: string } & Partial<OhmmeterModel>;
}

export interface BuiltCircuit {
  circuit: Circuit;
  /** Designator -> the element names made from it (U1 -> ["u1a", "u1b"]; connectors -> []). */
  partElements: Record<string, string[]>;
  /** Board net -> circuit node (lower case; the ground net -> "0"). */
  netNode: (net: string) => string;
}

/** Name of the supply source for a rail, e.g. "vrail_pos12"; never clashes with a designator. */
export const railSourceName = (railId: string) => `vrail_${railId.toLowerCase().replace(/[^a-z0-9]/g, '_')}`;
export const SIGNAL_SOURCE = 'vsignal';
export const SIGNAL_RESISTOR = 'rsignal';
export const SIGNAL_NODE = '_signal';

/** Models per board object, built once (they depend on the board only). */
const modelCache = new WeakMap<Board, Record<string, Model>>();

function modelsFor(board: Board): Record<string, Model> {
  let models = modelCache.get(board);
  if (models) return models;
  models = {};
  for (const part of board.parts) {
    const name = modelNameFor(part);
    if (name === undefined || part.kind === 'opamp-dual' || part.kind === 'opamp-quad') continue;
    const m = resolveModel(board, name);
    if (m) models[name.toLowerCase()] = { name: name.toLowerCase(), type: m.type, params: { ...m.params } };
  }
  modelCache.set(board, models);
  return models;
}

/**
 * The board as set up for one condition: every part as circuit elements (names from designators),
 * pots and switches at the condition's settings (else their own default, else mid-track / first
 * position), the rails as voltage sources when powered, the condition's DC signal behind its source
 * resistance, and optionally the ohmmeter on one resistance test point.
 *
 * Not simulated: connectors (they only join nets), and, when unpowered, the op-amps — a JFET-input
 * op-amp with no supply presents ≈10¹² Ω between its inputs, and its output and supply-pin junctions
 * are not modelled, so an unpowered reading sees the parts around it only.
 * Nodes with no DC path to ground (a net only capacitors reach) get a 1 TΩ tie so the matrix is
 * never singular; see floating-nodes.ts.
 *
 * Expects a validated board (loadBoard / validateBoard); values are parsed once per board object.
 */
export function buildCircuit(board: Board, conditionId: string, options: BuildOptions = {}): BuiltCircuit {
  const condition = findCondition(board, conditionId);
  const ground = board.ground;
  const netNode = (net: string) => (net === ground ? GROUND : net.toLowerCase());
  const node = (part: Part, pin: string) => netNode(part.pins[pin]);
  const elements: Element[] = [];
  const partElements: Record<string, string[]> = {};

  for (const { part, value } of preparedParts(board).values()) {
    const name = part.ref.toLowerCase();
    const made = addPart(board, condition, part, name, value, node, elements);
    partElements[part.ref] = made;
  }

  if (condition.powered) {
    for (const rail of board.rails) {
      elements.push({ kind: 'vsource', name: railSourceName(rail.id), nodes: [netNode(rail.net), GROUND], dc: rail.volts });
    }
    const signal = condition.signal;
    if (signal) {
      if (signal.sourceResistance > 0) {
        elements.push({ kind: 'vsource', name: SIGNAL_SOURCE, nodes: [SIGNAL_NODE, GROUND], dc: signal.volts });
        elements.push({ kind: 'resistor', name: SIGNAL_RESISTOR, nodes: [SIGNAL_NODE, netNode(signal.net)], value: signal.sourceResistance });
      } else {
        elements.push({ kind: 'vsource', name: SIGNAL_SOURCE, nodes: [netNode(signal.net), GROUND], dc: signal.volts });
      }
    }
  }

  if (options.ohmmeter) {
    const { testPoint, ...figures } = options.ohmmeter;
    const meter = { ...DEFAULT_OHMMETER, ...figures };
    const tp = findTestPoint(board, testPoint);
    if (condition.powered) {
      throw new UserInputError({
        code: 'board.ohmmeter-powered',
        path: `conditions.${condition.id}`,
        message: `resistance at ${tp.id} cannot be measured in ${condition.id}: the board is powered`,
        accepted: 'an unpowered condition',
      });
    }
    elements.push({ kind: 'vsource', name: METER_SOURCE, nodes: [METER_NODE, netNode(tp.refNet ?? ground)], dc: meter.openCircuitVolts });
    elements.push({ kind: 'resistor', name: METER_RESISTOR, nodes: [METER_NODE, netNode(tp.net)], value: meter.sourceResistance });
  }

  tieFloatingNodes(elements);
  return {
    circuit: { title: `${board.name} — ${condition.label}`, elements, models: copyModels(modelsFor(board)) },
    partElements,
    netNode,
  };
}

function copyModels(models: Record<string, Model>): Record<string, Model> {
  const out: Record<string, Model> = {};
  for (const [k, m] of Object.entries(models)) out[k] = { ...m, params: { ...m.params } };
  return out;
}

function addPart(
  board: Board,
  condition: Condition,
  part: Part,
  name: string,
  value: number | undefined,
  node: (part: Part, pin: string) => string,
  out: Element[],
): string[] {
  switch (part.kind) {
    case 'resistor':
      out.push({ kind: 'resistor', name, nodes: [node(part, '1'), node(part, '2')], value: value!, ...(part.powerRating ? { powerRating: part.powerRating } : {}) });
      return [name];
    case 'capacitor':
      out.push({ kind: 'capacitor', name, nodes: [node(part, '1'), node(part, '2')], value: value! });
      return [name];
    case 'electrolytic':
      out.push({ kind: 'capacitor', name, nodes: [node(part, '+'), node(part, '-')], value: value! });
      return [name];
    case 'inductor':
      out.push({ kind: 'inductor', name, nodes: [node(part, '1'), node(part, '2')], value: value! });
      return [name];
    case 'diode':
    case 'zener':
    case 'led':
      out.push({ kind: 'diode', name, nodes: [node(part, 'A'), node(part, 'K')], model: modelNameFor(part)!.toLowerCase() });
      return [name];
    case 'npn':
    case 'pnp':
      out.push({ kind: 'bjt', name, nodes: [node(part, 'C'), node(part, 'B'), node(part, 'E')], model: modelNameFor(part)!.toLowerCase() });
      return [name];
    case 'opamp-dual':
    case 'opamp-quad': {
      if (!condition.powered) return [];
      const pkg = OPAMP_PACKAGES[part.kind]!;
      const params = resolveOpAmp(board, modelNameFor(part)!)!;
      const { vosMax: _unused, ...law } = params;
      return pkg.amplifiers.map((amp) => {
        const ampName = `${name}${amp.suffix}`;
        out.push({
          kind: 'opamp',
          name: ampName,
          nodes: [node(part, amp.plus), node(part, amp.minus), node(part, amp.out), node(part, pkg.vPlus), node(part, pkg.vMinus)],
          params: { ...law },
        });
        return ampName;
      });
    }
    case 'pot': {
      const setting = condition.settings[part.ref];
      const position = typeof setting === 'number' ? setting : typeof part.position === 'number' ? part.position : DEFAULT_POT_POSITION;
      out.push({ kind: 'pot', name, nodes: [node(part, '1'), node(part, '2'), node(part, '3')], value: value!, position, taper: part.taper ?? 'linear' });
      return [name];
    }
    case 'switch': {
      const pins = switchPinsUsed(part);
      const index = new Map(pins.map((p, i) => [p, i]));
      const positions: Record<string, Array<[number, number]>> = {};
      for (const [pos, pairs] of Object.entries(part.positions ?? {})) positions[pos] = pairs.map(([a, b]) => [index.get(a)!, index.get(b)!]);
      const setting = condition.settings[part.ref];
      const position = typeof setting === 'string' ? setting : typeof part.position === 'string' ? part.position : Object.keys(positions)[0];
      out.push({ kind: 'switch', name, nodes: pins.map((p) => node(part, p)), positions, position, ron: SWITCH_CONTACT_RESISTANCE });
      return [name];
    }
    case 'connector':
      return [];
  }
}
