import { beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { buildCircuit, bundledBoardFiles, loadBoard } from '../../../src/board/index.js';
import { potResistances, solveDC, type Circuit, type Element } from '../../../src/circuit/index.js';
import { parseNetlist, spiceNodeNames, writeNetlist } from '../../../src/circuit/spice/index.js';
import { REFERENCE, ngspiceOp, startNgspice } from '../../reference/ngspice.js';
import { referenceNetlists } from '../../reference/reference-netlists.js';

const roundTrip = (circuit: Circuit) => parseNetlist(writeNetlist(circuit)).circuit;
const linesOf = (text: string) => text.split('\n').filter((l) => l && !l.startsWith('*'));

describe('writeNetlist round trips', () => {
  it.each(referenceNetlists().map((n) => [n.file, n.circuit] as const))('%s: netlist -> Circuit -> netlist -> Circuit is stable', (_f, circuit) => {
    const text = writeNetlist(circuit);
    const again = parseNetlist(text).circuit;
    expect(again).toEqual(circuit);
    expect(writeNetlist(again)).toBe(text);
  });

  const boardCases = bundledBoardFiles().flatMap((file) => {
    const board = loadBoard(file);
    return board.conditions.map((c) => [`${file.split('/').pop()} ${c.id}`, file, c.id] as const);
  });
  it.each(boardCases)('board %s: board -> Circuit -> netlist -> Circuit gives the same Circuit', (_n, file, condition) => {
    const { circuit } = buildCircuit(loadBoard(file), condition);
    expect(roundTrip(circuit)).toEqual(circuit);
  });

  it('round-trips random resistor networks with sources exactly (property)', () => {
    const node = fc.constantFrom('0', 'a', 'b', 'c', '+12v', '-12v', 'e', 'out', 'gnd_sense');
    const value = fc.double({ min: 1e-3, max: 1e9, noNaN: true });
    const element = fc.oneof(
      fc.record({ kind: fc.constant('resistor' as const), nodes: fc.tuple(node, node), value }),
      fc.record({ kind: fc.constant('capacitor' as const), nodes: fc.tuple(node, node), value, leakage: fc.option(fc.double({ min: 1e-12, max: 1, noNaN: true }), { nil: undefined }) }),
      fc.record({ kind: fc.constant('vsource' as const), nodes: fc.tuple(node, node), dc: fc.double({ min: -100, max: 100, noNaN: true }).map((v) => v + 0) }),
      fc.record({ kind: fc.constant('isource' as const), nodes: fc.tuple(node, node), dc: fc.double({ min: -1, max: 1, noNaN: true }).map((v) => v + 0) }),
    );
    fc.assert(
      fc.property(fc.array(element, { minLength: 1, maxLength: 12 }), (raw) => {
        const elements = raw.map((e, i) => {
          const { leakage, ...rest } = e as typeof e & { leakage?: number };
          return { ...rest, name: `${i % 2 ? 'x' : e.kind[0]}${i}`, ...(leakage !== undefined ? { leakage } : {}) } as Element;
        });
        const circuit: Circuit = { title: 'random network', elements, models: {} };
        expect(roundTrip(circuit)).toEqual(circuit);
      }),
      { numRuns: 200 },
    );
  });
});

describe('writeNetlist forms', () => {
  const circuit: Circuit = {
    title: 'forms\nwith a line break',
    elements: [
      { kind: 'vsource', name: 'vrail_pos12', nodes: ['+12v', '0'], dc: 12, ac: { mag: 1, phaseDeg: 90 } },
      { kind: 'pot', name: 'rv1', nodes: ['+12v', 'w', '0'], value: 100e3, position: 0.3, taper: 'log' },
      { kind: 'switch', name: 'sw1', nodes: ['w', 'e', 'x'], positions: { on: [[0, 1]], off: [[0, 2]] }, position: 'on', ron: 0.02 },
      { kind: 'capacitor', name: 'c1', nodes: ['e', '0'], value: 10e-6, leakage: 1e-5 },
      { kind: 'diode', name: 'led1', nodes: ['e', 'x'], model: 'led-red' },
      { kind: 'resistor', name: 'r1', nodes: ['x', '0'], value: 1e3, powerRating: 0.25 },
    ],
    models: { 'led-red': { name: 'led-red', type: 'D', params: { IS: 4.352e-9, N: 1.906, RS: 0.6458 } } },
  };
  const text = writeNetlist(circuit);
  const spice = linesOf(text);

  it('keeps the title on the first line', () => {
    expect(text.split('\n')[0]).toBe('forms with a line break');
  });

  it('renames nodes SPICE expressions would misread and says so for the reader', () => {
    const names = spiceNodeNames(circuit);
    expect(names.get('+12v')).toBe('n_p12v');
    expect(names.get('e')).toBe('n_e'); // "e" is a constant in ngspice expressions
    expect(names.get('w')).toBe('w');
    expect(text).toContain('*@node n_p12v +12v');
  });

  it('writes a pot as the two resistances potResistances gives', () => {
    const [aw, wb] = potResistances(circuit.elements[1] as Extract<Element, { kind: 'pot' }>);
    expect(spice).toContain(`rv1_aw n_p12v w ${aw}`);
    expect(spice).toContain(`rv1_wb w 0 ${wb}`);
  });

  it('writes only the closed contacts of a switch', () => {
    expect(spice).toContain('rsw1_0_1 w n_e 0.02');
    expect(spice.some((l) => l.startsWith('rsw1_0_2'))).toBe(false);
  });

  it('writes capacitor leakage as a parallel resistor and a D element for a part named led1', () => {
    expect(spice).toContain('c1 n_e 0 0.00001');
    expect(spice).toContain(`rc1_leak n_e 0 ${1 / 1e-5}`);
    expect(spice).toContain('dled1 n_e x m_ledmred');
    expect(spice).toContain('.model m_ledmred d(is=4.352e-9 n=1.906 rs=0.6458)');
  });

  it('writes sources with their AC spec, the node shunt, .op and .end', () => {
    expect(spice).toContain('vrail_pos12 n_p12v 0 dc 12 ac 1 90');
    expect(spice.slice(-3)).toEqual(['.options rshunt=1000000000000', '.op', '.end']);
    expect(writeNetlist(circuit, { analyses: ['.ac dec 10 10 100k'], gshunt: 0 }).trimEnd().split('\n').slice(-2)).toEqual(['.ac dec 10 10 100k', '.end']);
  });

  it('reads back to the same circuit', () => {
    expect(parseNetlist(text).circuit).toEqual(circuit); // the title's line break is kept in a *@title annotation
  });

  it('writes .nodeset guesses under SPICE node names, continued every six nodes', () => {
    const guessed = writeNetlist(circuit, { nodeset: { '+12v': 12, w: 3, e: 1, x: 0.5, '0': 0, unknown: 7 } });
    expect(guessed).toContain('.nodeset v(n_p12v)=12 v(w)=3 v(n_e)=1 v(x)=0.5\n');
    expect(parseNetlist(guessed).warnings.some((w) => /\.nodeset ignored/.test(w))).toBe(true);
  });
});

describe(`written netlists run in ${REFERENCE} and agree with solveDC`, () => {
  beforeAll(() => startNgspice(), 30_000);

  it('pot, switch, leakage, renamed nodes and an LED-named diode', async () => {
    const circuit: Circuit = {
      title: 'written forms in the reference simulator',
      elements: [
        { kind: 'vsource', name: 'vrail', nodes: ['+12v', '0'], dc: 12 },
        { kind: 'pot', name: 'rv1', nodes: ['+12v', 'w', '0'], value: 100e3, position: 0.3, taper: 'log' },
        { kind: 'switch', name: 'sw1', nodes: ['w', 'e', 'x'], positions: { on: [[0, 1]], off: [[0, 2]] }, position: 'on', ron: 0.02 },
        { kind: 'capacitor', name: 'c1', nodes: ['e', '0'], value: 10e-6, leakage: 1e-5 },
        { kind: 'diode', name: 'led1', nodes: ['e', 'x'], model: '1n4148' },
        { kind: 'resistor', name: 'r1', nodes: ['x', '0'], value: 1e3, powerRating: 0.25 },
      ],
      models: { '1n4148': { name: '1n4148', type: 'D', params: { IS: 4.352e-9, N: 1.906, RS: 0.6458 } } },
    };
    const ours = solveDC(circuit);
    const names = spiceNodeNames(circuit);
    const ref = await ngspiceOp(writeNetlist(circuit));
    for (const node of ['+12v', 'w', 'e', 'x']) {
      const theirs = ref.nodes[names.get(node)!];
      expect(Math.abs(ours.nodes[node] - theirs), node).toBeLessThanOrEqual(Math.max(1e-4, 1e-4 * Math.abs(theirs)));
    }
    // The switch in "on" joins w to e; the leakage (100 kΩ) and the diode branch load them.
    expect(ours.nodes.e).toBeGreaterThan(ours.nodes.x);
  });

  it('non-ASCII text (a title with a dash and Ω, a node named µ) is written as ASCII, runs, and reads back exactly', async () => {
    // The in-process ngspice never returns from a netlist with non-ASCII characters: found by trying.
    const circuit: Circuit = {
      title: 'Board — 10 kΩ, ±12 V',
      elements: [
        { kind: 'vsource', name: 'v1', nodes: ['a', '0'], dc: 1 },
        { kind: 'resistor', name: 'rµ', nodes: ['a', 'µ'], value: 1e3 },
        { kind: 'resistor', name: 'r2', nodes: ['µ', '0'], value: 1e3 },
      ],
      models: {},
    };
    const text = writeNetlist(circuit);
    expect(/[^\x00-\x7f]/.test(text)).toBe(false);
    expect(text.split('\n')[0]).toBe('Board - 10 kohm, +/-12 V');
    expect(parseNetlist(text).circuit).toEqual(circuit);
    const ref = await ngspiceOp(text);
    expect(ref.nodes[spiceNodeNames(circuit).get('µ')!]).toBeCloseTo(0.5, 9);
  });

  it('the raw golden netlists and their written form give ngspice the same answers', async () => {
    for (const entry of referenceNetlists().filter((n) => !n.circuit.elements.some((e) => e.kind === 'opamp'))) {
      const raw = await ngspiceOp(entry.text);
      const names = spiceNodeNames(entry.circuit);
      const written = await ngspiceOp(writeNetlist(entry.circuit, { gshunt: 0 }));
      for (const [node, v] of Object.entries(raw.nodes)) {
        expect(Math.abs(written.nodes[names.get(node) ?? node] - v), `${entry.file} ${node}`).toBeLessThanOrEqual(1e-9 + 1e-9 * Math.abs(v));
      }
    }
  }, 60_000);
});
