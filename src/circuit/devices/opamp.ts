/**
 * Behavioural op-amp with supply pins [in+, in−, out, V+, V−].
 *
 * The law (all voltages to ground):
 *   vd  = v(in+) − v(in−) + vos
 *   c   = (v(V+) + v(V−)) / 2                        centre of the supplies
 *   s   = v(V+) − v(V−) − 2·headroom                  room the output has to swing
 *   w   = (s + √(s² + δ²)) / 2                        s made smoothly positive (δ = SPAN_SMOOTHING)
 *   vo  = c + (w/2)·tanh((gain·vd − c) / (w/2))       ideal output, saturating short of each pin
 *   out = vo behind rout;  rin between the inputs
 *   supply current iq·tanh((v(V+) − v(V−)) / 1 V) from V+ to V−
 * With healthy rails vo ≈ gain·vd until it rounds off `headroom` volts inside each rail. If a rail
 * is missing the window collapses (w → 0⁺) and the output sits at the centre of what the pins
 * carry — stuck, as on a real board; reversed supplies (V+ ≤ V−) leave every term finite and
 * smooth. The supply current fades to zero with the supply, so a floating supply pin settles
 * instead of being driven off to huge voltages. The output current is returned through ground,
 * not drawn from the supply pins (a simplification; only iq is seen at the pins).
 */
import type { OpAmp, OpAmpParams } from '../netlist.js';
import type { Allocator, Device, StampContext } from './device.js';
import type { Stamper } from '../stamper.js';
import { badValue, requireNumber } from '../check-values.js';

/** δ in the smooth span: how sharply the output window closes as the supplies collapse, volts. */
export const SPAN_SMOOTHING = 0.1;
/** Supply voltage scale over which the quiescent current turns on, volts. */
export const IQ_KNEE = 1;
/**
 * Newton aid, not part of the law: when an iterate would carry the tanh argument from inside the
 * linear region to beyond ±DRIVE_EDGE, it is evaluated at ±DRIVE_EDGE instead, and when it would
 * jump from one side to beyond the other, at the centre. Deep in saturation tanh is flat to machine precision, and without this Newton sees no
 * gain and can bounce from rail to rail forever — the same reasoning as junction limiting.
 */
export const DRIVE_EDGE = 3;

/** The DC law reads every parameter but the noise densities. */
type OpAmpLaw = Omit<OpAmpParams, 'en' | 'in'>;

/** The law's values, each of which can be changed in place on a compiled op-amp. */
const LAW_FIELDS: readonly string[] = ['gain', 'rout', 'rin', 'headroom', 'iq', 'vos'];

/** Each law field checked as a compiled value: the field's lower bound, and whether it is strict. */
const LAW_CHECKS: Record<keyof OpAmpLaw, { min: number; strict: boolean }> = {
  gain: { min: 0, strict: true },
  rout: { min: 0, strict: true },
  rin: { min: 0, strict: true },
  headroom: { min: 0, strict: false },
  iq: { min: 0, strict: false },
  vos: { min: -Infinity, strict: false },
};

function checkedLawValue(element: string, field: keyof OpAmpLaw, value: unknown): number {
  // An ideal input (rin = ∞) is the one non-finite value the law accepts.
  if (field === 'rin' && value === Infinity) return Infinity;
  const { min, strict } = LAW_CHECKS[field];
  return requireNumber(element, `params.${field}`, value, min, strict);
}

function opampLaw(el: OpAmp): OpAmpLaw {
  const p = el.params;
  return {
    gain: checkedLawValue(el.name, 'gain', p.gain),
    rout: checkedLawValue(el.name, 'rout', p.rout),
    rin: checkedLawValue(el.name, 'rin', p.rin),
    headroom: checkedLawValue(el.name, 'headroom', p.headroom),
    iq: checkedLawValue(el.name, 'iq', p.iq),
    vos: checkedLawValue(el.name, 'vos', p.vos),
  };
}

