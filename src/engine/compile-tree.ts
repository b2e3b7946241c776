import type { Condition, Part, TestPoint } from '../schemas/board.js';
import type { Hazard, MeasureNode, Tree, TreeNode } from '../schemas/tree.js';
import type { BoardView } from './board-view.js';
import { edgesOf } from './tree-graph.js';
import { POLARISED_KINDS } from '../board/pins.js';
import { SAFETY_HOLD } from './walk-context.js';

/** A tree step resolved against one board: what it points at there, whether it is skipped, what it needs acknowledged. */
export interface StepPlan {
  id: string;
  node: TreeNode;
  testPoint?: TestPoint;
  condition?: Condition;
  parts: Part[];
  /** Set when the step cannot be offered on this board (or without an oscilloscope): where the walk goes instead. */
  skip?: { reason: string; to: string };
  /** Hazards that must be acknowledged before the step is shown; set for every step that needs power. */
  gate?: Hazard[];
}

type Transition = { target?: string; guard?: { type: string; params?: object }; actions?: Array<{ type: string; params?: object }> };
type StateConfig = { tags: string[]; meta: { node: string }; entry: Array<{ type: string; params?: object }>; always?: Transition[]; on?: Record<string, Transition[]> };

/**
 * Where a measurement nobody could take leads: where the tree says (`skipTo`), else on as if it
 * were in band (the walk goes on to the next check rather than concluding a fault it never saw),
 * else the default branch.
 */
export function skipBranch(node: MeasureNode): string {
  return node.skipTo ?? node.branches['in-band'] ?? node.branches.default;
}

function planStep(id: string, node: TreeNode, view: BoardView, oscilloscope: boolean): StepPlan {
  const plan: StepPlan = { id, node, parts: [] };
  const lacks = (what: string, role: string) => `this board has no ${what} for the role "${role}"`;
  switch (node.kind) {
    case 'measure': {
      plan.testPoint = view.testPoint(node.testPoint);
      plan.condition = view.condition(node.condition);
      const reason = !plan.testPoint
        ? lacks('test point', node.testPoint)
        : !plan.condition
          ? lacks('condition', node.condition)
          : !view.band(plan.testPoint.id, plan.condition.id, {}, node.quantity)
            ? `this board gives no expected value at ${plan.testPoint.id} under "${plan.condition.id}"`
            : undefined;
      if (reason) plan.skip = { reason, to: skipBranch(node) };
      break;
    }
    case 'setup':
      plan.condition = view.condition(node.condition);
      if (!plan.condition) plan.skip = { reason: lacks('condition', node.condition), to: node.next };
      break;
    case 'inspect':
      plan.parts = view.parts(node.part);
      if (node.look === 'orientation') {
        const all = plan.parts.length;
        plan.parts = plan.parts.filter((p) => POLARISED_KINDS.has(p.kind));
        if (all > 0 && !plan.parts.length) {
          plan.skip = { reason: `none of this board's parts for the role "${node.part}" can be fitted the wrong way round`, to: node.ok };
          break;
        }
      }
      if (!plan.parts.length) plan.skip = { reason: lacks('part', node.part), to: node.ok };
      break;
    case 'observe':
      if (node.instrument === 'oscilloscope' && !oscilloscope && node.alternative) {
        plan.skip = { reason: 'this step needs an oscilloscope; taking the multimeter route', to: node.alternative };
      }
      break;
    case 'conclude':
      plan.parts = node.parts.flatMap((role) => view.parts(role));
      break;
    case 'caution':
      break;
  }
  // The board's own word on power counts too: a condition it calls powered is gated even if the tree slipped.
  const powered = ((node.kind === 'measure' || node.kind === 'setup') && node.powered) || plan.condition?.powered === true;
  const declared = node.kind === 'measure' || node.kind === 'setup' ? node.hazards : [];
  if ((powered || declared.length) && !plan.skip) plan.gate = [...new Set<Hazard>([...(powered ? (['rails'] as const) : []), ...declared])];
  return plan;
}

