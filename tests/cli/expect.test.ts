import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { run } from '../../src/cli/run.js';
import { memoryIo } from '../../src/cli/io.js';
import { SMALL_BOARD } from '../circuit/analysis/fixtures/small-board.js';

let boardFile: string;
beforeAll(() => {
  const dir = mkdtempSync(join(tmpdir(), 'voltwalk-expect-'));
  boardFile = join(dir, 'small.json');
  writeFileSync(boardFile, JSON.stringify(SMALL_BOARD, null, 2));
});

const expectCmd = async (...args: string[]) => {
  const io = memoryIo();
  const code = await run(['expect', '--board', boardFile, '--samples', '50', ...args], io);
  return { code, out: io.out(), err: io.err() };
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
    const io = memoryIo();
    expect(await run(['expect', '--board', '/nonexistent/board.json'], io)).toBe(1);
    expect(io.err()).toMatch(/no such file/);
  });
});

describe('voltwalk expect on the demo board', () => {
  it('words a narrow rail band with enough figures to keep its ends apart', async () => {
    const io = memoryIo();
    expect(await run(['expect', '--condition', 'quiescent', '--samples', '0'], io)).toBe(0);
    // The +12 V rail after its protection diode spans about 11.74 V to 11.80 V: three figures
    // would print "11.7 V … 11.8 V", and a reading of 11.70 V would look inside it.
    expect(io.out()).toMatch(/TP1 +\+12 V rail after D1 +11\.77 V +11\.74 V … 11\.80 V/);
  }, 120_000);
});
