import { beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { run } from '../../src/cli/run.js';
import { memoryIo } from '../../src/cli/io.js';
import { measureAll } from '../../src/board/index.js';
import { applyFault, clearDictionaryCache, faultsFor, RankResultSchema } from '../../src/diagnosis/index.js';
import { TINY_BOARD_INPUT, tinyBoard } from '../diagnosis/tiny-board.js';

let file: string;
let cacheDir: string;
let r2Open: Record<string, number>;
let r2OpenOff: Record<string, number>;

beforeAll(() => {
  const dir = mkdtempSync(join(tmpdir(), 'voltwalk-rank-'));
  file = join(dir, 'tiny.json');
  cacheDir = join(dir, 'cache');
  writeFileSync(file, JSON.stringify(TINY_BOARD_INPUT));
  const board = tinyBoard();
  const faulty = applyFault(board, faultsFor(board).find((f) => f.id === 'R2/open')!);
  r2Open = measureAll(faulty, 'quiescent');
  r2OpenOff = measureAll(faulty, 'unpowered');
});

const rank = async (...args: string[]) => {
  const io = memoryIo({ env: { VOLTWALK_CACHE_DIR: cacheDir } });
  const code = await run(['rank', '--board', file, ...args], io);
  return { code, out: io.out(), err: io.err() };
};

describe('voltwalk rank', () => {
  it('--json follows the contract: suspects with part, fault, probability, group, why; next probe', async () => {
    const { code, out } = await rank('--reading', `TP1=${r2Open.TP1.toFixed(2)}`, '--json');
    expect(code).toBe(0);
    const result = RankResultSchema.parse(JSON.parse(out));
    expect(result.suspects[0]).toMatchObject({ part: 'R2', fault: 'open', group: 1 });
    expect(result.suspects[0].why).toMatch(/^TP1 would read [\d.]+ V with R2 open \(healthy [\d.]+ V\); you read [\d.]+ V/);
    // The fault's own reading: some candidate foresees it.
    expect(result.unexplained).toBeUndefined();
    const total = result.suspects.reduce((a, s) => a + s.probability, 0);
    expect(total).toBeLessThanOrEqual(1.0001);
    if (result.next) {
      expect(result.next.testPoint).toMatch(/^TP\d+$/);
      expect(result.next.expectedInformationBits).toBeGreaterThan(0);
    }
  });

  it('says first when a reading fits no modelled fault: 20 V on a ±12 V board', async () => {
    const { code, out } = await rank('--reading', 'TP1=20', '--json');
    expect(code).toBe(0);
    const result = RankResultSchema.parse(JSON.parse(out));
    expect(result.unexplained).toHaveLength(1);
    expect(result.unexplained![0]).toMatchObject({ testPoint: 'TP1', condition: 'quiescent', value: 20 });
    const text = await rank('--reading', 'TP1=20');
    expect(text.out.indexOf('! TP1 = 20 V fits no single modelled fault')).toBeGreaterThan(0);
    expect(text.out.indexOf('! TP1 = 20 V')).toBeLessThan(text.out.indexOf('Suspects, most likely first'));
  });

  it('accepts values with units and readings from another condition', async () => {
    const mv = `${Math.round(r2Open.TP1 * 1000)}mV`;
    const kilohms = `${(r2OpenOff.TP5 / 1000).toFixed(2)}k`;
    const { code, out } = await rank('--reading', `TP1=${mv}`, '--reading', `unpowered:TP5=${kilohms}`, '--json');
    expect(code).toBe(0);
    expect(JSON.parse(out).suspects[0].part).toBe('R2');
  });

  it('text output lists suspects with their reasons and a caution before a powered probe', async () => {
    const { code, out } = await rank('--reading', `TP1=${r2Open.TP1.toFixed(2)}`);
    expect(code).toBe(0);
    expect(out).toMatch(/1\. R2 open +\d+ %/);
    expect(out).toContain('why: TP1 would read');
    const next = out.indexOf('Next probe:');
    if (next >= 0 && /under "powered"/.test(out)) expect(out.indexOf('Caution before this powered measurement')).toBeLessThan(next);
  });

  it('echoes a reading with the figures typed, and names group members in plain words', async () => {
    const { out } = await rank('--reading', 'TP1=11.77');
    expect(out).toContain('readings TP1 = 11.77 V (quiescent)');
    const json = RankResultSchema.parse(JSON.parse((await rank('--reading', 'TP1=11.77', '--json')).out));
    const suspects = new Map(json.suspects.map((s) => [s.id, s]));
    let checked = 0;
    for (const g of json.groups) {
      expect(g.labels).toHaveLength(g.members.length);
      g.members.forEach((id, k) => {
        const s = suspects.get(id);
        if (!s) return;
        expect(g.labels[k]).toBe(id === 'none' ? 'no fault' : `${s.part} ${s.fault}`);
        checked++;
      });
    }
    expect(checked).toBeGreaterThan(1);
    // The text lists the shared groups by those labels, never by ids such as "R2/open".
    const shared = json.groups.filter((g) => g.members.length > 1);
    const groupLines = out.split('\n').filter((l) => /^  group \d+ \(/.test(l));
    expect(groupLines).toHaveLength(shared.length);
    expect(shared.length).toBeGreaterThan(0);
    for (const line of groupLines) expect(line).not.toMatch(/[A-Z]+\d+\//);
  });

  it('--fault-seen leaves "no fault" out and gives its share to the faults in proportion', async () => {
    const reading = `TP1=${r2Open.TP1.toFixed(2)}`;
    const open = RankResultSchema.parse(JSON.parse((await rank('--reading', reading, '--json', '--limit', '50')).out));
    const seen = RankResultSchema.parse(JSON.parse((await rank('--reading', reading, '--json', '--limit', '50', '--fault-seen')).out));
    expect(open.suspects.map((s) => s.part)).toContain('none');
    expect(seen.suspects.map((s) => s.part)).not.toContain('none');
    const pNone = open.suspects.find((s) => s.part === 'none')!.probability;
    const r2 = (r: typeof open) => r.suspects.find((s) => s.id === 'R2/open')!.probability;
    expect(r2(seen)).toBeCloseTo(r2(open) / (1 - pNone), 3);
    expect((await rank('--reading', reading, '--fault-seen')).out).toContain('Suspects, most likely first (a fault was found, so "no fault" is left out):');
  });

  it('--set: a part as fitted changes what healthy means', async () => {
    const board = tinyBoard();
    const fitted = { ...board, parts: board.parts.map((p) => (p.ref === 'R2' ? { ...p, value: '5k6' } : p)) };
    const on = measureAll(fitted, 'quiescent');
    const off = measureAll(fitted, 'unpowered');
    const readings = [
      ...Object.entries(on).map(([tp, v]) => `${tp}=${v.toFixed(3)}`),
      ...Object.entries(off).map(([tp, v]) => `unpowered:${tp}=${v.toFixed(0)}`),
    ].flatMap((r) => ['--reading', r]);
    const json = async (...extra: string[]) => RankResultSchema.parse(JSON.parse((await rank(...extra, ...readings, '--json')).out));
    // Faults that leave every test point as it is stay with "no fault" in one group: that group leads.
    const asFitted = await json('--set', 'R2=5k6');
    expect(asFitted.groups[0].members).toContain('none');
    // Ranked against the drawing (4k7), the same readings point away from a healthy board.
    const asDrawn = await json();
    expect(asDrawn.groups[0].members).not.toContain('none');
  });

  it('keeps the dictionary for the next run, and a corrupt kept file is rebuilt, not an error', async () => {
    const first = await rank('--reading', 'TP1=8', '--json');
    const kept = readdirSync(cacheDir).filter((f) => f.endsWith('.json'));
    expect(kept.length).toBeGreaterThan(0);
    clearDictionaryCache(); // as a new process would start
    const again = await rank('--reading', 'TP1=8', '--json');
    expect(again.out).toBe(first.out);
    for (const f of kept) writeFileSync(join(cacheDir, f), '{"format": "voltwalk-dictionary/1", "hypo');
    clearDictionaryCache();
    const rebuilt = await rank('--reading', 'TP1=8', '--json');
    expect(rebuilt.code).toBe(0);
    expect(rebuilt.out).toBe(first.out);
  });

  const oneLine = (err: string) => err.trim().split('\n');

  it('an unknown test point is one line naming it, exit 1', async () => {
    const { code, err } = await rank('--reading', 'TP9=1');
    expect(code).toBe(1);
    expect(oneLine(err)).toHaveLength(1);
    expect(err).toMatch(/no test point "TP9"/);
  });

  it('an unknown condition is one line naming it, exit 1', async () => {
    const { code, err } = await rank('--reading', 'warm:TP1=1');
    expect(code).toBe(1);
    expect(oneLine(err)).toHaveLength(1);
    expect(err).toMatch(/no condition "warm"/);
  });

  it('a bad value names the reading and the accepted form, exit 1', async () => {
    const { code, err } = await rank('--reading', 'TP1=4.2x');
    expect(code).toBe(1);
    expect(oneLine(err)).toHaveLength(1);
    expect(err).toMatch(/--reading TP1: "4.2x" is not a value.*accepted: a voltage reading/);
  });

  it('a resistance test point under a powered condition is refused, naming both', async () => {
    const { code, err } = await rank('--reading', 'TP5=4k7');
    expect(code).toBe(1);
    expect(err).toMatch(/TP5 is a resistance test point but condition "quiescent" is powered/);
  });

  it('a reading without "=" is refused with the accepted form', async () => {
    const { code, err } = await rank('--reading', 'TP1');
    expect(code).toBe(1);
    expect(err).toMatch(/"TP1" is not a reading \(accepted: TP=VALUE or CONDITION:TP=VALUE/);
  });

  it('a bad --set is refused naming the part', async () => {
    const { code, err } = await rank('--set', 'R2=lots', '--reading', 'TP1=5');
    expect(code).toBe(1);
    expect(err).toMatch(/R2/);
  });

  it('--help shows usage with an example', async () => {
    const io = memoryIo();
    expect(await run(['rank', '--help'], io)).toBe(0);
    expect(io.out()).toMatch(/Usage: voltwalk rank/);
    expect(io.out()).toMatch(/Examples:/);
  });
});
