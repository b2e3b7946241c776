/**
 * Independent sources, in SPICE's sign conventions.
 * V source: v(+) − v(−) = dc; its branch current is positive flowing into + through the source to
 *   − (so a battery feeding a load reports a negative current, as SPICE prints it).
 * I source: dc amps flow from + through the source to −, i.e. out of − into the circuit.
 * Both scale with the source-stepping factor, and both carry an optional AC phasor.
 */
import type { AcSpec, CurrentSource, VoltageSource } from '../netlist.js';
import type { Allocator, Device, StampContext } from './device.js';
import type { Stamper } from '../stamper.js';
import type { ComplexStamper } from '../complex-stamper.js';
import { badValue, requireNumber } from '../check-values.js';

/** The one value of an independent source that can change in place: its DC value. */
function checkedDc(name: string, field: string, value: number): number {
  if (field !== 'dc') throw badValue(name, 'field', field, '"dc"');
  return requireNumber(name, 'dc', value);
}

function phasor(name: string, ac: AcSpec | undefined): [number, number] {
  if (!ac) return [0, 0];
  const mag = requireNumber(name, 'ac.mag', ac.mag);
  const ph = (requireNumber(name, 'ac.phaseDeg', ac.phaseDeg) * Math.PI) / 180;
  return [mag * Math.cos(ph), mag * Math.sin(ph)];
}

export function createVoltageSource(el: VoltageSource, alloc: Allocator): Device {
  const p = alloc.node(el.nodes[0]);
  const q = alloc.node(el.nodes[1]);
  const br = alloc.branch(el.name);
  let dc = requireNumber(el.name, 'dc', el.dc);
  const [acRe, acIm] = phasor(el.name, el.ac);
  return {
    name: el.name,
    element: el,
    settable: ['dc'],
    set(field: string, value: number): void {
      dc = checkedDc(el.name, field, value);
    },
    stamp(s: Stamper, ctx: StampContext): void {
      s.branch(p, q, br);
      s.rhs(br, dc * ctx.sourceScale);
    },
    terminalCurrents(x: Float64Array): number[] {
      return [x[br], -x[br]];
    },
    stampAc(s: ComplexStamper): void {
      s.rhs(br, acRe, acIm);
    },
  };
}

export function createCurrentSource(el: CurrentSource, alloc: Allocator): Device {
  const p = alloc.node(el.nodes[0]);
  const q = alloc.node(el.nodes[1]);
  let dc = requireNumber(el.name, 'dc', el.dc);
  const [acRe, acIm] = phasor(el.name, el.ac);
  return {
    name: el.name,
    element: el,
    settable: ['dc'],
    set(field: string, value: number): void {
      dc = checkedDc(el.name, field, value);
    },
    stamp(s: Stamper, ctx: StampContext): void {
      s.current(p, q, dc * ctx.sourceScale);
    },
    terminalCurrents(_x: Float64Array, ctx: StampContext): number[] {
      return [dc * ctx.sourceScale, -dc * ctx.sourceScale];
    },
    stampAc(s: ComplexStamper): void {
      s.current(p, q, acRe, acIm);
    },
  };
}
