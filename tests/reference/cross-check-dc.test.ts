/**
 * Our DC operating point against the reference simulator, node by node, on the golden netlists in
 * tests/reference/netlists (diodes, LEDs, NPN/PNP bias, a differential pair, mirrors, op-amp
 * stages in and out of saturation, ladders, a zener regulator, a 66-node mesh).
 * Reference: ngspice 45 via eecircuit-engine 1.8.0, default options (reltol 1e-3, gmin 1e-12, 27 °C).
 * Agreement required: 0.1 mV or 1e-4 of the value, whichever is larger, at every node; source
 * currents to 1e-4 of the value or 1 nA.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { solveDC } from '../../src/circuit/index.js';
import { REFERENCE, startNgspice } from './ngspice.js';
import { referenceNetlists, referenceOp } from './reference-netlists.js';

const netlists = referenceNetlists();

describe(`DC operating point vs ${REFERENCE}`, () => {
  beforeAll(() => startNgspice(), 30_000);

  it('has at least 15 golden netlists, one of them over 60 nodes', () => {
    expect(netlists.length).toBeGreaterThanOrEqual(15);
    const sizes = netlists.map((n) => new Set(n.circuit.elements.flatMap((e) => e.nodes)).size);
    expect(Math.max(...sizes)).toBeGreaterThan(60);
  });

  it.each(netlists.map((n) => [n.file, n] as const))('%s', async (_file, entry) => {
    const ours = solveDC(entry.circuit);
    const ref = await referenceOp(entry);
    const nodes = Object.keys(ours.nodes).filter((n) => n !== '0');
    expect(nodes.length).toBeGreaterThan(0);
    const off: string[] = [];
    for (const node of nodes) {
      const theirs = ref.nodes[node];
      expect(theirs, `ngspice reports node ${node}`).toBeTypeOf('number');
      const allowed = Math.max(1e-4, 1e-4 * Math.abs(theirs));
      const diff = Math.abs(ours.nodes[node] - theirs);
      if (!(diff <= allowed)) off.push(`${node}: ours ${ours.nodes[node]} V, ngspice ${theirs} V (off by ${diff.toExponential(2)})`);
    }
    for (const [source, theirs] of Object.entries(ref.sourceCurrents)) {
      const mine = ours.sourceCurrents[source];
      if (mine === undefined) continue; // ngspice also lists currents of sources inside written op-amp lines
      const allowed = Math.max(1e-9, 1e-4 * Math.abs(theirs));
      if (!(Math.abs(mine - theirs) <= allowed)) off.push(`i(${source}): ours ${mine} A, ngspice ${theirs} A`);
    }
    expect(off, off.join('\n')).toEqual([]);
  });
});
