/**
 * Bipolar transistor, SPICE Gummel–Poon DC model.
 *
 * With vbe, vbc the internal junction voltages (sign-flipped for PNP):
 *   ibe = IS·(exp(vbe/(NF·Vt)) − 1), ibc = IS·(exp(vbc/(NR·Vt)) − 1)
 *   leakage: ISE·(exp(vbe/(NE·Vt)) − 1), ISC·(exp(vbc/(NC·Vt)) − 1)
 *   base charge qb = q1·(1 + √(1 + 4·q2))/2, q1 = 1/(1 − vbc/VAF − vbe/VAR), q2 = ibe/IKF + ibc/IKR
 *   ic = (ibe − ibc)/qb − ibc/BR − ileakC,  ib = ibe/BF + ileakE + ibc/BR + ileakC
 * RB (with RBM: rb = RBM + (RB − RBM)/qb), RE and RC get internal nodes when nonzero.
 * VAF, VAR, IKF, IKR of 0 mean infinite, as in SPICE. GMIN sits across both junctions.
 * Not modelled: IRB (current-dependent base resistance beyond RBM), quasi-saturation, substrate.
 * Charge-storage, noise and temperature parameters (BJT_PARAMS.ignoredAtDc) are accepted and have
 * no effect here: the small-signal AC ignores junction and diffusion capacitance.
 */
import type { Bjt, Circuit, Model } from '../netlist.js';
import type { Allocator, Device, JunctionRegion, StampContext } from './device.js';
import type { Stamper } from '../stamper.js';
import { findModel, readModelParams, settableParams, setParam, type ParamSpec } from '../model-params.js';
import { criticalVoltage, junction, limitJunction } from '../junction.js';
import { badValue, requireNumber } from '../check-values.js';
import { NOMINAL_TEMPERATURE_C, thermalVoltage } from '../constants.js';
import { CONDUCTING_CURRENT } from './diode.js';

const SATURATION_RATIO = 1e-4;

export const BJT_PARAMS: ParamSpec = {
  defaults: {
    IS: 1e-16, BF: 100, BR: 1, NF: 1, NR: 1, VAF: 0, VAR: 0, ISE: 0, NE: 1.5, ISC: 0, NC: 2,
    IKF: 0, IKR: 0, RB: 0, RBM: NaN, RE: 0, RC: 0,
  },
  aliases: { VA: 'VAF', VB: 'VAR', IK: 'IKF', BFM: 'BF', BRM: 'BR' },
  ignoredAtDc: [
    'CJE', 'VJE', 'PE', 'MJE', 'ME', 'CJC', 'VJC', 'PC', 'MJC', 'MC', 'XCJC', 'CJS', 'CCS', 'VJS', 'PS', 'MJS', 'MS',
    'TF', 'XTF', 'VTF', 'ITF', 'PTF', 'TR', 'FC', 'EG', 'XTB', 'XTI', 'KF', 'AF', 'TNOM', 'NS', 'ISS',
    'VCEO', 'ICRATING', 'MFG', 'TYPE', 'IAVE', 'VCBO', 'VEBO', 'PD', 'ICMAX',
  ],
  temperatureOnly: ['EG', 'XTB', 'XTI', 'TNOM'],
};

interface GpParams {
  type: 1 | -1;
  is: number; bf: number; br: number; nf: number; nr: number;
  invVaf: number; invVar: number; ise: number; ne: number; isc: number; nc: number;
  invIkf: number; invIkr: number; rbMin: number; rbExtra: number; re: number; rc: number;
}

/** Results of one Gummel–Poon evaluation; `dX_dvbe` etc. are partial derivatives. */
export interface GpPoint {
  ic: number; ib: number;
  dic_dvbe: number; dic_dvbc: number; dib_dvbe: number; dib_dvbc: number;
  qb: number;
  ibeIdeal: number; ibcIdeal: number;
}

export function gpParams(circuit: Circuit, el: Bjt, warn: (m: string) => void): GpParams {
  const model = findModel(circuit, el.name, el.model, ['NPN', 'PNP']);
  return gpParamsOfModel(model, el, circuit.temperatureC ?? NOMINAL_TEMPERATURE_C, warn);
}

function gpParamsOfModel(model: Model, el: Bjt, temperatureC: number, warn: (m: string) => void): GpParams {
  return gpParamsOf(readModelParams(model, BJT_PARAMS, temperatureC, warn), model, el);
}

