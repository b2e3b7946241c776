/** Inductor: a short at DC (a branch with v(+) − v(−) = 0), impedance jωL in AC. */
import type { Inductor } from '../netlist.js';
import type { Allocator, Device } from './device.js';
import type { Stamper } from '../stamper.js';
import type { ComplexStamper } from '../complex-stamper.js';
import { requireNumber } from '../check-values.js';

export function createInductor(el: Inductor, alloc: Allocator): Device {
  const p = alloc.node(el.nodes[0]);
  const q = alloc.node(el.nodes[1]);
  const br = alloc.branch(el.name);
  const l = requireNumber(el.name, 'value', el.value, 0);
  return {
    name: el.name,
    element: el,
    stamp(s: Stamper): void {
      s.branch(p, q, br);
      s.matrix(br, br, 0);
    },
    terminalCurrents(x: Float64Array): number[] {
      return [x[br], -x[br]];
    },
    stampAc(s: ComplexStamper, omega: number): void {
      s.matrix(br, br, 0, -omega * l);
    },
  };
}
