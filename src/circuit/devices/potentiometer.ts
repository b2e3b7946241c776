/**
 * Three-terminal potentiometer: track a–b of `value` ohms, wiper w; position 0 puts the wiper at a.
 *
 * Taper laws (the fraction f of the track between a and the wiper, at rotation p in 0…1):
 * - linear: f = p.
 * - log (audio): f = (81^p − 1) / 80, an exponential law through (0, 0), (0.5, 0.1) and (1, 1).
 *   "10 % of the track at mid-rotation" is the usual description of an audio taper (common
 *   practice); the base 81 is what makes the exponential pass exactly through that point, and it
 *   is smooth, unlike the two straight segments some makers use to approximate it.
 * Each segment is held at MIN_TRACK_RESISTANCE or more, as a real wiper never quite reaches 0 Ω.
 */
import type { Potentiometer } from '../netlist.js';
import type { Allocator, Device, StampContext } from './device.js';
import type { Stamper } from '../stamper.js';
import { badValue, requireNumber } from '../check-values.js';

export const MIN_TRACK_RESISTANCE = 1e-3;
const LOG_TAPER_BASE = 81;

export function taperFraction(position: number, taper: Potentiometer['taper']): number {
  if (taper === 'linear') return position;
  return (Math.pow(LOG_TAPER_BASE, position) - 1) / (LOG_TAPER_BASE - 1);
}

/** [a → wiper, wiper → b] in ohms, as the solver stamps them. */
export function potResistances(pot: Potentiometer): [number, number] {
  const value = requireNumber(pot.name, 'value', pot.value, 0, true);
  const position = requireNumber(pot.name, 'position', pot.position, 0);
  if (position > 1) throw badValue(pot.name, 'position', position, 'a wiper position from 0 to 1');
  if (pot.taper !== 'linear' && pot.taper !== 'log') {
    throw badValue(pot.name, 'taper', pot.taper, '"linear" or "log"');
  }
  const f = taperFraction(position, pot.taper);
  return [Math.max(value * f, MIN_TRACK_RESISTANCE), Math.max(value * (1 - f), MIN_TRACK_RESISTANCE)];
}

export function createPotentiometer(el: Potentiometer, alloc: Allocator): Device {
  const a = alloc.node(el.nodes[0]);
  const w = alloc.node(el.nodes[1]);
  const b = alloc.node(el.nodes[2]);
  let { value, position } = el;
  const [raw, rwb] = potResistances(el);
  let gaw = 1 / raw;
  let gwb = 1 / rwb;
  const v = (x: Float64Array, i: number) => (i < 0 ? 0 : x[i]);
  return {
    name: el.name,
    element: el,
    settable: ['value', 'position'],
    set(field: string, to: number): void {
      if (field !== 'value' && field !== 'position') throw badValue(el.name, 'field', field, '"value" or "position"');
      const next = { ...el, value, position, [field]: to };
      const [ra, rb] = potResistances(next);
      ({ value, position } = next);
      gaw = 1 / ra;
      gwb = 1 / rb;
    },
    stamp(s: Stamper): void {
      s.conductance(a, w, gaw);
      s.conductance(w, b, gwb);
    },
    terminalCurrents(x: Float64Array, _ctx: StampContext): number[] {
      const iaw = gaw * (v(x, a) - v(x, w));
      const iwb = gwb * (v(x, w) - v(x, b));
      return [iaw, iwb - iaw, -iwb];
    },
  };
}
