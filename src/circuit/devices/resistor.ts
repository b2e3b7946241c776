/** Linear resistor. A value of 0 is taken as a near-perfect short, Infinity as an open. */
import type { Resistor } from '../netlist.js';
import type { Allocator, Device, StampContext } from './device.js';
import type { Stamper } from '../stamper.js';
import { badValue } from '../check-values.js';

/** Smallest resistance the solver will stamp; a 0 Ω part becomes this (SPICE itself rejects 0). */
export const MIN_RESISTANCE = 1e-6;

export function resistorConductance(element: string, ohms: number, field = 'value'): number {
  if (typeof ohms !== 'number' || Number.isNaN(ohms) || ohms < 0) {
    throw badValue(element, field, ohms, 'a resistance in ohms ≥ 0 (Infinity for an open)');
  }
  return ohms === Infinity ? 0 : 1 / Math.max(ohms, MIN_RESISTANCE);
}

export function createResistor(el: Resistor, alloc: Allocator): Device {
  const p = alloc.node(el.nodes[0]);
  const q = alloc.node(el.nodes[1]);
  let g = resistorConductance(el.name, el.value);
  return {
    name: el.name,
    element: el,
    settable: ['value'],
    set(field: string, value: number): void {
      if (field !== 'value') throw badValue(el.name, 'field', field, '"value"');
      g = resistorConductance(el.name, value);
    },
    stamp(s: Stamper): void {
      s.conductance(p, q, g);
    },
    terminalCurrents(x: Float64Array, _ctx: StampContext): number[] {
      const i = g * ((p < 0 ? 0 : x[p]) - (q < 0 ? 0 : x[q]));
      return [i, -i];
    },
  };
}
