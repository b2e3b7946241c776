/**
 * Junction diode, SPICE's DC law: Shockley current Is·(exp(v/(N·Vt)) − 1) forward and for small
 * reverse bias, SPICE's cubic approach to −Is for deep reverse bias, and — when BV is given —
 * reverse breakdown as −Is·exp(−(BV' + v)/(N·Vt)), where BV' is BV adjusted (as SPICE does it)
 * so that the current at v = −BV is IBV. RS gets an internal node. GMIN sits across the junction.
 * Junction capacitance (CJO…) and transit time do not affect DC and are ignored here.
 */
import type { Circuit, Diode, Model } from '../netlist.js';
import type { Allocator, Device, JunctionRegion, StampContext } from './device.js';
import type { Stamper } from '../stamper.js';
import { findModel, readModelParams, settableParams, setParam, type ParamSpec } from '../model-params.js';
import { criticalVoltage, junction, limitJunction, safeExp } from '../junction.js';
import { badValue, requireNumber } from '../check-values.js';
import { NOMINAL_TEMPERATURE_C, thermalVoltage } from '../constants.js';

export const DIODE_PARAMS: ParamSpec = {
  defaults: { IS: 1e-14, N: 1, RS: 0, BV: Infinity, IBV: 1e-3 },
  ignoredAtDc: ['CJO', 'CJ0', 'CJ', 'VJ', 'M', 'TT', 'FC', 'EG', 'XTI', 'KF', 'AF', 'TNOM', 'IAVE', 'VPK', 'MFG', 'TYPE', 'IRATING', 'VRATING', 'IAVE'],
  temperatureOnly: ['EG', 'XTI', 'TNOM'],
};

/** Current through a conducting junction above which it is reported as conducting. */
export const CONDUCTING_CURRENT = 1e-7;

export interface DiodeLaw {
  is: number;
  nvt: number;
  rs: number;
  /** Breakdown voltage after matching IBV, or Infinity. */
  bv: number;
  vcrit: number;
}

/** SPICE's adjustment of BV so that the breakdown branch passes through (−BV, −IBV). */
export function breakdownVoltage(bv: number, ibv: number, is: number, nvt: number, reltol = 1e-3): number {
  if (!Number.isFinite(bv)) return Infinity;
  if (ibv < (is * bv) / nvt) return bv;
  const tol = reltol * ibv;
  let xbv = bv - nvt * Math.log(1 + ibv / is);
  for (let iter = 0; iter < 25; iter++) {
    xbv = bv - nvt * Math.log(ibv / is + 1 - xbv / nvt);
    const xcbv = is * (Math.exp((bv - xbv) / nvt) - 1 + xbv / nvt);
    if (Math.abs(xcbv - ibv) <= tol) break;
  }
  return xbv;
}

/** Junction current and conductance (without GMIN): out[0] = i, out[1] = di/dv. */
export function diodeCurrent(v: number, law: DiodeLaw, out: Float64Array): void {
  if (v >= -law.bv) {
    junction(v, law.is, law.nvt, out);
  } else {
    const e = safeExp(-(law.bv + v) / law.nvt);
    out[0] = -law.is * e;
    out[1] = (law.is * e) / law.nvt;
  }
}

export function diodeLaw(circuit: Circuit, el: Diode, warn: (m: string) => void): DiodeLaw {
  const model = findModel(circuit, el.name, el.model, ['D']);
  return lawOfModel(model, el, circuit.temperatureC ?? NOMINAL_TEMPERATURE_C, warn);
}

function lawOfModel(model: Model, el: Diode, temperatureC: number, warn: (m: string) => void): DiodeLaw {
  return lawOfParams(readModelParams(model, DIODE_PARAMS, temperatureC, warn), model.name, el, temperatureC);
}

