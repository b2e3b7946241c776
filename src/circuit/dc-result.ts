/**
 * Builds the DcSolution from a converged vector: node voltages, source currents, every element's
 * terminal currents and power by its own (non-linearised) law, junction regions, and a final KCL
 * check at every circuit node using those true currents.
 */
import type { CompiledCircuit } from './compile.js';
import type { StampContext } from './devices/device.js';
import type { DcSolution, ElementResult } from './dc-solution.js';
import type { ResolvedDcOptions } from './options.js';
import { GROUND } from './netlist.js';
import { KclChecker, type KclViolation } from './kcl.js';

export function buildDcSolution(
  cc: CompiledCircuit,
  x: Float64Array,
  opts: ResolvedDcOptions,
  strategy: DcSolution['strategy'],
  iterations: number,
): { solution: DcSolution; violations: KclViolation[] } {
  const ctx: StampContext = { x, vt: cc.vt, gmin: opts.gmin, sourceScale: 1, limit: false, limited: 0 };
  const at = (name: string) => {
    if (name === GROUND) return 0;
    const i = cc.nodeIndex.get(name);
    return i === undefined ? 0 : x[i];
  };
  const nodes: Record<string, number> = { [GROUND]: 0 };
  for (const [name, i] of cc.nodeIndex) nodes[name] = x[i];

  const elements: Record<string, ElementResult> = {};
  const sourceCurrents: Record<string, number> = {};
  const junctions: DcSolution['junctions'] = {};
  const warnings = [...cc.warnings];

  for (const d of cc.devices) {
    const el = d.element;
    const currents = d.terminalCurrents(x, ctx);
    let power = 0;
    el.nodes.forEach((node, k) => {
      power += at(node) * currents[k];
    });
    let current = currents[0];
    if (el.kind === 'opamp') current = -currents[2];
    const result: ElementResult = { current, power, terminalCurrents: currents };
    if (el.kind === 'resistor' && el.powerRating !== undefined && Math.abs(power) > el.powerRating) {
      result.overRating = true;
      warnings.push(`${el.name} dissipates ${power.toPrecision(3)} W, over its ${el.powerRating} W rating`);
    }
    elements[el.name] = result;
    if (el.kind === 'vsource' || el.kind === 'isource') sourceCurrents[el.name] = currents[0];
    if (d.region) junctions[el.name] = d.region(x, ctx);
  }

  const violations = new KclChecker(cc).check(x, ctx, opts.gshunt, opts.reltol, opts.abstol);

  const unknowns: Record<string, number> = {};
  cc.unknownNames.forEach((name, i) => {
    unknowns[name] = x[i];
  });

  return {
    solution: { converged: true, nodes, sourceCurrents, elements, junctions, strategy, iterations, warnings, unknowns },
    violations,
  };
}
