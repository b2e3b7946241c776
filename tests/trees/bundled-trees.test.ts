import { describe, expect, it } from 'vitest';
import { bundledTreeFiles, loadAllTrees, readTree } from '../../src/engine/load-tree.js';
import { checkTreeFile } from '../../src/engine/check-tree-file.js';
import { guaranteedCover, isPoweredStep } from '../../src/engine/tree-graph.js';
import { TREE_FORMAT } from '../../src/schemas/tree.js';

const REQUIRED = ['first-power-up', 'no-gain-reduction', 'distortion-high-ratio', 'dead-meter', 'noisy-makeup', 'gr-led-stuck', 'no-output', 'pumping-release'];

describe('bundled trees', () => {
  const trees = loadAllTrees();

  it('ships the eight symptom trees, one file per tree named by its id', () => {
    expect(trees.map((t) => t.id).sort()).toEqual([...REQUIRED].sort());
    for (const file of bundledTreeFiles()) {
      const { tree } = readTree(file);
      expect(file.endsWith(`/${tree?.id}.json`)).toBe(true);
      expect(tree?.format).toBe(TREE_FORMAT);
    }
  });

  it.each(bundledTreeFiles())('%s passes every check against the bundled boards, the safety gate included', (file) => {
    expect(checkTreeFile(file)).toEqual([]);
  });

  it.each(REQUIRED)('%s: every powered step has its hazards covered on every route, and some step needs power', (id) => {
    const tree = trees.find((t) => t.id === id)!;
    const cover = guaranteedCover(tree);
    const powered = Object.entries(tree.nodes).filter(([, n]) => isPoweredStep(n));
    expect(powered.length).toBeGreaterThan(0);
    for (const [nodeId, node] of powered) {
      if (node.kind !== 'measure' && node.kind !== 'setup') continue;
      for (const h of node.hazards) expect(cover.get(nodeId)?.has(h), `${id}.${nodeId}: ${h}`).toBe(true);
    }
  });

  it.each(REQUIRED)('%s is written for a multimeter: every oscilloscope step has a multimeter route', (id) => {
    const tree = trees.find((t) => t.id === id)!;
    for (const node of Object.values(tree.nodes)) {
      if (node.kind === 'observe' && node.instrument === 'oscilloscope') expect(node.alternative).toBeDefined();
    }
  });

  it.each(REQUIRED)('%s looks before it powers: the start is an unpowered step', (id) => {
    const tree = trees.find((t) => t.id === id)!;
    const start = tree.nodes[tree.start];
    expect(['inspect', 'caution']).toContain(start.kind);
  });

  it('a tree file that is not JSON, or missing, is a clear problem', () => {
    expect(checkTreeFile('/nonexistent/tree.json')[0]).toMatchObject({ code: 'tree.unreadable' });
  });
});
