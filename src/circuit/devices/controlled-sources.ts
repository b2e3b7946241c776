/**
 * Linear controlled sources.
 * E (VCVS): v(p) − v(n) = gain·(v(cp) − v(cn)), through a branch unknown carrying the output current.
 * G (VCCS): gm·(v(cp) − v(cn)) flows from p through the element to n.
 */
import type { Vccs, Vcvs } from '../netlist.js';
import type { Allocator, Device } from './device.js';
import type { Stamper } from '../stamper.js';
import { requireNumber } from '../check-values.js';

const at = (x: Float64Array, i: number) => (i < 0 ? 0 : x[i]);

export function createVcvs(el: Vcvs, alloc: Allocator): Device {
  const [p, n, cp, cn] = el.nodes.map((name) => alloc.node(name));
  const br = alloc.branch(el.name);
  const gain = requireNumber(el.name, 'gain', el.gain);
  return {
    name: el.name,
    element: el,
    stamp(s: Stamper): void {
      s.branch(p, n, br);
      s.matrix(br, cp, -gain);
      s.matrix(br, cn, gain);
    },
    terminalCurrents(x: Float64Array): number[] {
      return [x[br], -x[br], 0, 0];
    },
  };
}

export function createVccs(el: Vccs, alloc: Allocator): Device {
  const [p, n, cp, cn] = el.nodes.map((name) => alloc.node(name));
  const gm = requireNumber(el.name, 'gm', el.gm);
  return {
    name: el.name,
    element: el,
    stamp(s: Stamper): void {
      s.transconductance(p, n, cp, cn, gm);
    },
    terminalCurrents(x: Float64Array): number[] {
      const i = gm * (at(x, cp) - at(x, cn));
      return [i, -i, 0, 0];
    },
  };
}
