/**
 * A few hand-written circuits solved by us and by the reference simulator, with tight tolerances
 * on both sides, so the device laws (Gummel–Poon with leakage, high injection and base-resistance
 * modulation, zeners with N ≠ 1 and RS, the op-amp law in its SPICE form) are checked equation
 * by equation. Reference: ngspice 45 via eecircuit-engine 1.8.0 (tests/reference/ngspice.ts).
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { solveDC, solveAC, opampSpiceLines, type Circuit, type OpAmp } from '../../src/circuit/index.js';
import { REFERENCE, ngspiceAc, ngspiceOp, startNgspice } from '../reference/ngspice.js';
import { TL072_LIKE } from './helpers.js';

const op = (name: string, nodes: OpAmp['nodes'], vos = 0): OpAmp => ({ kind: 'opamp', name, nodes, params: { ...TL072_LIKE, vos } });
const u1 = op('u1', ['0', 'm', 'o', 'vp', 'vn'], 0.001);
const u2 = op('u2', ['0', 'm2', 'o2', 'vp', 'vn']);
const u3 = op('u3', ['in', 'o3', 'o3', 'vp', 'nc']);

const devices: Circuit = {
  title: 'devices',
  models: {
    d1n4148: { name: 'd1n4148', type: 'D', params: { IS: 4.352e-9, N: 1.906, RS: 0.6458 } },
    q: { name: 'q', type: 'NPN', params: { IS: 1e-14, BF: 200, VAF: 100, RB: 10, RE: 1, RC: 1, ISE: 1e-13, NE: 1.6, IKF: 0.05, BR: 3, VAR: 20, ISC: 1e-13, NC: 2, IKR: 0.1, RBM: 5 } },
    qp: { name: 'qp', type: 'PNP', params: { IS: 2e-14, BF: 150, VAF: 60, RB: 20, ISE: 5e-14, NE: 1.4, IKF: 0.08 } },
    z: { name: 'z', type: 'D', params: { IS: 1e-14, BV: 5.1, IBV: 1e-3, N: 1 } },
    z2: { name: 'z2', type: 'D', params: { IS: 1e-12, BV: 3.3, IBV: 5e-3, N: 1.5, RS: 2 } },
  },
  elements: [
    { kind: 'vsource', name: 'v1', nodes: ['a', '0'], dc: 10 },
    { kind: 'resistor', name: 'r3', nodes: ['a', 'd'], value: 1000 },
    { kind: 'diode', name: 'd1', nodes: ['d', '0'], model: 'd1n4148' },
    { kind: 'resistor', name: 'rz', nodes: ['a', 'zz'], value: 1000 },
    { kind: 'diode', name: 'dz', nodes: ['0', 'zz'], model: 'z' },
    { kind: 'resistor', name: 'rz2', nodes: ['a', 'zy'], value: 220 },
    { kind: 'diode', name: 'dz2', nodes: ['0', 'zy'], model: 'z2' },
    { kind: 'resistor', name: 'rb1', nodes: ['a', 'bb'], value: 47000 },
    { kind: 'resistor', name: 'rb2', nodes: ['bb', '0'], value: 10000 },
    { kind: 'resistor', name: 'rc', nodes: ['a', 'c'], value: 4700 },
    { kind: 'resistor', name: 're', nodes: ['e', '0'], value: 1000 },
    { kind: 'bjt', name: 'q1', nodes: ['c', 'bb', 'e'], model: 'q' },
    { kind: 'resistor', name: 'rsat', nodes: ['a', 'cs'], value: 1000 },
    { kind: 'resistor', name: 'rbs', nodes: ['a', 'bs'], value: 10000 },
    { kind: 'bjt', name: 'q2', nodes: ['cs', 'bs', '0'], model: 'q' },
    { kind: 'resistor', name: 'rpe', nodes: ['a', 'pe'], value: 2200 },
    { kind: 'resistor', name: 'rpb', nodes: ['pb', '0'], value: 220000 },
    { kind: 'resistor', name: 'rpc', nodes: ['pc', '0'], value: 2200 },
    { kind: 'bjt', name: 'q3', nodes: ['pc', 'pb', 'pe'], model: 'qp' },
    { kind: 'vsource', name: 'vp', nodes: ['vp', '0'], dc: 12 },
    { kind: 'vsource', name: 'vn', nodes: ['vn', '0'], dc: -12 },
    { kind: 'vsource', name: 'vin', nodes: ['in', '0'], dc: 0.5, ac: { mag: 1, phaseDeg: 0 } },
    { kind: 'resistor', name: 'ri', nodes: ['in', 'm'], value: 10000 },
    { kind: 'resistor', name: 'rf', nodes: ['m', 'o'], value: 100000 },
    { kind: 'capacitor', name: 'cf', nodes: ['m', 'o'], value: 1e-9 },
    u1,
    { kind: 'resistor', name: 'ri2', nodes: ['in', 'm2'], value: 1000 },
    { kind: 'resistor', name: 'rf2', nodes: ['m2', 'o2'], value: 100000 },
    u2,
    u3,
    { kind: 'resistor', name: 'rl3', nodes: ['o3', '0'], value: 10000 },
    { kind: 'capacitor', name: 'cc', nodes: ['in', 'bb'], value: 1e-6 },
    { kind: 'capacitor', name: 'ce', nodes: ['e', '0'], value: 1e-5 },
  ],
};

// The same circuit, written by hand for ngspice (models and element lines as a person would type them).
const netlist = `devices
v1 a 0 10
r3 a d 1000
d1 d 0 d1n4148
rz a zz 1000
dz 0 zz z
rz2 a zy 220
dz2 0 zy z2
rb1 a bb 47000
rb2 bb 0 10000
rc a c 4700
re e 0 1000
q1 c bb e q
rsat a cs 1000
rbs a bs 10000
q2 cs bs 0 q
rpe a pe 2200
rpb pb 0 220000
rpc pc 0 2200
q3 pc pb pe qp
vp vp 0 12
vn vn 0 -12
vin in 0 dc 0.5 ac 1 0
ri in m 10000
rf m o 100000
cf m o 1n
ri2 in m2 1000
rf2 m2 o2 100000
rl3 o3 0 10000
cc in bb 1u
ce e 0 10u
${[u1, u2, u3].flatMap(opampSpiceLines).join('\n')}
.model d1n4148 D(IS=4.352n N=1.906 RS=0.6458)
.model q NPN(IS=1e-14 BF=200 VAF=100 RB=10 RE=1 RC=1 ISE=1e-13 NE=1.6 IKF=0.05 BR=3 VAR=20 ISC=1e-13 NC=2 IKR=0.1 RBM=5)
.model qp PNP(IS=2e-14 BF=150 VAF=60 RB=20 ISE=5e-14 NE=1.4 IKF=0.08)
.model z D(IS=1e-14 BV=5.1 IBV=1e-3 N=1)
.model z2 D(IS=1e-12 BV=3.3 IBV=5e-3 N=1.5 RS=2)
.options reltol=1e-7
.op
.end
`;

describe(`solver vs ${REFERENCE}`, () => {
  beforeAll(() => startNgspice(), 30_000);

  it('operating point: diodes, zeners, NPN/PNP in every region, op-amps linear, saturated and on a missing rail', async () => {
    const ours = solveDC(devices, { reltol: 1e-7, gshunt: 0 });
    const ref = await ngspiceOp(netlist);
    expect(Object.keys(ref.nodes).length).toBeGreaterThan(15);
    const off: string[] = [];
    for (const [node, theirs] of Object.entries(ref.nodes)) {
      const mine = ours.nodes[node];
      if (!(Math.abs(mine - theirs) <= 1e-5 + 1e-6 * Math.abs(theirs))) off.push(`${node}: ours ${mine}, ngspice ${theirs}`);
    }
    expect(off, off.join('\n')).toEqual([]);
    for (const name of ['v1', 'vp', 'vn', 'vin']) {
      expect(ours.sourceCurrents[name]).toBeCloseTo(ref.sourceCurrents[name], 7);
    }
    expect(ours.junctions).toMatchObject({ dz: 'breakdown', dz2: 'breakdown', q1: 'active', q2: 'saturated', d1: 'forward' });
  });

  it('small-signal AC at three frequencies', async () => {
    const opPoint = solveDC(devices, { reltol: 1e-7, gshunt: 0 });
    for (const f of [100, 1591.5, 20e3]) {
      const ours = solveAC(devices, f, { op: opPoint });
      const ref = await ngspiceAc(netlist, f);
      for (const [node, theirs] of Object.entries(ref)) {
        const mine = ours.nodes[node];
        expect(Math.abs(mine.mag - theirs.mag), `${node} at ${f} Hz`).toBeLessThanOrEqual(1e-4 * theirs.mag + 1e-9);
        if (theirs.mag > 1e-6) expect(Math.abs(mine.phaseDeg - theirs.phaseDeg), `${node} phase at ${f} Hz`).toBeLessThanOrEqual(0.01);
      }
    }
  });
});