function gpParamsOf(p: Record<string, number>, model: Model, el: Bjt): GpParams {
  const area = el.area === undefined ? 1 : requireNumber(el.name, 'area', el.area, 0, true);
  const who = `${el.name} (model ${model.name})`;
  for (const k of ['IS', 'BF', 'BR', 'NF', 'NR', 'NE', 'NC']) requireNumber(who, k, p[k], 0, true);
  for (const k of ['VAF', 'VAR', 'ISE', 'ISC', 'IKF', 'IKR', 'RB', 'RE', 'RC']) requireNumber(who, k, p[k], 0);
  const rb = p.RB / area;
  const rbm = Number.isNaN(p.RBM) ? rb : Math.min(requireNumber(who, 'RBM', p.RBM, 0) / area, rb);
  const inv = (v: number) => (v === 0 ? 0 : 1 / v);
  return {
    type: model.type === 'PNP' ? -1 : 1,
    is: p.IS * area, bf: p.BF, br: p.BR, nf: p.NF, nr: p.NR,
    invVaf: inv(p.VAF), invVar: inv(p.VAR),
    ise: p.ISE * area, ne: p.NE, isc: p.ISC * area, nc: p.NC,
    invIkf: inv(p.IKF * area), invIkr: inv(p.IKR * area),
    rbMin: rbm, rbExtra: rb - rbm, re: p.RE / area, rc: p.RC / area,
  };
}

/** Gummel–Poon collector and base currents (NPN sense) at junction voltages vbe, vbc. */
export function gummelPoon(m: GpParams, vbe: number, vbc: number, vt: number, gmin: number, out: GpPoint, j: Float64Array): void {
  junction(vbe, m.is, m.nf * vt, j);
  const cbe = j[0], gbe = j[1];
  junction(vbc, m.is, m.nr * vt, j);
  const cbc = j[0], gbc = j[1];
  let cben = 0, gben = 0, cbcn = 0, gbcn = 0;
  if (m.ise > 0) {
    junction(vbe, m.ise, m.ne * vt, j);
    cben = j[0];
    gben = j[1];
  }
  if (m.isc > 0) {
    junction(vbc, m.isc, m.nc * vt, j);
    cbcn = j[0];
    gbcn = j[1];
  }
  cben += gmin * vbe;
  gben += gmin;
  cbcn += gmin * vbc;
  gbcn += gmin;

  // Base charge; guard the Early factor so an extreme iterate cannot divide by ~0 or flip sign.
  const early = Math.max(1 - m.invVaf * vbc - m.invVar * vbe, 1e-3);
  const q1 = 1 / early;
  const dq1dvbe = early > 1e-3 ? q1 * q1 * m.invVar : 0;
  const dq1dvbc = early > 1e-3 ? q1 * q1 * m.invVaf : 0;
  let qb: number, dqbdvbe: number, dqbdvbc: number;
  if (m.invIkf === 0 && m.invIkr === 0) {
    qb = q1;
    dqbdvbe = dq1dvbe;
    dqbdvbc = dq1dvbc;
  } else {
    const q2 = m.invIkf * cbe + m.invIkr * cbc;
    const arg = Math.max(0, 1 + 4 * q2);
    const sq = arg > 0 ? Math.sqrt(arg) : 1;
    const half = (1 + sq) / 2;
    qb = q1 * half;
    const dsq_dvbe = arg > 0 ? (2 * m.invIkf * gbe) / sq : 0;
    const dsq_dvbc = arg > 0 ? (2 * m.invIkr * gbc) / sq : 0;
    dqbdvbe = dq1dvbe * half + (q1 * dsq_dvbe) / 2;
    dqbdvbc = dq1dvbc * half + (q1 * dsq_dvbc) / 2;
  }

  const transport = (cbe - cbc) / qb;
  out.ic = transport - cbc / m.br - cbcn;
  out.ib = cbe / m.bf + cben + cbc / m.br + cbcn;
  out.dic_dvbe = gbe / qb - (transport * dqbdvbe) / qb;
  out.dic_dvbc = -gbc / qb - (transport * dqbdvbc) / qb - gbc / m.br - gbcn;
  out.dib_dvbe = gbe / m.bf + gben;
  out.dib_dvbc = gbc / m.br + gbcn;
  out.qb = qb;
  out.ibeIdeal = cbe;
  out.ibcIdeal = cbc;
}