const isLawField = (field: string): field is keyof OpAmpLaw => LAW_FIELDS.includes(field);

/** Output of the law and its partial derivatives with respect to in+, in−, V+, V−. */
export interface OpAmpPoint {
  vo: number;
  dInp: number;
  dInn: number;
  dVp: number;
  dVn: number;
}

export function opampOutput(law: OpAmpLaw, vinp: number, vinn: number, vvp: number, vvn: number, out: OpAmpPoint): void {
  const vd = vinp - vinn + law.vos;
  const c = (vvp + vvn) / 2;
  const s = vvp - vvn - 2 * law.headroom;
  const r = Math.hypot(s, SPAN_SMOOTHING);
  // Two algebraically equal forms of (s + r)/2; the second avoids cancellation when s ≪ 0.
  const w = s >= 0 ? (s + r) / 2 : (SPAN_SMOOTHING * SPAN_SMOOTHING) / (2 * (r - s));
  const dw_ds = w / r; // = (1 + s/r)/2
  const hh = w / 2;
  const u = (law.gain * vd - c) / hh;
  const th = Math.tanh(u);
  const sech2 = 1 - th * th;
  out.vo = c + hh * th;
  out.dInp = law.gain * sech2;
  out.dInn = -law.gain * sech2;
  const dvo_dc = th * th;
  const dvo_dhh = th - (sech2 === 0 ? 0 : u * sech2);
  const dhh_ds = dw_ds / 2;
  out.dVp = dvo_dc / 2 + dvo_dhh * dhh_ds;
  out.dVn = dvo_dc / 2 - dvo_dhh * dhh_ds;
}

