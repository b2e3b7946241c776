import { describe, expect, it, vi } from 'vitest';
import { getShortestPaths } from 'xstate/graph';

vi.mock('../../src/engine/ranking.js', () => ({ rankFor: () => ({ note: 'ranking left out of graph tests' }) }));
vi.mock('../../src/engine/board-view.js', () => ({ createBoardView: () => { throw new Error('graph tests use universalView'); } }));

import { walkMachineFor } from '../../src/engine/walk-machine.js';
import { SAFETY_HOLD, type WalkContext, type WalkEvent } from '../../src/engine/walk-context.js';
import { isPoweredStep } from '../../src/engine/tree-graph.js';
import type { Tree } from '../../src/schemas/tree.js';
import { READINGS, bundledTreesForGraphs, universalView } from './universal-view.js';

const trees = bundledTreesForGraphs();

/** Every event a person could send at a step: each choice, one reading per outcome, skip, back. */
function eventsFor(tree: Tree, value: string, oscilloscope: boolean): WalkEvent[] {
  const node = tree.nodes[value];
  const always: WalkEvent[] = [{ type: 'user.back' }];
  if (!node) return always;
  switch (node.kind) {
    case 'caution':
    case 'setup':
      return [{ type: 'user.acknowledge' }, ...always];
    case 'measure': {
      const unit = node.testPoint.endsWith('-resistance') ? 'Ω' : 'V';
      return [...Object.values(READINGS[unit]).map((v): WalkEvent => ({ type: 'user.reading', value: v, text: String(v) })), { type: 'user.skip' }, ...always];
    }
    case 'observe':
      if (node.instrument === 'oscilloscope' && !oscilloscope) return always;
      return [...Object.keys(node.choices).map((choice): WalkEvent => ({ type: 'user.answer', choice })), { type: 'user.skip' }, ...always];
    case 'inspect':
      return [{ type: 'user.answer', choice: 'ok' }, { type: 'user.answer', choice: 'fault' }, { type: 'user.skip' }, ...always];
    case 'conclude':
      return always;
  }
}

function explore(tree: Tree, oscilloscope: boolean) {
  const { machine } = walkMachineFor(tree, universalView(), { oscilloscope });
  return getShortestPaths(machine, {
    events: (snapshot) => eventsFor(tree, String(snapshot.value), oscilloscope),
    // A state is its step plus what has been acknowledged: enough to decide the safety question.
    serializeState: (snapshot) => `${String(snapshot.value)}|${[...(snapshot.context as WalkContext).acknowledged].sort().join(',')}`,
  });
}

describe.each(trees.map((t) => [t.id, t] as const))('tree %s as a state machine', (_id, tree) => {
  for (const oscilloscope of [false, true]) {
    const paths = explore(tree, oscilloscope);
    const reached = new Set(paths.map((p) => String(p.state.value)));

    it(`reaches every conclusion (${oscilloscope ? 'with' : 'without'} an oscilloscope)`, () => {
      const conclusions = Object.entries(tree.nodes).filter(([, n]) => n.kind === 'conclude').map(([id]) => id);
      // Conclusions reached only through an oscilloscope step's own choices need the scope.
      const scopeOnly = oscilloscope ? [] : conclusions.filter((id) => !reached.has(id));
      for (const id of scopeOnly) {
        const viaScope = Object.values(tree.nodes).some((n) => n.kind === 'observe' && n.instrument === 'oscilloscope' && Object.values(n.choices).some((c) => c.next === id));
        expect(viaScope, `conclusion "${id}" unreachable without an oscilloscope and not behind a scope step`).toBe(true);
      }
      if (oscilloscope) expect(conclusions.filter((id) => !reached.has(id))).toEqual([]);
    });

    it(`never presents a powered step unguarded (${oscilloscope ? 'with' : 'without'} an oscilloscope)`, () => {
      expect(reached.has(SAFETY_HOLD)).toBe(false);
      let powered = 0;
      for (const path of paths) {
        const node = tree.nodes[String(path.state.value)];
        if (!node || !isPoweredStep(node)) continue;
        powered++;
        const acknowledged = (path.state.context as WalkContext).acknowledged;
        for (const h of node.hazards) expect(acknowledged, `${tree.id}: ${String(path.state.value)} needs ${h}`).toContain(h);
      }
      expect(powered).toBeGreaterThan(0);
    });
  }
});

describe('the graph check itself', () => {
  it('finds the hold when a route skips the caution (so the checks above can fail)', () => {
    const tree = structuredClone(trees.find((t) => t.id === 'first-power-up')!);
    const ohmsNeg = tree.nodes['ohms-neg'];
    if (ohmsNeg.kind !== 'measure') throw new Error('fixture changed');
    ohmsNeg.branches.default = 'power-on';
    const reached = new Set(explore(tree, false).map((p) => String(p.state.value)));
    expect(reached.has(SAFETY_HOLD)).toBe(true);
    // the caution is now on no route at all, so the powered step is never presented
    expect(reached.has('power-on')).toBe(false);
  });
});
