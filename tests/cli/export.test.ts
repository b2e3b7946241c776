import { beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { run } from '../../src/cli/run.js';
import { memoryIo } from '../../src/cli/io.js';
import { DEMO_BOARD_FILE, buildCircuit, bundledBoardFiles, loadBoard } from '../../src/board/index.js';
import { solveDC } from '../../src/circuit/index.js';
import { parseNetlist, spiceNodeNames } from '../../src/circuit/spice/index.js';
import { REFERENCE, ngspiceOp, startNgspice } from '../reference/ngspice.js';

async function exportCmd(...args: string[]) {
  const io = memoryIo();
  const code = await run(['export', ...args], io);
  return { code, out: io.out(), err: io.err() };
}

describe('voltwalk export', () => {
  it('writes the demo board by default, under its quiescent condition, and it reads back to the same circuit', async () => {
    const r = await exportCmd('--format', 'spice');
    expect(r.code).toBe(0);
    expect(r.err).toBe('');
    expect(r.out.split('\n')[0]).toMatch(/ - quiescent: /); // ASCII on the title line…
    expect(parseNetlist(r.out).circuit.title).toMatch(/ — quiescent: /); // …the original kept for the reader
    expect(r.out.trimEnd().endsWith('.end')).toBe(true);
    const built = buildCircuit(loadBoard(DEMO_BOARD_FILE), 'quiescent').circuit;
    const { circuit } = parseNetlist(r.out);
    expect(circuit.elements).toEqual(built.elements);
    expect(circuit.models).toEqual(built.models);
  });

  it('carries our operating point as .nodeset unless --no-nodeset', async () => {
    expect((await exportCmd('--format', 'spice')).out).toMatch(/^\.nodeset v\(/m);
    expect((await exportCmd('--format', 'spice', '--no-nodeset')).out).not.toMatch(/\.nodeset/);
  });

  it('--board and --condition choose the board and its set-up', async () => {
    const other = bundledBoardFiles().find((f) => f !== DEMO_BOARD_FILE)!;
    const board = loadBoard(other);
    const condition = board.conditions.filter((c) => c.powered).at(-1)!;
    const r = await exportCmd('--board', other, '--format', 'spice', '--condition', condition.id);
    expect(r.code).toBe(0);
    expect(parseNetlist(r.out).circuit.elements).toEqual(buildCircuit(board, condition.id).circuit.elements);
  });

  it('voltwalk solve reads an exported netlist back to the board\'s operating point', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'voltwalk-export-'));
    try {
      writeFileSync(join(dir, 'tamp.cir'), (await exportCmd('--format', 'spice')).out);
      const io = memoryIo({ cwd: dir });
      expect(await run(['solve', 'tamp.cir', '--json'], io)).toBe(0);
      const json = JSON.parse(io.out());
      const fromNetlist = json.nodes as Record<string, number>;
      const fromBoard = solveDC(buildCircuit(loadBoard(DEMO_BOARD_FILE), 'quiescent').circuit).nodes;
      expect(Object.keys(fromNetlist).sort()).toEqual(Object.keys(fromBoard).sort());
      for (const [node, v] of Object.entries(fromBoard)) expect(fromNetlist[node], node).toBeCloseTo(v, 9);
      // The .nodeset line is ngspice's starting guess; the reader says it ignores it.
      expect(json.warnings.some((w: string) => /\.nodeset ignored/.test(w))).toBe(true);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });

  it('an unknown or missing format is a usage error, exit 2', async () => {
    const r = await exportCmd('--format', 'pdf');
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/unknown --format "pdf" \(accepted: spice\)/);
    expect((await exportCmd()).code).toBe(2);
    expect((await exportCmd('--format', 'spice', 'stray')).code).toBe(2);
  });

  it('a bad board file or condition is an input error, exit 1', async () => {
    expect((await exportCmd('--board', 'no-such-board.json', '--format', 'spice')).code).toBe(1);
    const r = await exportCmd('--format', 'spice', '--condition', 'nope');
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/no condition "nope"/);
  });
});

describe(`voltwalk export runs in ${REFERENCE}`, () => {
  beforeAll(() => startNgspice(), 30_000);

  it('the exported demo board gives ngspice the operating point voltwalk solve gives', async () => {
    const r = await exportCmd('--format', 'spice', '--condition', 'dc-above');
    const ref = await ngspiceOp(r.out);
    const circuit = buildCircuit(loadBoard(DEMO_BOARD_FILE), 'dc-above').circuit;
    const ours = solveDC(circuit);
    const names = spiceNodeNames(circuit);
    for (const [node, v] of Object.entries(ours.nodes)) {
      if (node === '0') continue;
      const theirs = ref.nodes[names.get(node) ?? node];
      expect(Math.abs(v - theirs), node).toBeLessThanOrEqual(Math.max(1e-4, 1e-4 * Math.abs(theirs)));
    }
  }, 60_000);
});