function lawOfParams(p: Record<string, number>, modelName: string, el: Diode, temperatureC: number): DiodeLaw {
  const area = el.area === undefined ? 1 : requireNumber(el.name, 'area', el.area, 0, true);
  const nvt = p.N * thermalVoltage(temperatureC);
  const is = p.IS * area;
  if (!(is > 0) || !(nvt > 0)) {
    requireNumber(`${el.name} (model ${modelName})`, 'IS', p.IS, 0, true);
    requireNumber(`${el.name} (model ${modelName})`, 'N', p.N, 0, true);
  }
  return {
    is,
    nvt,
    rs: p.RS / area,
    bv: breakdownVoltage(p.BV, p.IBV * area, is, nvt),
    vcrit: criticalVoltage(is, nvt),
  };
}

export function createDiode(el: Diode, alloc: Allocator, circuit: Circuit): Device {
  const model = findModel(circuit, el.name, el.model, ['D']);
  const temperatureC = circuit.temperatureC ?? NOMINAL_TEMPERATURE_C;
  // This device's own copy, changed in place by set().
  const params = readModelParams(model, DIODE_PARAMS, temperatureC, alloc.warn);
  let law = lawOfParams(params, model.name, el, temperatureC);
  const anode = alloc.node(el.nodes[0]);
  const cathode = alloc.node(el.nodes[1]);
  const inner = law.rs > 0 ? alloc.internal(el.name, 'anode') : anode;
  let grs = law.rs > 0 ? 1 / law.rs : 0;
  const scratch = new Float64Array(2);
  let vOld = 0;
  let pending: number | null = null;
  const at = (x: Float64Array, i: number) => (i < 0 ? 0 : x[i]);
  let breakdownLimitBelow = Math.min(0, -law.bv + 10 * law.nvt);

  return {
    name: el.name,
    element: el,
    settable: settableParams(DIODE_PARAMS),
    set(field: string, value: number): void {
      law = setParam(params, DIODE_PARAMS, el.name, field, value, () => {
        const nextLaw = lawOfParams(params, model.name, el, temperatureC);
        // RS = 0 has no internal node; the compiled layout cannot gain or lose one.
        if (nextLaw.rs > 0 !== law.rs > 0) throw badValue(el.name, field, value, `a value keeping RS ${law.rs > 0 ? '> 0' : '= 0'} on this compiled circuit`);
        return nextLaw;
      });
      grs = law.rs > 0 ? 1 / law.rs : 0;
      breakdownLimitBelow = Math.min(0, -law.bv + 10 * law.nvt);
    },
    seed(x: Float64Array | null): void {
      if (x) {
        vOld = at(x, inner) - at(x, cathode);
        pending = null;
      } else {
        pending = law.vcrit;
        vOld = law.vcrit;
      }
    },
    stamp(s: Stamper, ctx: StampContext): void {
      let v: number;
      if (pending !== null) {
        v = pending;
        pending = null;
      } else {
        v = at(ctx.x, inner) - at(ctx.x, cathode);
        if (ctx.limit) {
          let lim: number;
          if (Number.isFinite(law.bv) && v < breakdownLimitBelow) {
            lim = -(limitJunction(-(v + law.bv), -(vOld + law.bv), law.nvt, law.vcrit) + law.bv);
          } else {
            lim = limitJunction(v, vOld, law.nvt, law.vcrit);
          }
          if (lim !== v) ctx.limited++;
          v = lim;
        }
      }
      vOld = v;
      diodeCurrent(v, law, scratch);
      const g = scratch[1] + ctx.gmin;
      const i = scratch[0] + ctx.gmin * v;
      if (grs > 0) s.conductance(anode, inner, grs);
      s.conductance(inner, cathode, g);
      s.current(inner, cathode, i - g * v);
    },
    terminalCurrents(x: Float64Array, ctx: StampContext): number[] {
      const v = at(x, inner) - at(x, cathode);
      diodeCurrent(v, law, scratch);
      const i = scratch[0] + ctx.gmin * v;
      return [i, -i];
    },
    region(x: Float64Array, ctx: StampContext): JunctionRegion {
      const v = at(x, inner) - at(x, cathode);
      diodeCurrent(v, law, scratch);
      if (v < -law.bv) return 'breakdown';
      if (scratch[0] + ctx.gmin * v >= CONDUCTING_CURRENT) return 'forward';
      return v < 0 ? 'reverse' : 'off';
    },
  };
}