export function createBjt(el: Bjt, alloc: Allocator, circuit: Circuit): Device {
  const model = findModel(circuit, el.name, el.model, ['NPN', 'PNP']);
  const temperatureC = circuit.temperatureC ?? NOMINAL_TEMPERATURE_C;
  // This device's own copy, changed in place by set().
  const params = readModelParams(model, BJT_PARAMS, temperatureC, alloc.warn);
  let m = gpParamsOf(params, model, el);
  let vcrit = criticalVoltage(m.is, thermalVoltage(temperatureC));
  const c = alloc.node(el.nodes[0]);
  const b = alloc.node(el.nodes[1]);
  const e = alloc.node(el.nodes[2]);
  const ci = m.rc > 0 ? alloc.internal(el.name, 'collector') : c;
  const bi = m.rbMin + m.rbExtra > 0 ? alloc.internal(el.name, 'base') : b;
  const ei = m.re > 0 ? alloc.internal(el.name, 'emitter') : e;
  let gc = m.rc > 0 ? 1 / m.rc : 0;
  let ge = m.re > 0 ? 1 / m.re : 0;
  const t = m.type;
  const pt: GpPoint = { ic: 0, ib: 0, dic_dvbe: 0, dic_dvbc: 0, dib_dvbe: 0, dib_dvbc: 0, qb: 1, ibeIdeal: 0, ibcIdeal: 0 };
  const j = new Float64Array(2);
  let vbeOld = 0;
  let vbcOld = 0;
  let pending = false;
  const at = (x: Float64Array, i: number) => (i < 0 ? 0 : x[i]);

  const baseConductance = (qb: number) => {
    const r = m.rbMin + m.rbExtra / qb;
    return r > 0 ? 1 / r : 0;
  };

  return {
    name: el.name,
    element: el,
    settable: settableParams(BJT_PARAMS),
    set(field: string, value: number): void {
      m = setParam(params, BJT_PARAMS, el.name, field, value, () => {
        const p = gpParamsOf(params, model, el);
        // Internal nodes exist only for nonzero RC, RB and RE; the compiled layout cannot change.
        if (p.rc > 0 !== m.rc > 0 || p.re > 0 !== m.re > 0 || p.rbMin + p.rbExtra > 0 !== m.rbMin + m.rbExtra > 0) {
          throw badValue(el.name, field, value, 'a value keeping each of RB, RE and RC zero or nonzero as compiled');
        }
        return p;
      });
      vcrit = criticalVoltage(m.is, thermalVoltage(temperatureC));
      gc = m.rc > 0 ? 1 / m.rc : 0;
      ge = m.re > 0 ? 1 / m.re : 0;
    },
    seed(x: Float64Array | null): void {
      if (x) {
        vbeOld = t * (at(x, bi) - at(x, ei));
        vbcOld = t * (at(x, bi) - at(x, ci));
        pending = false;
      } else {
        vbeOld = vcrit;
        vbcOld = 0;
        pending = true;
      }
    },
    stamp(s: Stamper, ctx: StampContext): void {
      let vbe: number, vbc: number;
      if (pending) {
        vbe = vbeOld;
        vbc = vbcOld;
        pending = false;
      } else {
        vbe = t * (at(ctx.x, bi) - at(ctx.x, ei));
        vbc = t * (at(ctx.x, bi) - at(ctx.x, ci));
        if (ctx.limit) {
          const lbe = limitJunction(vbe, vbeOld, ctx.vt * m.nf, vcrit);
          const lbc = limitJunction(vbc, vbcOld, ctx.vt * m.nr, vcrit);
          if (lbe !== vbe || lbc !== vbc) ctx.limited++;
          vbe = lbe;
          vbc = lbc;
        }
      }
      vbeOld = vbe;
      vbcOld = vbc;
      gummelPoon(m, vbe, vbc, ctx.vt, ctx.gmin, pt, j);
      // Collector current flows ci → ei through the device, base current bi → ei (NPN sense; × t for PNP).
      s.transconductance(ci, ei, bi, ei, pt.dic_dvbe);
      s.transconductance(ci, ei, bi, ci, pt.dic_dvbc);
      s.current(ci, ei, t * (pt.ic - pt.dic_dvbe * vbe - pt.dic_dvbc * vbc));
      s.transconductance(bi, ei, bi, ei, pt.dib_dvbe);
      s.transconductance(bi, ei, bi, ci, pt.dib_dvbc);
      s.current(bi, ei, t * (pt.ib - pt.dib_dvbe * vbe - pt.dib_dvbc * vbc));
      if (gc > 0) s.conductance(c, ci, gc);
      if (ge > 0) s.conductance(e, ei, ge);
      if (bi !== b) {
        // RB with RBM: the base-charge dependence is treated as fixed within one iteration, as SPICE does.
        s.conductance(b, bi, baseConductance(pt.qb));
      }
    },
    terminalCurrents(x: Float64Array, ctx: StampContext): number[] {
      const vbe = t * (at(x, bi) - at(x, ei));
      const vbc = t * (at(x, bi) - at(x, ci));
      gummelPoon(m, vbe, vbc, ctx.vt, ctx.gmin, pt, j);
      const ic = t * pt.ic;
      const ib = t * pt.ib;
      return [ic, ib, -(ic + ib)];
    },
    region(x: Float64Array, ctx: StampContext): JunctionRegion {
      const vbe = t * (at(x, bi) - at(x, ei));
      const vbc = t * (at(x, bi) - at(x, ci));
      gummelPoon(m, vbe, vbc, ctx.vt, ctx.gmin, pt, j);
      // A junction conducts above CONDUCTING_CURRENT; the collector junction counts as forward
      // once it injects 1e-4 of what the emitter junction does (Vce' below about 9·Vt, ≈ 0.24 V).
      const beOn = pt.ibeIdeal >= CONDUCTING_CURRENT;
      const bcOn = pt.ibcIdeal >= Math.max(CONDUCTING_CURRENT, SATURATION_RATIO * pt.ibeIdeal);
      if (beOn && bcOn) return 'saturated';
      if (beOn) return 'active';
      if (bcOn) return 'reverse-active';
      return 'cutoff';
    },
  };
}
