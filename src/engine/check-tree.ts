import type { z } from 'zod';
import type { Problem } from '../errors.js';
import type { Board } from '../schemas/board.js';
import { HAZARDS, TreeSchema, type Tree, type TreeNode } from '../schemas/tree.js';
import { TEST_POINT_ROLE_QUANTITY } from '../schemas/roles.js';
import { edgesOf, findCycle, guaranteedCover, hazardsNeeded, isPoweredStep, reachableFrom, uncoveredPath } from './tree-graph.js';

/**
 * Meaning checks on a tree, after its shape: every reference resolves, nothing loops, every node is
 * reachable, every role is one some bundled board defines, and the safety gate holds — each
 * powered step is reached only through cautions covering every hazard it declares.
 */
export function validateTree(raw: unknown, file: string, boards: Board[]): { tree?: Tree; problems: Problem[] } {
  const parsed = TreeSchema.safeParse(raw);
  if (!parsed.success) return { problems: shapeProblems(parsed.error, file) };
  const tree = parsed.data;
  const problems = [...referenceProblems(tree, file), ...roleProblems(tree, file, boards)];
  if (problems.some((p) => p.code === 'tree.unknown-node')) return { problems };
  const cycle = findCycle(tree);
  if (cycle) {
    problems.push({
      code: 'tree.cycle',
      file,
      path: `nodes.${cycle[0]}`,
      message: `the steps loop back on themselves: ${cycle.join(' → ')}`,
      accepted: 'a tree: every route ends at a conclude step',
    });
    return { problems };
  }
  problems.push(...reachabilityProblems(tree, file), ...safetyProblems(tree, file));
  return problems.length ? { problems } : { tree, problems };
}

function shapeProblems(error: z.ZodError, file: string): Problem[] {
  return error.issues.map((issue) => ({
    code: 'tree.shape',
    file,
    path: issue.path.map(String).join('.') || undefined,
    message: issue.message,
    accepted: 'see trees/README.md',
  }));
}

function referenceProblems(tree: Tree, file: string): Problem[] {
  const problems: Problem[] = [];
  const known = Object.keys(tree.nodes);
  const accepted = `one of the tree's node ids (${known.slice(0, 6).join(', ')}${known.length > 6 ? ', …' : ''})`;
  if (!tree.nodes[tree.start]) {
    problems.push({ code: 'tree.unknown-node', file, path: 'start', message: `start names "${tree.start}", which is not a node`, accepted });
  }
  for (const [id, node] of Object.entries(tree.nodes)) {
    for (const e of edgesOf(node)) {
      if (!tree.nodes[e.to]) {
        problems.push({ code: 'tree.unknown-node', file, path: `nodes.${id}.${e.via}`, message: `step "${id}" leads to "${e.to}", which is not a node`, accepted });
      }
    }
  }
  return problems;
}

function rolesOf(node: TreeNode): Array<{ field: string; kind: 'testPoints' | 'conditions' | 'parts'; role: string }> {
  switch (node.kind) {
    case 'measure':
      return [
        { field: 'testPoint', kind: 'testPoints', role: node.testPoint },
        { field: 'condition', kind: 'conditions', role: node.condition },
      ];
    case 'setup':
      return [{ field: 'condition', kind: 'conditions', role: node.condition }];
    case 'inspect':
      return [{ field: 'part', kind: 'parts', role: node.part }];
    case 'conclude':
      return node.parts.map((role, i) => ({ field: `parts.${i}`, kind: 'parts' as const, role }));
    case 'observe':
      return node.expect && 'leds' in node.expect
        ? [
            { field: 'expect.leds', kind: 'parts', role: node.expect.leds },
            { field: 'expect.condition', kind: 'conditions', role: node.expect.condition },
          ]
        : [];
    default:
      return [];
  }
}

