import { createActor } from 'xstate';
import { UserInputError, type Problem } from '../errors.js';
import type { Board } from '../schemas/board.js';
import type { Tree } from '../schemas/tree.js';
import { answerEvent, currentStep, readingEvent, substituteEvent } from './step-view.js';
import { transcriptOf, type Transcript } from './transcript.js';
import type { WalkEvent } from './walk-context.js';
import { createWalkMachine, type WalkOptions } from './walk-machine.js';

/**
 * Answers keyed by step id: a reading as typed ("4.2 V", "10k") at measure steps, a choice id at
 * observe and inspect steps ("yes", "ok", "fault"), true (or "ok") for cautions and setups, and
 * "skip" for a step the person cannot do.
 */
export type Answers = Record<string, string | number | boolean>;

const YES = new Set(['true', 'ok', 'yes', 'done', 'acknowledged']);

function eventFor(step: ReturnType<typeof currentStep>, answer: string | number | boolean): WalkEvent {
  const text = String(answer).trim();
  if (text === 'skip') {
    if (!step.canSkip) throw new UserInputError({ code: 'walk.cannot-skip', path: step.node, message: `step "${step.node}" cannot be skipped`, accepted: step.kind === 'caution' ? 'true (acknowledged)' : 'an answer' });
    return { type: 'user.skip' };
  }
  switch (step.kind) {
    case 'caution':
    case 'setup':
      if (!YES.has(text.toLowerCase())) throw new UserInputError({ code: 'walk.not-acknowledged', path: step.node, message: `step "${step.node}" must be acknowledged, found "${text}"`, accepted: 'true, "ok" or "done"' });
      return { type: 'user.acknowledge' };
    case 'measure':
      return readingEvent(step, text);
    default:
      return answerEvent(step, text);
  }
}

/**
 * Replays a walk from a set of answers, without a terminal. Stops at the conclusion, at the first
 * step with no answer, or at the first answer that is wrong for its step (`stopped` says which and why).
 */
export function walkFromAnswers(tree: Tree, board: Board, answers: Answers, options: WalkOptions & { set?: Record<string, string> } = {}): Transcript {
  const { machine, walk } = createWalkMachine(tree, board, options);
  const actor = createActor(machine);
  actor.start();
  let stopped: { node: string; problem: Problem } | undefined;
  try {
    for (const [ref, value] of Object.entries(options.set ?? {})) actor.send(substituteEvent(walk, ref, value));
    for (let guard = 0; guard < 4 * Object.keys(tree.nodes).length + 8; guard++) {
      const snapshot = actor.getSnapshot();
      const step = currentStep(walk, snapshot);
      if (step.kind === 'conclude') break;
      if (step.kind === 'blocked') {
        stopped = { node: step.blocked!.node, problem: { code: 'walk.safety-hold', path: step.blocked!.node, message: step.say.technician } };
        break;
      }
      const answer = answers[step.node];
      if (answer === undefined) {
        stopped = { node: step.node, problem: { code: 'walk.missing-answer', path: step.node, message: `step "${step.node}" (${step.kind}) needs an answer`, accepted: acceptedFor(step) } };
        break;
      }
      try {
        actor.send(eventFor(step, answer));
      } catch (error) {
        if (error instanceof UserInputError) {
          stopped = { node: step.node, problem: error.problems[0] };
          break;
        }
        throw error;
      }
    }
    const transcript = transcriptOf(walk, actor.getSnapshot());
    return stopped ? { ...transcript, stopped } : transcript;
  } finally {
    actor.stop();
  }
}

function acceptedFor(step: ReturnType<typeof currentStep>): string {
  switch (step.kind) {
    case 'caution':
    case 'setup':
      return 'true once done';
    case 'measure':
      if (step.expected?.kind === 'noise') return 'a hiss level such as "390uV" or "-66 dBu", or "skip"';
      return `a ${step.testPoint?.quantity} reading such as ${step.testPoint?.quantity === 'resistance' ? '"10k"' : '"4.2 V"'}, or "skip"`;
    default:
      return (step.choices ?? []).map((c) => `"${c.id}"`).join(', ');
  }
}
