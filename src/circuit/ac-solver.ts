/**
 * Small-signal AC analysis: the circuit linearised at its DC operating point and solved with
 * complex phasors. The real part of the system is the DC Jacobian at the operating point (every
 * device's companion conductances, taken without junction limiting); capacitors add jωC,
 * inductors −jωL on their branch rows, and independent sources with an `ac` spec drive it.
 *
 * Devices contribute no capacitance of their own: diode and transistor junction and diffusion
 * capacitances (CJO, CJE, CJC, TF, …) are ignored, as is any op-amp roll-off — the op-amp is flat
 * at its DC gain. That is fine for the audio band with discrete capacitors dominating, and wrong
 * well above it.
 */
import type { Circuit } from './netlist.js';
import { GROUND } from './netlist.js';
import { createDcSolver, type DcSolver } from './dc-solver.js';
import type { DcSolution } from './dc-solution.js';
import { resolveDcOptions } from './options.js';
import { ComplexStamper } from './complex-stamper.js';
import { ComplexSparseLu } from './complex-sparse-lu.js';
import { badValue } from './check-values.js';

export interface AcPhasor {
  re: number;
  im: number;
  mag: number;
  phaseDeg: number;
}

export interface AcSolution {
  frequency: number;
  nodes: Record<string, AcPhasor>;
}

export interface AcOptions {
  /** The operating point to linearise at; solved here when absent. */
  op?: DcSolution;
}

export interface AcSolver {
  readonly op: DcSolution;
  /** How many pivot plans the complex factorisation has made (re-plans show up here). */
  readonly plansMade: () => number;
  solve(frequencyHz: number): AcSolution;
}

function phasor(re: number, im: number): AcPhasor {
  return { re, im, mag: Math.hypot(re, im), phaseDeg: (Math.atan2(im, re) * 180) / Math.PI };
}

/** Linearises once, then solves at any number of frequencies. */
export function createAcSolver(circuit: Circuit, options: AcOptions = {}, dc: DcSolver = createDcSolver(circuit)): AcSolver {
  // Re-solving from the given operating point settles in an iteration or two and yields every
  // internal unknown consistently.
  const op = dc.solve({ initial: options.op });
  const cc = dc.compiled;
  const n = cc.size;
  const opts = resolveDcOptions();
  const x = dc.x.slice();
  dc.engine.stampAt(x, opts, 0, 1, false);
  const jacobian = dc.engine.stamper.a.slice();
  const lu = new ComplexSparseLu(n, cc.pattern, cc.positions);
  const cs = new ComplexStamper(n);

  return {
    op,
    plansMade: () => lu.plansMade,
    solve(frequencyHz: number): AcSolution {
      if (typeof frequencyHz !== 'number' || !Number.isFinite(frequencyHz) || frequencyHz < 0) {
        throw badValue('ac', 'frequency', frequencyHz, 'a frequency in hertz ≥ 0');
      }
      const omega = 2 * Math.PI * frequencyHz;
      cs.re.set(jacobian);
      cs.im.fill(0);
      cs.bRe.fill(0);
      cs.bIm.fill(0);
      for (const d of cc.devices) {
        if (!d.stampAc) continue;
        cs.owner = d.name;
        d.stampAc(cs, omega);
      }
      const { re, im } = lu.solve(cs.re, cs.im, cs.bRe, cs.bIm);
      const nodes: Record<string, AcPhasor> = { [GROUND]: phasor(0, 0) };
      for (const [name, i] of cc.nodeIndex) nodes[name] = phasor(re[i], im[i]);
      return { frequency: frequencyHz, nodes };
    },
  };
}

export function solveAC(circuit: Circuit, frequencyHz: number, options: AcOptions = {}): AcSolution {
  return createAcSolver(circuit, options).solve(frequencyHz);
}
