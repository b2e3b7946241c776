/**
 * Kirchhoff's current law at every circuit node, with each device's true (non-linearised)
 * terminal currents: the residual check that decides convergence and is reported with the answer.
 * A node passes when |Σ currents| ≤ reltol·Σ|currents| + abstol.
 */
import type { CompiledCircuit } from './compile.js';
import type { StampContext } from './devices/device.js';
import { GROUND } from './netlist.js';

export interface KclViolation {
  node: string;
  index: number;
  residual: number;
  tolerance: number;
}

export class KclChecker {
  private readonly cc: CompiledCircuit;
  private readonly terminalIndex: Int32Array[];
  readonly sum: Float64Array;
  readonly mag: Float64Array;

  constructor(cc: CompiledCircuit) {
    this.cc = cc;
    this.terminalIndex = cc.devices.map((d) =>
      Int32Array.from(d.element.nodes.map((node) => (node === GROUND ? -1 : cc.nodeIndex.get(node)!))),
    );
    this.sum = new Float64Array(cc.size);
    this.mag = new Float64Array(cc.size);
  }

  /** Fills sum/mag; returns the nodes that fail. `shunt` is the conductance to ground on every node. */
  check(x: Float64Array, ctx: StampContext, shunt: number, reltol: number, abstol: number): KclViolation[] {
    const { cc, sum, mag } = this;
    sum.fill(0);
    mag.fill(0);
    for (let k = 0; k < cc.devices.length; k++) {
      const currents = cc.devices[k].terminalCurrents(x, ctx);
      const idx = this.terminalIndex[k];
      for (let t = 0; t < idx.length; t++) {
        const i = idx[t];
        if (i < 0) continue;
        sum[i] += currents[t];
        mag[i] += Math.abs(currents[t]);
      }
    }
    const violations: KclViolation[] = [];
    for (const [node, i] of cc.nodeIndex) {
      const s = shunt * x[i];
      const residual = sum[i] + s;
      const tolerance = reltol * (mag[i] + Math.abs(s)) + abstol;
      if (!(Math.abs(residual) <= tolerance)) violations.push({ node, index: i, residual, tolerance });
    }
    return violations;
  }
}
