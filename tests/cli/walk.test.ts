import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { run } from '../../src/cli/run.js';
import { memoryIo } from '../../src/cli/io.js';
import { BOARDS_DIR } from '../../src/paths.js';
import { loadBoard, measureAll } from '../../src/board/index.js';
import { findTree } from '../../src/engine/index.js';

// The smaller bundled board keeps these tests quick; worst-case bands only (--samples 0).
const BOARD = join(BOARDS_DIR, 'wenlow-nib.json');
const dir = mkdtempSync(join(tmpdir(), 'voltwalk-walk-'));
const write = (name: string, content: unknown) => {
  const file = join(dir, name);
  writeFileSync(file, typeof content === 'string' ? content : JSON.stringify(content));
  return file;
};

/** Answers a person would give on a healthy board: every reading from the simulated meter. */
function healthyAnswers(treeId = 'first-power-up'): Record<string, string | boolean> {
  const board = loadBoard(BOARD);
  const tree = findTree(treeId);
  const answers: Record<string, string | boolean> = {};
  for (const [id, n] of Object.entries(tree.nodes)) {
    if (n.kind === 'caution' || n.kind === 'setup') answers[id] = true;
    else if (n.kind === 'inspect') answers[id] = 'ok';
    else if (n.kind === 'observe') answers[id] = Object.keys(n.choices)[0];
    else if (n.kind === 'measure') {
      const condition = board.roles.conditions[n.condition];
      const testPoint = board.roles.testPoints[n.testPoint];
      if (!condition || !testPoint) continue;
      const v = measureAll(board, condition)[testPoint];
      answers[id] = Number.isFinite(v) ? `${v.toPrecision(4)}` : 'OL';
    }
  }
  return answers;
}

const walk = (...args: string[]) => {
  const io = memoryIo();
  return run(['walk', '--board', BOARD, '--samples', '0', '--no-ranking', ...args], io).then((code) => ({ code, out: io.out(), err: io.err() }));
};

describe('voltwalk walk', () => {
  let answersFile = '';
  beforeAll(() => {
    answersFile = write('healthy.json', healthyAnswers());
  });

  it('replays a healthy board to the healthy conclusion, showing bands, readings and outcomes', async () => {
    const r = await walk('--tree', 'first-power-up', '--answers', answersFile);
    expect(r.err).toBe('');
    expect(r.code).toBe(0);
    expect(r.out).toContain('Tree: first-power-up');
    expect(r.out).toMatch(/\[rail-pos\] measure at TP1/);
    expect(r.out).toMatch(/expected 11\.\d+ V to 11\.\d+ V \(nominal 11\.\d+ V\); read 11\.\d+ V → in-band/);
    expect(r.out).toContain('open: the meter shows overload (OL)');
    expect(r.out).toContain('Conclusion: The board powers up healthy');
  });

  it('--md gives a Markdown table and --json a transcript object', async () => {
    const md = await walk('--tree', 'first-power-up', '--answers', answersFile, '--md');
    expect(md.code).toBe(0);
    expect(md.out).toContain('| # | Step | Where | Expected | Reading | Outcome / answer |');
    const json = await walk('--tree', 'first-power-up', '--answers', answersFile, '--json');
    const t = JSON.parse(json.out);
    expect(t.current.node).toBe('end-healthy');
    expect(t.entries.find((e: { node: string }) => e.node === 'ohms-neg').expected.max).toBe('Infinity');
  });

  it('--customer uses the customer wording', async () => {
    const r = await walk('--tree', 'first-power-up', '--answers', answersFile, '--customer');
    expect(r.out).toContain('Good news: the module powers up correctly.');
    expect(r.out).toMatch(/\[rail-pos\][^\n]*\n[^\n]*\n    probes: \S/);
  });

  it('a missing answer prints the transcript so far and names the step that needs one (exit 1)', async () => {
    const file = write('partial.json', { 'look-electrolytics': 'ok', 'look-protection': 'ok' });
    const r = await walk('--tree', 'first-power-up', '--answers', file);
    expect(r.code).toBe(1);
    expect(r.out).toContain('[look-protection]');
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toContain('look-protection-neg');
    expect(r.err).toContain('needs an answer');
  });

  it('a typo in a reading is one line naming the test point, not an outcome (exit 1)', async () => {
    const answers = { ...healthyAnswers(), 'rail-pos': '11..9 V' };
    const r = await walk('--tree', 'first-power-up', '--answers', write('typo.json', answers));
    expect(r.code).toBe(1);
    expect(r.err).toMatch(/reading at TP1 \(rail-pos\)/);
    expect(r.out).not.toContain('Conclusion');
  });

  it('--set changes a part and the expected bands with it', async () => {
    // R15 feeds the threshold network from +12 V on this board: the gain reduction, and the VCA
    // signal level with it, move when it changes.
    const file = write('no-gr.json', healthyAnswers('no-gain-reduction'));
    const plain = JSON.parse((await walk('--tree', 'no-gain-reduction', '--answers', file, '--json')).out);
    const changed = JSON.parse((await walk('--tree', 'no-gain-reduction', '--answers', file, '--json', '--set', 'R15=10k')).out);
    expect(changed.substitutions).toEqual({ R15: '10k' });
    type T = { entries: Array<{ node: string; expected?: { nominal: number } }> };
    const bands = (t: T) => new Map(t.entries.filter((e) => e.expected).map((e) => [e.node, e.expected!.nominal]));
    const before = bands(plain);
    const after = bands(changed);
    // the rail barely moves (R15 loads it a little); some later step on both routes moves clearly
    expect(after.get('rail-pos')).toBeCloseTo(before.get('rail-pos')!, 1);
    const moved = [...after].filter(([node, v]) => before.has(node) && Math.abs(v - before.get(node)!) > 0.2 * Math.abs(before.get(node)!));
    expect(moved.length).toBeGreaterThan(0);
  });

  it('bad input: usage errors exit 2, unknown tree and unreadable answers exit 1', async () => {
    expect((await walk('--answers', answersFile)).code).toBe(2);
    expect((await walk('--tree', 'first-power-up', '--answers', answersFile, '--set', 'R1')).code).toBe(2);
    const unknown = await walk('--tree', 'no-such-tree', '--answers', answersFile);
    expect(unknown.code).toBe(1);
    expect(unknown.err).toContain('no-output');
    const broken = await walk('--tree', 'first-power-up', '--answers', write('broken.json', '{"rail-pos": '));
    expect(broken.code).toBe(1);
    expect(broken.err).toContain('not valid JSON');
    // A folder given for the answers file is named as one, not called broken JSON.
    const folder = await walk('--tree', 'first-power-up', '--answers', dirname(answersFile));
    expect(folder.code).toBe(1);
    expect(folder.err).toMatch(/: answers file: is a folder, not a file \(accepted: /);
    expect(folder.err.trim().split('\n')).toHaveLength(1);
    const badSet = await walk('--tree', 'first-power-up', '--answers', answersFile, '--set', 'R999=1k');
    expect(badSet.code).toBe(1);
    expect(badSet.err).toContain('R999');
  });
});
