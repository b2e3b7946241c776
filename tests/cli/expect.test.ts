import { mkdtempSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { run } from '../../src/cli/run.js';
import { memoryIo } from '../../src/cli/io.js';
import { SMALL_BOARD } from '../circuit/analysis/fixtures/small-board.js';
import { DEMO_BOARD_FILE, loadBoard } from '../../src/board/index.js';
import { boardFigures, detectorTimeBand, hissBand, idleDraw, type BoardFigures } from '../../src/circuit/analysis/index.js';

let boardFile: string;
let cacheDir: string;
beforeAll(() => {
  const dir = mkdtempSync(join(tmpdir(), 'voltwalk-expect-'));
  boardFile = join(dir, 'small.json');
  cacheDir = join(dir, 'cache');
  writeFileSync(boardFile, JSON.stringify(SMALL_BOARD, null, 2));
});

// Every run keeps its report in a cache folder of the test's own, never in the person's home.
const io = () => memoryIo({ env: { VOLTWALK_CACHE_DIR: cacheDir } });
const expectCmd = async (...args: string[]) => {
  const out = io();
  const code = await run(['expect', '--board', boardFile, '--samples', '50', ...args], out);
  return { code, out: out.out(), err: out.err() };
};

describe('voltwalk expect', () => {
  it('writes the JSON contract: every test point under every condition, with nominal, band and unit', async () => {
    const { code, out } = await expectCmd('--json');
    expect(code).toBe(0);
    const { testPoints } = JSON.parse(out) as { testPoints: Array<Record<string, unknown>> };
    // 6 voltage points × 2 powered conditions + 1 resistance point unpowered
    expect(testPoints).toHaveLength(13);
    const tp1 = testPoints.find((t) => t.id === 'TP1' && t.condition === 'quiescent')!;
    expect(Object.keys(tp1)).toEqual(['id', 'node', 'condition', 'nominal', 'min', 'max', 'unit', 'mcLow', 'mcHigh']);
    // textbook divider 12 V · 4.7k / 14.7k
    expect(tp1).toMatchObject({ node: 'div1', unit: 'V' });
    expect(tp1.nominal as number).toBeCloseTo((12 * 4.7) / 14.7, 6);
    expect(tp1.min as number).toBeLessThan(tp1.nominal as number);
    expect(testPoints.find((t) => t.id === 'TP6')).toMatchObject({ condition: 'unpowered', unit: 'Ω' });
  });

  it('prints a bench table for one condition, values in engineering notation', async () => {
    const { code, out } = await expectCmd('--condition', 'quiescent');
    expect(code).toBe(0);
    expect(out).toContain('Powered, knobs in the middle [quiescent]');
    expect(out).not.toContain('[release-max]');
    expect(out).toMatch(/TP1 +divider +3\.84 V +3\.78 V … 3\.89 V +3\.\d+ V … 3\.\d+ V/);
    expect(out).toContain('99 % of boards');
  });

  it('recomputes with a substituted part', async () => {
    const { out } = await expectCmd('--json', '--condition', 'quiescent', '--set', 'R1=22k');
    const tp1 = (JSON.parse(out) as { testPoints: Array<{ id: string; nominal: number }> }).testPoints.find((t) => t.id === 'TP1')!;
    expect(tp1.nominal).toBeCloseTo((12 * 4.7) / 26.7, 6);
  });

  it('names an unknown condition and the accepted ones in one line, exit 1', async () => {
    const { code, err } = await expectCmd('--condition', 'loud');
    expect(code).toBe(1);
    expect(err.trim().split('\n')).toHaveLength(1);
    expect(err).toMatch(/no condition "loud".*quiescent, release-max, unpowered/);
  });

  it('treats a malformed --set or --samples as a usage error (exit 2) and a bad part or value as bad input (exit 1)', async () => {
    expect((await expectCmd('--set', 'R1')).code).toBe(2);
    expect((await expectCmd('--samples', 'many')).code).toBe(2);
    const unknown = await expectCmd('--set', 'R99=1k');
    expect(unknown.code).toBe(1);
    expect(unknown.err).toMatch(/R99/);
    const bad = await expectCmd('--set', 'R1=banana');
    expect(bad.code).toBe(1);
    expect(bad.err.trim().split('\n')).toHaveLength(1);
  });

  it('refuses a missing board file with a one-line error', async () => {
    const r = io();
    expect(await run(['expect', '--board', '/nonexistent/board.json'], r)).toBe(1);
    expect(r.err()).toMatch(/no such file/);
  });

  it('keeps the report for the next run with the same board and options, and ignores a damaged copy', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'voltwalk-expect-cache-'));
    const cmd = async (...args: string[]) => {
      const r = memoryIo({ env: { VOLTWALK_CACHE_DIR: dir } });
      const code = await run(['expect', '--board', boardFile, '--samples', '50', '--json', ...args], r);
      expect(code).toBe(0);
      return { out: r.out(), first: (JSON.parse(r.out()) as { testPoints: Array<{ nominal: number }> }).testPoints[0] };
    };
    const reports = () => readdirSync(dir).filter((f) => f.startsWith('expect-'));
    const first = await cmd('--seed', '7');
    const [file] = reports();
    expect(reports()).toEqual([file]);
    // The same options read the kept copy: a number changed in it shows in the output.
    const data = JSON.parse(readFileSync(join(dir, file), 'utf8'));
    data.report.bands[0].nominal = 123.456;
    writeFileSync(join(dir, file), JSON.stringify(data));
    expect((await cmd('--seed', '7')).first.nominal).toBe(123.456);
    // --no-cache computes anew and leaves the folder as it was; other options are another file.
    expect((await cmd('--seed', '7', '--no-cache')).first.nominal).toBe(first.first.nominal);
    expect(reports()).toEqual([file]);
    await cmd('--seed', '8');
    expect(reports()).toHaveLength(2);
    // A damaged copy is computed again and rewritten, never an error.
    writeFileSync(join(dir, file), '{"format": "voltwalk-expect/1", "report": {"bands": [{"id": 3}]}}');
    expect((await cmd('--seed', '7')).out).toBe(first.out);
    writeFileSync(join(dir, file), 'not json');
    expect((await cmd('--seed', '7')).out).toBe(first.out);
    expect(JSON.parse(readFileSync(join(dir, file), 'utf8')).format).toBe('voltwalk-expect/1');
  });

  it("ends the whole-board report with the board's other figures, each as the analyses work it out, and keeps them too", async () => {
    const dir = mkdtempSync(join(tmpdir(), 'voltwalk-expect-figures-'));
    const cmd = async (...args: string[]) => {
      const r = memoryIo({ env: { VOLTWALK_CACHE_DIR: dir } });
      expect(await run(['expect', '--board', boardFile, '--samples', '0', ...args], r)).toBe(0);
      return r.out();
    };
    const board = loadBoard(boardFile);
    const { figures } = JSON.parse(await cmd('--json')) as { figures: BoardFigures };
    expect(figures.idleDraw).toEqual({ condition: 'quiescent', rails: idleDraw(board, 'quiescent') });
    const release = detectorTimeBand(board, 'release', 'slowest');
    expect(figures.detector?.release.slowest).toEqual({ nominal: release.nominal, min: release.min, max: release.max });
    // R6 100 kΩ + RV2's whole 1 MΩ track with C1 1 µF: 1.1 s × ln 9, by hand.
    expect(figures.detector!.release.slowest.nominal).toBeCloseTo(1.1 * Math.log(9), 6);
    const hiss = hissBand(board, 'TP7', 'quiescent');
    expect(figures.hiss).toMatchObject({ testPoint: 'TP7', condition: 'quiescent', nominal: hiss.nominal, min: hiss.min, max: hiss.max });
    // No condition of this board carries a test signal: there is no gain to give.
    expect(figures.gain).toBeUndefined();
    const text = await cmd();
    expect(text).toContain('Other figures (worked out from the parts; bands over their tolerances)');
    expect(text).toMatch(/^  release time, 10–90 % +fast end 220 ms \(196 ms … 244 ms\), slow end 2\.42 s \(1\.78 s … 3\.14 s\)$/m);
    expect(text).toMatch(/^  hiss at TP7 \[quiescent\] +9\.7 µV \(4\.4 µV … 19\.4 µV\) rms, -98\.0 dBu$/m);
    // Kept: a figure changed in the kept file shows in the next run; one condition alone has no figures.
    const kept = readdirSync(dir).find((f) => f.startsWith('figures-'))!;
    const data = JSON.parse(readFileSync(join(dir, kept), 'utf8'));
    data.figures.hiss.dBu = -1;
    writeFileSync(join(dir, kept), JSON.stringify(data));
    expect(await cmd()).toContain('rms, -1.0 dBu');
    expect(await cmd('--condition', 'quiescent')).not.toContain('Other figures');
  });

  it('works on when the cache folder cannot be made (a file is in its way)', async () => {
    const r = memoryIo({ env: { VOLTWALK_CACHE_DIR: join(boardFile, 'cache') } });
    expect(await run(['expect', '--board', boardFile, '--samples', '20', '--json'], r)).toBe(0);
    expect(r.err()).toBe('');
    expect(JSON.parse(r.out()).testPoints.length).toBeGreaterThan(0);
  });
});

