/**
 * Multi-position switch: the selected position lists the terminal pairs it joins, each through
 * `ron`. Open contacts are simply absent (no leakage path), so a node left only on an open contact
 * is held by the solver's gshunt alone.
 */
import type { Switch } from '../netlist.js';
import type { Allocator, Device, StampContext } from './device.js';
import type { Stamper } from '../stamper.js';
import { badValue } from '../check-values.js';
import { resistorConductance } from './resistor.js';

export function createSwitch(el: Switch, alloc: Allocator): Device {
  const idx = el.nodes.map((n) => alloc.node(n));
  const pairs = el.positions[el.position];
  if (!pairs) {
    throw badValue(el.name, 'position', el.position, `one of ${Object.keys(el.positions).join(', ') || '(none defined)'}`);
  }
  for (const [i, j] of pairs) {
    for (const t of [i, j]) {
      if (!Number.isInteger(t) || t < 0 || t >= el.nodes.length) {
        throw badValue(el.name, `positions.${el.position}`, t, `terminal indices 0…${el.nodes.length - 1}`);
      }
    }
  }
  const g = resistorConductance(el.name, el.ron, 'ron');
  const v = (x: Float64Array, i: number) => (i < 0 ? 0 : x[i]);
  return {
    name: el.name,
    element: el,
    stamp(s: Stamper): void {
      for (const [i, j] of pairs) s.conductance(idx[i], idx[j], g);
    },
    terminalCurrents(x: Float64Array, _ctx: StampContext): number[] {
      const out = el.nodes.map(() => 0);
      for (const [i, j] of pairs) {
        const c = g * (v(x, idx[i]) - v(x, idx[j]));
        out[i] += c;
        out[j] -= c;
      }
      return out;
    },
  };
}
