import type { Hazard, Tree, TreeNode } from '../schemas/tree.js';

/** One edge of a tree: from a node, by a named route (a branch, a choice, `next`), to a node. */
export interface Edge {
  via: string;
  to: string;
}

/** Where a node can lead, in the order a reader meets them in the file. */
export function edgesOf(node: TreeNode): Edge[] {
  switch (node.kind) {
    case 'caution':
    case 'setup':
      return [{ via: 'next', to: node.next }];
    case 'measure':
      return [
        ...Object.entries(node.branches)
          .filter((e): e is [string, string] => e[1] !== undefined)
          .map(([via, to]) => ({ via: `branches.${via}`, to })),
        ...(node.skipTo ? [{ via: 'skipTo', to: node.skipTo }] : []),
      ];
    case 'observe': {
      const edges = Object.entries(node.choices).map(([id, c]) => ({ via: `choices.${id}.next`, to: c.next }));
      return node.alternative ? [...edges, { via: 'alternative', to: node.alternative }] : edges;
    }
    case 'inspect':
      return [
        { via: 'ok', to: node.ok },
        { via: 'fault', to: node.fault },
      ];
    case 'conclude':
      return [];
  }
}

/** Steps that need the module switched on, and therefore a caution first. */
export function isPoweredStep(node: TreeNode): node is Extract<TreeNode, { kind: 'measure' | 'setup' }> {
  return (node.kind === 'measure' || node.kind === 'setup') && node.powered;
}

export function hazardsNeeded(node: TreeNode): Hazard[] {
  return node.kind === 'measure' || node.kind === 'setup' ? node.hazards : [];
}

/** The first cycle found, as a list of node ids that starts and ends with the same node. */
export function findCycle(tree: Tree): string[] | undefined {
  const state = new Map<string, 'open' | 'done'>();
  const stack: string[] = [];
  const visit = (id: string): string[] | undefined => {
    const node = tree.nodes[id];
    if (!node || state.get(id) === 'done') return undefined;
    if (state.get(id) === 'open') return [...stack.slice(stack.indexOf(id)), id];
    state.set(id, 'open');
    stack.push(id);
    for (const e of edgesOf(node)) {
      const cycle = visit(e.to);
      if (cycle) return cycle;
    }
    stack.pop();
    state.set(id, 'done');
    return undefined;
  };
  for (const id of [tree.start, ...Object.keys(tree.nodes)]) {
    const cycle = visit(id);
    if (cycle) return cycle;
  }
  return undefined;
}

/** Node ids reachable from the start, in depth-first order. */
export function reachableFrom(tree: Tree, start = tree.start): string[] {
  const seen = new Set<string>();
  const walk = (id: string) => {
    const node = tree.nodes[id];
    if (!node || seen.has(id)) return;
    seen.add(id);
    for (const e of edgesOf(node)) walk(e.to);
  };
  walk(start);
  return [...seen];
}

/**
 * For an acyclic tree: the hazards acknowledged on EVERY path from the start to each node (on
 * arrival, before the node itself). A path meeting a node covers what its cautions covered; the
 * set a node can count on is the intersection over all paths that reach it.
 */
export function guaranteedCover(tree: Tree): Map<string, Set<Hazard>> {
  const order = topologicalOrder(tree);
  const cover = new Map<string, Set<Hazard>>([[tree.start, new Set()]]);
  for (const id of order) {
    const node = tree.nodes[id];
    const here = cover.get(id);
    if (!node || !here) continue;
    const out = new Set(here);
    if (node.kind === 'caution') for (const h of node.covers) out.add(h);
    for (const e of edgesOf(node)) {
      const before = cover.get(e.to);
      cover.set(e.to, before ? new Set([...before].filter((h) => out.has(h))) : new Set(out));
    }
  }
  return cover;
}

/** One path from the start to `target` that passes no caution covering `hazard` (for the error message). */
export function uncoveredPath(tree: Tree, target: string, hazard: Hazard): string[] | undefined {
  const seen = new Set<string>();
  const search = (id: string, path: string[]): string[] | undefined => {
    if (id === target) return [...path, id];
    const node = tree.nodes[id];
    if (!node || seen.has(id)) return undefined;
    seen.add(id);
    if (node.kind === 'caution' && node.covers.includes(hazard)) return undefined;
    for (const e of edgesOf(node)) {
      const found = search(e.to, [...path, id]);
      if (found) return found;
    }
    return undefined;
  };
  return search(tree.start, []);
}

function topologicalOrder(tree: Tree): string[] {
  const done = new Set<string>();
  const order: string[] = [];
  const visit = (id: string) => {
    const node = tree.nodes[id];
    if (!node || done.has(id)) return;
    done.add(id);
    for (const e of edgesOf(node)) visit(e.to);
    order.push(id);
  };
  visit(tree.start);
  return order.reverse();
}
