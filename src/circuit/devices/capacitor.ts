/** Capacitor: open at DC apart from an optional leakage conductance; admittance jωC + leakage in AC. */
import type { Capacitor } from '../netlist.js';
import type { Allocator, Device } from './device.js';
import type { Stamper } from '../stamper.js';
import type { ComplexStamper } from '../complex-stamper.js';
import { requireNumber } from '../check-values.js';

export function createCapacitor(el: Capacitor, alloc: Allocator): Device {
  const p = alloc.node(el.nodes[0]);
  const q = alloc.node(el.nodes[1]);
  const c = requireNumber(el.name, 'value', el.value, 0);
  const leak = el.leakage === undefined ? 0 : requireNumber(el.name, 'leakage', el.leakage, 0);
  const v = (x: Float64Array, i: number) => (i < 0 ? 0 : x[i]);
  return {
    name: el.name,
    element: el,
    stamp(s: Stamper): void {
      // Stamped even when zero so the matrix pattern does not depend on the leakage value.
      s.conductance(p, q, leak);
    },
    terminalCurrents(x: Float64Array): number[] {
      const i = leak * (v(x, p) - v(x, q));
      return [i, -i];
    },
    stampAc(s: ComplexStamper, omega: number): void {
      s.admittance(p, q, 0, omega * c);
    },
  };
}
