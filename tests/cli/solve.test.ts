import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { run } from '../../src/cli/run.js';
import { memoryIo } from '../../src/cli/io.js';
import { DEMO_BOARD_FILE, buildCircuit, loadBoard } from '../../src/board/index.js';
import { solveDC } from '../../src/circuit/index.js';

let dir: string;
const file = (name: string, text: string) => {
  writeFileSync(join(dir, name), text);
  return name;
};

async function solve(...args: string[]) {
  const io = memoryIo({ cwd: dir });
  const code = await run(['solve', ...args], io);
  return { code, out: io.out(), err: io.err() };
}

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'voltwalk-solve-'));
  // Divider: 12 V across 1k + 2k gives 8 V and 4 mA (Ohm's law).
  file('divider.cir', 'divider\nV1 in 0 dc 12\nR1 in out 1k\nR2 out 0 2k\n.end\n');
  // First-order RC low-pass at its corner f = 1/(2πRC): magnitude 1/√2 (−3.01 dB), phase −45° (textbook).
  file('rc.cir', `rc\nV1 in 0 dc 0 ac 1\nR1 in out 1k\nC1 out 0 100n\n.end\n`);
  file('loop.cir', 'two sources in parallel\nV1 a 0 1\nV2 a 0 2\nR1 a 0 1k\n.end\n');
  file('bad.cir', 'bad\nV1 in 0 dc 12\nM1 d g s s nmos\n.end\n');
  file('other.json', '{"format": "something-else/2"}');
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('voltwalk solve', () => {
  it('prints a node table with units for a netlist', async () => {
    const r = await solve('divider.cir');
    expect(r.code).toBe(0);
    const lines = r.out.split('\n');
    expect(lines[0]).toBe('divider');
    expect(lines).toContain('in        12 V');
    expect(lines).toContain('out        8 V');
    expect(lines).toContain('v1         -4 mA');
    expect(r.err).toBe('');
  });

  it('--json gives the DC contract: converged, nodes and source currents by lower-case name', async () => {
    const r = await solve('divider.cir', '--json');
    expect(r.code).toBe(0);
    const json = JSON.parse(r.out);
    expect(json.converged).toBe(true);
    expect(Object.keys(json.nodes).sort()).toEqual(['0', 'in', 'out']);
    expect(json.nodes.out).toBeCloseTo(8, 6); // the solver's 1e-12 S node shunt moves it by nanovolts
    expect(json.sourceCurrents.v1 * 1e3).toBeCloseTo(-4, 6); // SPICE sense: 4 mA flows out of the + terminal
    expect(json.warnings).toEqual([]);
  });

  it('--ac gives magnitude and phase; at the RC corner 1/√2 and −45°', async () => {
    const corner = 1 / (2 * Math.PI * 1e3 * 100e-9);
    const r = await solve('rc.cir', '--ac', String(corner), '--json');
    expect(r.code).toBe(0);
    const json = JSON.parse(r.out);
    expect(Math.abs(json.frequency / corner - 1)).toBeLessThan(1e-9);
    expect(json.nodes.out.mag).toBeCloseTo(Math.SQRT1_2, 6);
    expect(json.nodes.out.phaseDeg).toBeCloseTo(-45, 6);
    expect(Object.keys(json.nodes.out).sort()).toEqual(['mag', 'phaseDeg']);
    const text = await solve('rc.cir', '--ac', '1k');
    expect(text.out).toMatch(/small-signal at 1(\.000)? kHz/);
    expect(text.out).toMatch(/^out .*dB .*°$/m);
  });

  it('warns when --ac finds no source with an AC spec', async () => {
    const r = await solve('divider.cir', '--ac', '1k');
    expect(r.code).toBe(0);
    expect(r.err).toMatch(/warning: no source has an AC spec/);
  });

  it('solves a board file under its quiescent condition by default, and under --condition', async () => {
    const board = loadBoard(DEMO_BOARD_FILE);
    const r = await solve(DEMO_BOARD_FILE, '--json');
    expect(r.code).toBe(0);
    const expected = solveDC(buildCircuit(board, 'quiescent').circuit);
    expect(JSON.parse(r.out).nodes).toEqual(JSON.parse(JSON.stringify(expected.nodes)));
    const other = board.conditions.find((c) => c.powered && c.id !== 'quiescent')!;
    const r2 = await solve(DEMO_BOARD_FILE, '--condition', other.id, '--json');
    expect(JSON.parse(r2.out).nodes).toEqual(JSON.parse(JSON.stringify(solveDC(buildCircuit(board, other.id).circuit).nodes)));
    const text = await solve(DEMO_BOARD_FILE);
    expect(text.out.split('\n')[0]).toMatch(/— quiescent: /);
  });

  it('an unknown condition names the accepted ones, exit 1', async () => {
    const r = await solve(DEMO_BOARD_FILE, '--condition', 'quiesent');
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/has no condition "quiesent".*accepted: one of .*quiescent/);
  });

  it('malformed netlists and missing files are one-line errors, exit 1', async () => {
    const bad = await solve('bad.cir');
    expect(bad.code).toBe(1);
    expect(bad.err.trim().split('\n')).toHaveLength(1);
    expect(bad.err).toMatch(/bad\.cir: line 3: "M1": element letter M is not supported/);
    const missing = await solve('nowhere.cir');
    expect(missing.code).toBe(1);
    expect(missing.err).toMatch(/nowhere\.cir: no such file/);
    const json = await solve('other.json');
    expect(json.code).toBe(1);
    expect(json.err).toMatch(/without "format": "voltwalk-board\/1"/);
  });

  it('a circuit with no operating point is a clear error, exit 1; in --json mode the error is JSON', async () => {
    const r = await solve('loop.cir');
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/loop\.cir: .*(did not converge|no unique operating point)/);
    expect(r.err).not.toMatch(/\n\s+at /);
    const j = await solve('loop.cir', '--json');
    expect(j.code).toBe(1);
    expect(JSON.parse(j.err).errors[0].code).toMatch(/^solve\./);
  });

  it('usage mistakes exit 2', async () => {
    expect((await solve()).code).toBe(2);
    expect((await solve('divider.cir', '--condition', 'quiescent')).code).toBe(2);
    expect((await solve('divider.cir', '--ac', 'loud')).code).toBe(2);
    expect((await solve('divider.cir', '--ac', '0')).code).toBe(2);
    expect((await solve('divider.cir', '--frobnicate')).code).toBe(2);
  });
});