describe('voltwalk expect on the demo board', () => {
  it('words a narrow rail band with enough figures to keep its ends apart', async () => {
    const r = io();
    expect(await run(['expect', '--condition', 'quiescent', '--samples', '0'], r)).toBe(0);
    // The +12 V rail after its protection diode spans about 11.74 V to 11.80 V: three figures
    // would print "11.7 V … 11.8 V", and a reading of 11.70 V would look inside it.
    expect(r.out()).toMatch(/TP1 +\+12 V rail after D1 +11\.77 V +11\.74 V … 11\.80 V/);
  }, 120_000);

  it('gives the makeup range as the gain difference between its knob ends: ×3.5 is 20·log10(3.5) = 10.88 dB', () => {
    // The demo kit's makeup stage runs from unity to ×3.5 (its conditions say so); the decibels of a
    // voltage ratio are 20·log10 of it (textbook).
    const figures = boardFigures(loadBoard(DEMO_BOARD_FILE));
    const db = (c: string) => figures.gain!.conditions.find((g) => g.condition === c)!.db;
    expect(figures.gain!.testPoint).toBe('TP26');
    expect(db('makeup-max') - db('makeup-min')).toBeCloseTo(20 * Math.log10(3.5), 1);
    // Above the threshold the VCA turns the gain down; with the sidechain high-pass in, DC no longer reaches the detector.
    expect(db('dc-above')).toBeLessThan(db('dc-below') - 1);
    expect(db('sidechain-hp')).toBeCloseTo(db('dc-below'), 0);
  }, 120_000);
});
