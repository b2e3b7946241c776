import { assign, setup } from 'xstate';
import type { Board } from '../schemas/board.js';
import type { Hazard, MeasureNode, Tree } from '../schemas/tree.js';
import { createBoardView, type BandOptions, type BoardView } from './board-view.js';
import { compileTree, type StepPlan } from './compile-tree.js';
import { branchFor, classifyReading } from './outcome.js';
import { SAFETY_HOLD, type ReadingRecord, type WalkContext, type WalkEvent } from './walk-context.js';

export interface WalkOptions extends BandOptions {
  /** Whether the person has an oscilloscope; without one, scope steps go to their multimeter alternative. */
  oscilloscope?: boolean;
  /** Part values already changed on the board, designator -> value. */
  substitutions?: Record<string, number | string>;
  /** Rank suspects at the conclusion (default true); off for quick replays that only need the tree's route. */
  ranking?: boolean;
  /**
   * Where whole-board fault dictionaries are kept (by `voltwalk rank` or the terminal app): when the
   * board's is there, the ranking takes the walk's conditions out of it. Only read, never written.
   */
  diskCache?: { dir: string; version: string };
}

/** What the step view and the transcript need besides the machine: the tree, the board and the compiled plan. */
export interface WalkSetup {
  tree: Tree;
  view: BoardView;
  plans: Record<string, StepPlan>;
  options: WalkOptions;
}

/** Routes a reading at a measure step: its band for the current part values, the outcome and the branch taken. */
export function routeReading(walk: WalkSetup, nodeId: string, value: number, text: string, context: WalkContext): ReadingRecord | undefined {
  const node = walk.tree.nodes[nodeId] as MeasureNode;
  const plan = walk.plans[nodeId];
  if (!plan?.testPoint || !plan.condition) return undefined;
  const band = walk.view.band(plan.testPoint.id, plan.condition.id, context.substitutions, node.quantity);
  if (!band) return undefined;
  const outcome = classifyReading(value, band, walk.view.railVolts);
  return { testPoint: plan.testPoint.id, condition: plan.condition.id, text, value, band, outcome, branch: branchFor(node.branches, outcome, value, band) };
}

/** The step before the current one that the person actually saw (skipped steps are passed over). */
export function backTarget(context: WalkContext): string | undefined {
  const seen = context.blocked ? context.trail : context.trail.slice(0, -1);
  for (let i = seen.length - 1; i >= 0; i--) if (context.skipped[seen[i]] === undefined) return seen[i];
  return undefined;
}

/**
 * The walk as an xstate machine for one tree on one board. Guards and actions are named here and
 * referred to by name in the compiled config; the tree itself only ever supplies data.
 */
export function createWalkMachine(tree: Tree, board: Board, options: WalkOptions = {}) {
  return walkMachineFor(tree, createBoardView(board, options), options);
}

/** The same, over a prepared board view (tests give it bands of their own). */
export function walkMachineFor(tree: Tree, view: BoardView, options: WalkOptions = {}) {
  const board = view.board;
  const { config, plans } = compileTree(tree, view, options);
  const walk: WalkSetup = { tree, view, plans, options };
  const initial: WalkContext = {
    treeId: tree.id,
    boardId: board.id,
    trail: [],
    readings: {},
    answers: {},
    acknowledged: [],
    substitutions: { ...(options.substitutions ?? {}) },
    skipped: {},
    extraReadings: [],
    blocked: null,
  };
  const machine = setup({
    types: { context: {} as WalkContext, events: {} as WalkEvent },
    guards: {
      hazardsMissing: ({ context }, params: { hazards: Hazard[] }) => params.hazards.some((h) => !context.acknowledged.includes(h)),
      routeIs: ({ context, event }, params: { node: string; branch: string }) =>
        event.type === 'user.reading' && routeReading(walk, params.node, event.value, event.text, context)?.branch === params.branch,
      choiceIs: ({ event }, params: { choice: string }) => event.type === 'user.answer' && event.choice === params.choice,
      backTo: ({ context }, params: { node: string }) => backTarget(context) === params.node,
      knownPart: ({ event }) => event.type === 'user.substitute' && board.parts.some((p) => p.ref === event.ref),
      // A reading off the tree's route (the ranking's suggested probe) under power — or under a
      // condition the board does not name — is recorded only once the rails caution has been
      // acknowledged in this walk, as for the tree's own powered steps.
      probeAllowed: ({ context, event }) =>
        event.type === 'user.probe' && (board.conditions.find((c) => c.id === event.condition)?.powered === false || context.acknowledged.includes('rails')),
    },
    actions: {
      enterStep: assign({ trail: ({ context }, params: { node: string }) => [...context.trail, params.node] }),
      recordSkip: assign({ skipped: ({ context }, params: { node: string; reason: string }) => ({ ...context.skipped, [params.node]: params.reason }) }),
      block: assign(({ context }, params: { node: string; hazards: Hazard[] }) => ({
        blocked: { node: params.node, missing: params.hazards.filter((h) => !context.acknowledged.includes(h)) },
        trail: context.trail.at(-1) === params.node ? context.trail.slice(0, -1) : context.trail,
      })),
      acknowledge: assign(({ context }, params: { node: string; covers: Hazard[] }) => ({
        acknowledged: [...new Set([...context.acknowledged, ...params.covers])],
        answers: { ...context.answers, [params.node]: 'done' },
      })),
      recordReading: assign({
        readings: ({ context, event }, params: { node: string }) => {
          if (event.type !== 'user.reading') return context.readings;
          const record = routeReading(walk, params.node, event.value, event.text, context);
          return record ? { ...context.readings, [params.node]: record } : context.readings;
        },
      }),
      recordAnswer: assign({
        answers: ({ context, event }, params: { node: string }) => (event.type === 'user.answer' ? { ...context.answers, [params.node]: event.choice } : context.answers),
      }),
      substitute: assign({
        substitutions: ({ context, event }) => {
          if (event.type !== 'user.substitute') return context.substitutions;
          const { [event.ref]: _old, ...rest } = context.substitutions;
          return event.value === null ? rest : { ...rest, [event.ref]: event.value };
        },
      }),
      probe: assign({
        extraReadings: ({ context, event }) =>
          event.type === 'user.probe' ? [...context.extraReadings, { testPoint: event.testPoint, condition: event.condition, value: event.value }] : context.extraReadings,
      }),
      stepBack: assign(({ context }, params: { node: string }) => {
        const keep = context.trail.lastIndexOf(params.node);
        const dropped = new Set(context.trail.slice(keep));
        const without = <T>(record: Record<string, T>) => Object.fromEntries(Object.entries(record).filter(([k]) => !dropped.has(k)));
        return {
          trail: context.trail.slice(0, keep),
          readings: without(context.readings),
          answers: without(context.answers),
          skipped: without(context.skipped),
          blocked: null,
        };
      }),
    },
  }).createMachine({
    id: `walk:${tree.id}`,
    context: initial,
    ...(config as object),
  } as Parameters<ReturnType<typeof setup<WalkContext, WalkEvent>>['createMachine']>[0]);
  return { machine, walk };
}

export type WalkMachine = ReturnType<typeof createWalkMachine>['machine'];
export { SAFETY_HOLD };