function stateFor(plan: StepPlan): StateConfig {
  const { id, node } = plan;
  const state: StateConfig = { tags: [node.kind], meta: { node: id }, entry: [{ type: 'enterStep', params: { node: id } }] };
  if (plan.skip) {
    state.always = [{ target: plan.skip.to, actions: [{ type: 'recordSkip', params: { node: id, reason: plan.skip.reason } }] }];
    return state;
  }
  if (plan.gate) {
    state.always = [{ guard: { type: 'hazardsMissing', params: { hazards: plan.gate } }, target: SAFETY_HOLD, actions: [{ type: 'block', params: { node: id, hazards: plan.gate } }] }];
  }
  const skipTo = (to: string): Transition[] => [{ target: to, actions: [{ type: 'recordSkip', params: { node: id, reason: 'skipped by the person' } }] }];
  switch (node.kind) {
    case 'caution':
      state.on = { 'user.acknowledge': [{ target: node.next, actions: [{ type: 'acknowledge', params: { node: id, covers: node.covers } }] }] };
      break;
    case 'setup':
      state.on = { 'user.acknowledge': [{ target: node.next, actions: [{ type: 'acknowledge', params: { node: id, covers: [] } }] }] };
      break;
    case 'measure': {
      const named = Object.entries(node.branches).filter(([branch, to]) => branch !== 'default' && to !== undefined) as Array<[string, string]>;
      const record = [{ type: 'recordReading', params: { node: id } }];
      state.on = {
        'user.reading': [
          ...named.map(([branch, to]) => ({ target: to, guard: { type: 'routeIs', params: { node: id, branch } }, actions: record })),
          { target: node.branches.default, actions: record },
        ],
        'user.skip': skipTo(skipBranch(node)),
      };
      break;
    }
    case 'observe':
      state.on = {
        'user.answer': Object.entries(node.choices).map(([choice, c]) => ({
          target: c.next,
          guard: { type: 'choiceIs', params: { choice } },
          actions: [{ type: 'recordAnswer', params: { node: id } }],
        })),
        ...(node.alternative ? { 'user.skip': skipTo(node.alternative) } : {}),
      };
      break;
    case 'inspect':
      state.on = {
        'user.answer': (['ok', 'fault'] as const).map((choice) => ({
          target: node[choice],
          guard: { type: 'choiceIs', params: { choice } },
          actions: [{ type: 'recordAnswer', params: { node: id } }],
        })),
        'user.skip': skipTo(node.ok),
      };
      break;
    case 'conclude':
      break;
  }
  return state;
}

/**
 * Turns a tree into an xstate machine config for one board: one state per step, reached by
 * following the tree from its start (the recursion), plus the safety hold. Events that apply
 * everywhere (going back, changing a part, an extra probe) live on the root.
 */
export function compileTree(tree: Tree, view: BoardView, options: { oscilloscope?: boolean } = {}) {
  const plans: Record<string, StepPlan> = {};
  const states: Record<string, StateConfig | object> = {};
  const visit = (id: string): void => {
    if (plans[id]) return;
    const node = tree.nodes[id];
    plans[id] = planStep(id, node, view, options.oscilloscope ?? false);
    states[id] = stateFor(plans[id]);
    for (const e of edgesOf(node)) visit(e.to);
  };
  visit(tree.start);
  states[SAFETY_HOLD] = { tags: ['blocked'] };
  const config = {
    initial: tree.start,
    states,
    on: {
      'user.back': Object.keys(plans).map((id) => ({ target: `.${id}`, guard: { type: 'backTo', params: { node: id } }, actions: [{ type: 'stepBack', params: { node: id } }] })),
      'user.substitute': [{ guard: { type: 'knownPart' }, actions: [{ type: 'substitute' }] }],
      'user.probe': [{ guard: { type: 'probeAllowed' }, actions: [{ type: 'probe' }] }],
    },
  };
  return { config, plans };
}