export function createOpAmp(el: OpAmp, alloc: Allocator): Device {
  // This device's own copy, changed in place by set() (tolerance loops set values per sample).
  const law = opampLaw(el);
  const [inp, inn, out, vp, vn] = el.nodes.map((n) => alloc.node(n));
  let gout = 1 / law.rout;
  let gin = law.rin === Infinity ? 0 : 1 / law.rin;
  const pt: OpAmpPoint = { vo: 0, dInp: 0, dInn: 0, dVp: 0, dVn: 0 };
  const at = (x: Float64Array, i: number) => (i < 0 ? 0 : x[i]);
  let uOld = 0;
  // The tanh argument and half-window of the last drive() call (kept here: stamping runs every
  // Newton iteration, and a returned pair would be garbage each time).
  let driveU = 0;
  let driveHh = 0;
  const drive = (vinp: number, vinn: number, vvp: number, vvn: number): void => {
    const c = (vvp + vvn) / 2;
    const sp = vvp - vvn - 2 * law.headroom;
    const r = Math.hypot(sp, SPAN_SMOOTHING);
    const hh = (sp >= 0 ? (sp + r) / 2 : (SPAN_SMOOTHING * SPAN_SMOOTHING) / (2 * (r - sp))) / 2;
    driveU = (law.gain * (vinp - vinn + law.vos) - c) / hh;
    driveHh = hh;
  };

  const evaluate = (x: Float64Array) => opampOutput(law, at(x, inp), at(x, inn), at(x, vp), at(x, vn), pt);
  const supplyCurrent = (x: Float64Array) => law.iq * Math.tanh((at(x, vp) - at(x, vn)) / IQ_KNEE);

  return {
    name: el.name,
    element: el,
    settable: LAW_FIELDS,
    set(field: string, value: number): void {
      if (!isLawField(field)) throw badValue(el.name, 'field', field, LAW_FIELDS.map((f) => `"${f}"`).join(', '));
      law[field] = checkedLawValue(el.name, field, value);
      gout = 1 / law.rout;
      gin = law.rin === Infinity ? 0 : 1 / law.rin;
    },
    seed(x: Float64Array | null): void {
      if (x) drive(at(x, inp), at(x, inn), at(x, vp), at(x, vn));
      uOld = x ? driveU : 0;
    },
    stamp(s: Stamper, ctx: StampContext): void {
      const x = ctx.x;
      let vinp = at(x, inp);
      const vinn = at(x, inn);
      drive(vinp, vinn, at(x, vp), at(x, vn));
      const u = driveU;
      const hh = driveHh;
      let uUsed = u;
      const towards = uOld * Math.sign(u);
      if (ctx.limit && Math.abs(u) > DRIVE_EDGE && towards < DRIVE_EDGE) {
        // Coming from the other side: evaluate at the centre, where the gain is full.
        uUsed = towards < 0 ? 0 : Math.sign(u) * DRIVE_EDGE;
        // Evaluate as if the + input sat where the drive is exactly at the edge.
        vinp += ((uUsed - u) * hh) / law.gain;
        ctx.limited++;
      }
      uOld = uUsed;
      opampOutput(law, vinp, vinn, at(x, vp), at(x, vn), pt);
      // Norton form of "vo behind rout": current vo/rout from ground into out, rout from out to ground.
      s.conductance(out, -1, gout);
      const gi = gout * pt.dInp, gn = gout * pt.dInn, gp = gout * pt.dVp, gv = gout * pt.dVn;
      s.matrix(out, inp, -gi);
      s.matrix(out, inn, -gn);
      s.matrix(out, vp, -gp);
      s.matrix(out, vn, -gv);
      const lin = gi * vinp + gn * vinn + gp * at(x, vp) + gv * at(x, vn);
      s.current(-1, out, gout * pt.vo - lin);
      s.conductance(inp, inn, gin);
      const vs = at(x, vp) - at(x, vn);
      const th = Math.tanh(vs / IQ_KNEE);
      const gq = (law.iq * (1 - th * th)) / IQ_KNEE;
      s.conductance(vp, vn, gq);
      s.current(vp, vn, law.iq * th - gq * vs);
    },
    terminalCurrents(x: Float64Array): number[] {
      evaluate(x);
      const iin = gin * (at(x, inp) - at(x, inn));
      const iout = gout * (at(x, out) - pt.vo);
      const iq = supplyCurrent(x);
      return [iin, -iin, iout, iq, -iq];
    },
  };
}

function num(x: number): string {
  return Number.isFinite(x) ? String(x) : '1e30';
}

/**
 * The same law as ngspice lines: rin, a B-source output current vo/rout into out with rout to
 * ground, and a B-source supply current. Element names are derived from the op-amp's name.
 */
export function opampSpiceLines(el: OpAmp): string[] {
  const law = opampLaw(el);
  const [inp, inn, out, vp, vn] = el.nodes;
  const n = el.name;
  const d = num(SPAN_SMOOTHING);
  const s = `(v(${vp})-v(${vn})-${num(2 * law.headroom)})`;
  const hh = `(0.25*(${s}+sqrt(${s}*${s}+${d}*${d})))`;
  const c = `((v(${vp})+v(${vn}))/2)`;
  const vd = `(v(${inp})-v(${inn})+(${num(law.vos)}))`;
  const vo = `(${c}+${hh}*tanh((${num(law.gain)}*${vd}-${c})/${hh}))`;
  const lines = [
    `* op-amp ${n}: in+ ${inp}, in- ${inn}, out ${out}, V+ ${vp}, V- ${vn}`,
    `B${n}_o 0 ${out} I=${vo}/${num(law.rout)}`,
    `R${n}_o ${out} 0 ${num(law.rout)}`,
    `B${n}_q ${vp} ${vn} I=${num(law.iq)}*tanh((v(${vp})-v(${vn}))/${num(IQ_KNEE)})`,
  ];
  if (law.rin !== Infinity) lines.splice(1, 0, `R${n}_i ${inp} ${inn} ${num(law.rin)}`);
  return lines;
}
