/**
 * Every bundled board, under every powered condition, written as a netlist by our writer and run
 * by the reference simulator: the board's operating point must be ngspice's at every node.
 * This checks the board as a whole circuit (pots, switches, op-amps, LEDs, transistors together),
 * and that the writer's netlist runs in ngspice unmodified.
 * Reference: ngspice 45 via eecircuit-engine 1.8.0. Agreement: 0.1 mV or 1e-4 of the value.
 *
 * On the demo board ngspice's own gmin and source stepping fail from 0 V (found by trying; Debian's
 * ngspice 39 fails the same way, blaming the 1N5817 protection diode), so for that board ngspice is
 * started from our solution with `.nodeset`. That run shows our point satisfies ngspice's equations
 * to its tolerances and is where its Newton settles — not that ngspice would have found it unaided.
 * Which boards need the help is itself checked, once per board, so a change either way is noticed.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { basename } from 'node:path';
import { buildCircuit, bundledBoardFiles, loadBoard } from '../../src/board/index.js';
import { solveDC } from '../../src/circuit/index.js';
import { spiceNodeNames, writeNetlist } from '../../src/circuit/spice/index.js';
import { NgspiceError, REFERENCE, ngspiceOp, startNgspice } from './ngspice.js';

/** Boards on which ngspice needs our operating point as its starting guess. */
const NEEDS_NODESET = new Set(['wenlow-tamp.json']);
// A failing ngspice run spends tens of seconds in its transient fallback before giving up.
const SLOW = 180_000;

const boards = bundledBoardFiles().map((file) => {
  const board = loadBoard(file);
  return { name: basename(file), board, powered: board.conditions.filter((c) => c.powered).map((c) => c.id) };
});
const cases = boards.flatMap((b) => b.powered.map((condition) => [`${b.name} ${condition}`, b, condition] as const));

describe(`bundled boards vs ${REFERENCE}`, () => {
  beforeAll(() => startNgspice(), 30_000);

  it('there is at least one bundled board with powered conditions', () => {
    expect(cases.length).toBeGreaterThan(0);
  });

  it.each(boards.filter((b) => b.powered.length > 0).map((b) => [b.name, b] as const))(
    '%s: ngspice finds the first powered condition alone unless listed as needing a nodeset',
    async (name, b) => {
      const { circuit } = buildCircuit(b.board, b.powered[0]);
      const alone = await ngspiceOp(writeNetlist(circuit)).then(
        () => true,
        (error) => {
          if (error instanceof NgspiceError) return false;
          throw error;
        },
      );
      expect(alone).toBe(!NEEDS_NODESET.has(name));
    },
    SLOW,
  );

  it.each(cases)(
    '%s',
    async (_name, b, condition) => {
      const { circuit } = buildCircuit(b.board, condition);
      const ours = solveDC(circuit);
      const rename = spiceNodeNames(circuit);
      const ref = await ngspiceOp(writeNetlist(circuit, NEEDS_NODESET.has(b.name) ? { nodeset: ours.nodes } : {}));
      const off: string[] = [];
      for (const [node, mine] of Object.entries(ours.nodes)) {
        if (node === '0') continue;
        const theirs = ref.nodes[rename.get(node) ?? node];
        expect(theirs, `ngspice reports node ${node}`).toBeTypeOf('number');
        if (!(Math.abs(mine - theirs) <= Math.max(1e-4, 1e-4 * Math.abs(theirs)))) off.push(`${node}: ours ${mine} V, ngspice ${theirs} V`);
      }
      expect(off, off.join('\n')).toEqual([]);
    },
    SLOW,
  );
});
