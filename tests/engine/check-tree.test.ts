import { describe, expect, it } from 'vitest';
import { validateTree } from '../../src/engine/check-tree.js';
import type { Board } from '../../src/schemas/board.js';
import { formatProblem } from '../../src/errors.js';

// Boards only matter here for the roles they define.
const boards = [
  {
    roles: {
      stages: {},
      testPoints: { 'input-stage-output': 'TP1', 'pos-rail-resistance': 'TP2' },
      parts: { 'input-opamp': ['U1'], 'input-gain-pot': ['RV1'] },
      conditions: { quiescent: 'rest', unpowered: 'off' },
    },
  },
] as unknown as Board[];

const say = { technician: 't', customer: 'c' };

function tree(nodes: Record<string, unknown>, start = 'warn') {
  return { format: 'voltwalk-tree/1', id: 'tampered', symptom: 's', description: 'd', start, nodes };
}

const good = {
  warn: { kind: 'caution', covers: ['rails', 'mains-supply'], say, next: 'power' },
  power: { kind: 'setup', condition: 'quiescent', powered: true, hazards: ['rails', 'mains-supply'], say, next: 'out' },
  out: { kind: 'measure', testPoint: 'input-stage-output', condition: 'quiescent', powered: true, hazards: ['rails'], say, branches: { 'in-band': 'end', default: 'end-bad' } },
  end: { kind: 'conclude', title: 'ok', parts: [], say },
  'end-bad': { kind: 'conclude', title: 'bad', parts: ['input-opamp'], say },
};

function problemsOf(raw: unknown) {
  return validateTree(raw, 'tampered.json', boards).problems;
}

describe('tree checks', () => {
  it('accepts a well-formed tree', () => {
    const { tree: t, problems } = validateTree(tree(good), 'good.json', boards);
    expect(problems).toEqual([]);
    expect(t?.id).toBe('tampered');
  });

  it('rejects a powered measurement reachable without a caution, naming the node and the route', () => {
    const problems = problemsOf(tree({ ...good, power: { ...good.power, hazards: ['rails'] } }, 'power'));
    expect(problems.map((p) => p.code)).toContain('tree.safety');
    const text = problems.map(formatProblem).join('\n');
    expect(text).toContain('nodes.power');
    expect(text).toContain('"rails"');
    expect(text).toContain('route: power');
  });

  it('rejects a caution on only one of two routes into a powered step', () => {
    const problems = problemsOf(
      tree(
        {
          ...good,
          ask: { kind: 'observe', say, choices: { a: { label: 'a', next: 'warn' }, b: { label: 'b', next: 'out' } } },
        },
        'ask',
      ),
    );
    const safety = problems.filter((p) => p.code === 'tree.safety');
    expect(safety.length).toBeGreaterThan(0);
    expect(safety[0].path).toBe('nodes.out');
    expect(safety[0].message).toContain('ask → out');
  });

  it('rejects a powered step that declares no rails hazard', () => {
    const problems = problemsOf(tree({ ...good, out: { ...good.out, hazards: [] } }));
    expect(problems).toContainEqual(expect.objectContaining({ code: 'tree.safety', path: 'nodes.out.hazards' }));
  });

  it('rejects an unknown role, naming the node and field', () => {
    const problems = problemsOf(tree({ ...good, out: { ...good.out, testPoint: 'input-stage-outptu' } }));
    expect(problems[0]).toMatchObject({ code: 'tree.shape', path: 'nodes.out.testPoint' });
  });

  it('rejects a role in the vocabulary that no bundled board defines', () => {
    const problems = problemsOf(tree({ ...good, 'end-bad': { ...good['end-bad'], parts: ['vca-tail'] } }));
    expect(problems).toEqual([expect.objectContaining({ code: 'tree.role-undefined', path: 'nodes.end-bad.parts.0' })]);
    expect(problems[0].message).toContain('vca-tail');
  });

  it('rejects a reference to a node that does not exist', () => {
    const problems = problemsOf(tree({ ...good, out: { ...good.out, branches: { 'in-band': 'ned', default: 'end-bad' } } }));
    expect(problems).toEqual([expect.objectContaining({ code: 'tree.unknown-node', path: 'nodes.out.branches.in-band' })]);
    expect(problems[0].message).toContain('"ned"');
  });

  it('rejects a cycle, naming the loop', () => {
    const problems = problemsOf(tree({ ...good, out: { ...good.out, branches: { 'in-band': 'end', default: 'warn' } } }));
    expect(problems).toEqual([expect.objectContaining({ code: 'tree.cycle' })]);
    expect(problems[0].message).toContain('warn → power → out → warn');
  });

  it('rejects a misspelt key (strict objects)', () => {
    const problems = problemsOf(tree({ ...good, warn: { kind: 'caution', covers: ['rails'], say, nxet: 'power' } }));
    const text = problems.map(formatProblem).join('\n');
    expect(text).toContain('nodes.warn');
    expect(text).toMatch(/nxet/);
  });

  it('rejects an unknown hazard and a wrong format tag', () => {
    expect(problemsOf(tree({ ...good, warn: { ...good.warn, covers: ['lasers'] } }))[0].path).toBe('nodes.warn.covers.0');
    expect(problemsOf({ ...tree(good), format: 'voltwalk-tree/2' })[0].path).toBe('format');
  });

  it('rejects a step nobody can reach', () => {
    const problems = problemsOf(tree({ ...good, orphan: { kind: 'conclude', title: 'x', parts: [], say } }));
    expect(problems).toEqual([expect.objectContaining({ code: 'tree.unreachable', path: 'nodes.orphan' })]);
  });

  it('rejects an oscilloscope step with no multimeter alternative', () => {
    const problems = problemsOf(
      tree({ ...good, end: { kind: 'observe', instrument: 'oscilloscope', say, choices: { a: { label: 'a', next: 'end-bad' }, b: { label: 'b', next: 'end-bad' } } } }),
    );
    expect(problems[0]).toMatchObject({ code: 'tree.shape', path: 'nodes.end.alternative' });
  });

  it('takes a hiss level only at a voltage test point on a powered step', () => {
    expect(problemsOf(tree({ ...good, out: { ...good.out, quantity: 'noise' } })).filter((p) => p.code === 'tree.hiss-not-voltage')).toEqual([]);
    const atOhms = problemsOf(tree({ ...good, out: { ...good.out, quantity: 'noise', testPoint: 'pos-rail-resistance', condition: 'unpowered', powered: false } }));
    expect(atOhms).toContainEqual(expect.objectContaining({ code: 'tree.hiss-not-voltage', path: 'nodes.out.quantity' }));
  });

  it('rejects a measurement whose powered flag contradicts its condition', () => {
    const problems = problemsOf(tree({ ...good, out: { ...good.out, condition: 'unpowered' } }));
    expect(problems).toContainEqual(expect.objectContaining({ code: 'tree.powered-mismatch', path: 'nodes.out.powered' }));
  });
});
