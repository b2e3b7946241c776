/**
 * Turns a Circuit into index form once: every node, internal device node and branch current gets
 * an unknown index, every element becomes a Device with its indices resolved, and the matrix
 * pattern is recorded by a trial stamp. Solvers reuse the result for every operating point.
 */
import type { Circuit, Element } from './netlist.js';
import { GROUND } from './netlist.js';
import type { Allocator, Device, StampContext } from './devices/device.js';
import { createResistor } from './devices/resistor.js';
import { createPotentiometer } from './devices/potentiometer.js';
import { createSwitch } from './devices/switch.js';
import { createCurrentSource, createVoltageSource } from './devices/sources.js';
import { createCapacitor } from './devices/capacitor.js';
import { createInductor } from './devices/inductor.js';
import { createDiode } from './devices/diode.js';
import { createBjt } from './devices/bjt.js';
import { createVccs, createVcvs } from './devices/controlled-sources.js';
import { createOpAmp } from './devices/opamp.js';
import { Stamper } from './stamper.js';
import { NOMINAL_TEMPERATURE_C, thermalVoltage } from './constants.js';
import { UserInputError } from '../errors.js';

export interface CompiledCircuit {
  circuit: Circuit;
  /** Number of unknowns. */
  size: number;
  /** Name of each unknown: a node, "q1#base" for a device-internal node, "i(v1)" for a branch current. */
  unknownNames: string[];
  /** 1 where the unknown is a branch current (abstol applies), 0 for a voltage (vntol applies). */
  isCurrent: Uint8Array;
  /** Circuit node name → unknown index (ground absent). */
  nodeIndex: Map<string, number>;
  devices: Device[];
  warnings: string[];
  vt: number;
  /** 1 at every matrix position any device can write. */
  pattern: Uint8Array;
  /** The same positions as a list of row·size + column. */
  positions: Int32Array;
  /**
   * Unknowns of circuit nodes (not device-internal ones): where gshunt and gmin stepping put their
   * conductance to ground. Internal nodes always hang off a series resistance, and a shunt there
   * would be a current no device reports, breaking the KCL check at the outer node.
   */
  shuntRows: Int32Array;
}

function createDevice(el: Element, alloc: Allocator, circuit: Circuit): Device {
  switch (el.kind) {
    case 'resistor': return createResistor(el, alloc);
    case 'pot': return createPotentiometer(el, alloc);
    case 'switch': return createSwitch(el, alloc);
    case 'vsource': return createVoltageSource(el, alloc);
    case 'isource': return createCurrentSource(el, alloc);
    case 'capacitor': return createCapacitor(el, alloc);
    case 'inductor': return createInductor(el, alloc);
    case 'diode': return createDiode(el, alloc, circuit);
    case 'bjt': return createBjt(el, alloc, circuit);
    case 'vcvs': return createVcvs(el, alloc);
    case 'vccs': return createVccs(el, alloc);
    case 'opamp': return createOpAmp(el, alloc);
    default: {
      const unknown = el as { kind: unknown; name?: unknown };
      throw new UserInputError({
        code: 'circuit.unknown-element',
        path: `elements.${String(unknown.name)}.kind`,
        message: `element kind ${String(unknown.kind)} is not known`,
        accepted: 'resistor, pot, switch, vsource, isource, capacitor, inductor, diode, bjt, vcvs, vccs, opamp',
      });
    }
  }
}

export function compileCircuit(circuit: Circuit): CompiledCircuit {
  const names: string[] = [];
  const isCurrent: number[] = [];
  const nodeIndex = new Map<string, number>();
  const warnings: string[] = [];
  const seenElements = new Set<string>();
  const add = (name: string, current: boolean) => {
    names.push(name);
    isCurrent.push(current ? 1 : 0);
    return names.length - 1;
  };
  const alloc: Allocator = {
    node(name) {
      if (name === GROUND) return -1;
      let i = nodeIndex.get(name);
      if (i === undefined) {
        i = add(name, false);
        nodeIndex.set(name, i);
      }
      return i;
    },
    internal: (owner, label) => add(`${owner}#${label}`, false),
    branch: (owner) => add(`i(${owner})`, true),
    warn: (m) => warnings.push(m),
  };
  const devices: Device[] = [];
  for (const el of circuit.elements) {
    if (seenElements.has(el.name)) {
      throw new UserInputError({
        code: 'circuit.duplicate-element',
        path: `elements.${el.name}`,
        message: `element name ${el.name} is used twice`,
        accepted: 'unique element names',
      });
    }
    seenElements.add(el.name);
    devices.push(createDevice(el, alloc, circuit));
  }
  const size = names.length;
  const vt = thermalVoltage(circuit.temperatureC ?? NOMINAL_TEMPERATURE_C);

  // Trial stamp at x = 0 to learn the pattern; node diagonals are always present (gmin, gshunt).
  const stamper = new Stamper(size);
  stamper.pattern = new Uint8Array(size * size);
  const ctx: StampContext = { x: new Float64Array(size), vt, gmin: 1e-12, sourceScale: 1, limit: false, limited: 0 };
  for (const d of devices) {
    d.seed?.(ctx.x, vt);
    stamper.owner = d.name;
    d.stamp(stamper, ctx);
  }
  const pattern = stamper.pattern;
  for (let i = 0; i < size; i++) if (!isCurrent[i]) pattern[i * size + i] = 1;

  const shuntRows = Int32Array.from(nodeIndex.values());
  const list: number[] = [];
  for (let k = 0; k < pattern.length; k++) if (pattern[k]) list.push(k);
  const positions = Int32Array.from(list);
  return { circuit, size, unknownNames: names, isCurrent: Uint8Array.from(isCurrent), nodeIndex, devices, warnings, vt, pattern, positions, shuntRows };
}