/** A role in the vocabulary that no bundled board maps would make a step every walk skips. */
function roleProblems(tree: Tree, file: string, boards: Board[]): Problem[] {
  const problems: Problem[] = [];
  for (const [id, node] of Object.entries(tree.nodes)) {
    for (const { field, kind, role } of rolesOf(node)) {
      if (!boards.some((b) => (b.roles[kind] as Record<string, unknown>)[role] !== undefined)) {
        problems.push({
          code: 'tree.role-undefined',
          file,
          path: `nodes.${id}.${field}`,
          message: `step "${id}" asks for the ${kind === 'testPoints' ? 'test point' : kind === 'parts' ? 'part' : 'condition'} role "${role}", which no bundled board defines`,
          accepted: `a role mapped in some board's roles.${kind}`,
        });
      }
    }
    if ((node.kind === 'measure' || node.kind === 'setup') && (node.condition === 'unpowered') === node.powered) {
      problems.push({
        code: 'tree.powered-mismatch',
        file,
        path: `nodes.${id}.powered`,
        message: `step "${id}" says powered: ${node.powered} under the condition "${node.condition}"`,
        accepted: 'powered: false exactly when the condition is "unpowered"',
      });
    }
    if (node.kind === 'measure' && node.quantity === 'noise' && (!node.powered || TEST_POINT_ROLE_QUANTITY[node.testPoint] !== 'voltage')) {
      problems.push({
        code: 'tree.hiss-not-voltage',
        file,
        path: `nodes.${id}.quantity`,
        message: `step "${id}" measures hiss at the ${TEST_POINT_ROLE_QUANTITY[node.testPoint]} test point role "${node.testPoint}"${node.powered ? '' : ' with the power off'}`,
        accepted: 'quantity "noise" only at a voltage test point role on a powered step',
      });
    }
  }
  return problems;
}

function reachabilityProblems(tree: Tree, file: string): Problem[] {
  const reached = new Set(reachableFrom(tree));
  return Object.keys(tree.nodes)
    .filter((id) => !reached.has(id))
    .map((id) => ({ code: 'tree.unreachable', file, path: `nodes.${id}`, message: `step "${id}" is never reached from the start "${tree.start}"`, accepted: 'every step on some route from the start' }));
}

function safetyProblems(tree: Tree, file: string): Problem[] {
  const problems: Problem[] = [];
  const cover = guaranteedCover(tree);
  const missing = (id: string) => hazardsNeeded(tree.nodes[id]).filter((h) => !(cover.get(id) ?? new Set()).has(h));
  const predecessors = new Map<string, string[]>();
  for (const [id, node] of Object.entries(tree.nodes)) for (const e of edgesOf(node)) predecessors.set(e.to, [...(predecessors.get(e.to) ?? []), id]);
  // One caution missing leaves every later powered step uncovered too: report only the first such
  // step on each route (one whose predecessors do not already miss the same hazard).
  const firstToMiss = (id: string, hazard: string) => !(predecessors.get(id) ?? []).every((p) => missing(p).includes(hazard as never));
  for (const [id, node] of Object.entries(tree.nodes)) {
    if (isPoweredStep(node) && !node.hazards.includes('rails')) {
      problems.push({ code: 'tree.safety', file, path: `nodes.${id}.hazards`, message: `powered step "${id}" does not declare the "rails" hazard`, accepted: `hazards including "rails" (known: ${Object.keys(HAZARDS).join(', ')})` });
    }
    for (const hazard of missing(id).filter((h) => firstToMiss(id, h))) {
      const path = uncoveredPath(tree, id, hazard);
      problems.push({
        code: 'tree.safety',
        file,
        path: `nodes.${id}`,
        message: `${isPoweredStep(node) ? 'powered ' : ''}step "${id}" can be reached without a caution covering "${hazard}"${path ? ` (route: ${path.join(' → ')})` : ''}`,
        accepted: `a caution step with covers: ["${hazard}", …] on every route before it`,
      });
    }
  }
  return problems;
}
