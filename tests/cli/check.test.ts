import { describe, expect, it } from 'vitest';
import { chmodSync, mkdirSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { run } from '../../src/cli/run.js';
import { memoryIo } from '../../src/cli/io.js';

const fixtures = join(import.meta.dirname, '../fixtures/boards');
const io = () => memoryIo({ cwd: fixtures });

describe('voltwalk check', () => {
  it('a valid board: exit 0 and one "ok" line', async () => {
    const out = io();
    expect(await run(['check', 'small-amp.json'], out)).toBe(0);
    expect(out.out()).toBe('ok  small-amp.json  (board small-amp: 19 parts, 8 test points, 3 conditions)\n');
    expect(out.err()).toBe('');
  });
  it('an invalid board: exit 1, each problem on its own line with file, path and accepted form, no stack trace', async () => {
    const out = io();
    expect(await run(['check', 'broken-bad-value.json'], out)).toBe(1);
    const lines = out.out().trimEnd().split('\n');
    expect(lines).toHaveLength(4);
    for (const line of lines) expect(line).toMatch(/^broken-bad-value\.json: parts\[\d+\]\.value: .+ \(accepted: .+\)$/);
    expect(out.err()).toBe('voltwalk check: 4 problems in 1 of 1 file\n');
    expect(out.out() + out.err()).not.toMatch(/\n\s+at /);
  });
  it('several files: valid ones say ok, the exit code says whether all were', async () => {
    const out = io();
    expect(await run(['check', 'small-amp.json', 'broken-syntax.json', 'broken-role-target.json'], out)).toBe(1);
    expect(out.out().split('\n').filter(Boolean)).toEqual([
      'ok  small-amp.json  (board small-amp: 19 parts, 8 test points, 3 conditions)',
      "broken-syntax.json: line 5, column 3: not valid JSON: Expected ',' or '}' after property value (accepted: JSON: double-quoted keys and strings, commas between items, none after the last)",
      'broken-role-target.json: roles.testPoints.detector-output: no test point "TP9" — did you mean "TP1"? (accepted: a test point id: TP1, TP2, TP3, TP4, TP5, TP6, TP7, TP8)',
    ]);
    expect(out.err()).toBe('voltwalk check: 2 problems in 2 of 3 files\n');
  });
  it('a folder stands for every .json file in it and its subfolders, named under the folder as typed', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'voltwalk-check-'));
    const board = readFileSync(join(fixtures, 'small-amp.json'), 'utf8');
    mkdirSync(join(dir, 'kits', 'sub'), { recursive: true });
    writeFileSync(join(dir, 'kits', 'b.json'), board);
    writeFileSync(join(dir, 'kits', 'sub', 'a.json'), '{"format": ');
    writeFileSync(join(dir, 'kits', 'notes.txt'), 'not checked');
    const out = memoryIo({ cwd: dir });
    expect(await run(['check', 'kits'], out)).toBe(1);
    const lines = out.out().split('\n').filter(Boolean);
    expect(lines).toHaveLength(2);
    expect(lines[0]).toBe('ok  kits/b.json  (board small-amp: 19 parts, 8 test points, 3 conditions)');
    expect(lines[1]).toMatch(/^kits\/sub\/a\.json: .*not valid JSON/);
    expect(out.err()).toBe('voltwalk check: 1 problem in 1 of 2 files\n');
  });

  it('names a folder it cannot read in one line', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'voltwalk-check-'));
    mkdirSync(join(dir, 'locked'));
    chmodSync(join(dir, 'locked'), 0o000);
    try {
      const out = memoryIo({ cwd: dir });
      // Run as root the folder stays readable (and empty): then it is reported as a folder, not a file.
      const code = await run(['check', 'locked'], out);
      expect(code).toBe(1);
      const said = (out.out() + out.err()).trim().split('\n');
      expect(said[0]).toMatch(/^(voltwalk: )?locked: (folder cannot be read \(permission denied\)|is a folder, not a file) \(accepted: /);
      expect(out.out() + out.err()).not.toMatch(/\n\s+at /);
    } finally {
      chmodSync(join(dir, 'locked'), 0o755);
    }
  });
  it('--json: the same verdicts as data', async () => {
    const out = io();
    expect(await run(['check', 'small-amp.json', 'broken-dangling-net.json', '--json'], out)).toBe(1);
    const report = JSON.parse(out.out());
    expect(report.ok).toBe(false);
    expect(report.files.map((f: { file: string; kind: string; ok: boolean }) => [f.file, f.kind, f.ok])).toEqual([
      ['small-amp.json', 'board', true],
      ['broken-dangling-net.json', 'board', false],
    ]);
    expect(report.files[1].problems[0]).toMatchObject({ code: 'board.dangling-net', path: 'parts[13].pins.2', file: 'broken-dangling-net.json' });
  });
  it('a missing file and a file of another format are input problems (exit 1)', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'vw-check-'));
    writeFileSync(join(dir, 'other.json'), '{"format": "something-else/1"}');
    const out = memoryIo({ cwd: dir });
    expect(await run(['check', 'nothing.json', 'other.json'], out)).toBe(1);
    const lines = out.out().trimEnd().split('\n');
    expect(lines[0]).toBe('nothing.json: no such file (accepted: a readable board file (JSON, "format": "voltwalk-board/1"))');
    expect(lines[1]).toBe('other.json: format: unknown format "something-else/1" (accepted: "format": "voltwalk-board/1" or "format": "voltwalk-tree/1")');
  });
  it('a tree file goes to the tree checker', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'vw-check-'));
    writeFileSync(join(dir, 'tree.json'), '{"format": "voltwalk-tree/1"}');
    const out = memoryIo({ cwd: dir });
    const code = await run(['check', 'tree.json', '--json'], out);
    const report = JSON.parse(out.out());
    expect(report.files[0].kind).toBe('tree');
    // An empty tree is not a valid tree, whatever the tree checker's wording.
    expect(code).toBe(1);
    expect(report.files[0].problems.length).toBeGreaterThan(0);
  });
  it('no file: usage error, exit 2', async () => {
    const out = io();
    expect(await run(['check'], out)).toBe(2);
    expect(out.err()).toContain('check needs at least one FILE');
  });
});
