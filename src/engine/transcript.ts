import type { Problem } from '../errors.js';
import type { Wording } from '../schemas/tree.js';
import { describeBand, currentStep, expectationOf, INSPECT_CHOICES, showValue, type WalkStep } from './step-view.js';
import { classifyReading } from './outcome.js';
import type { ExpectedBand } from './outcome.js';
import type { WalkContext } from './walk-context.js';
import type { WalkSetup } from './walk-machine.js';

export interface TranscriptEntry {
  node: string;
  kind: WalkStep['kind'];
  say: Wording;
  /** Why the step was passed over, when it was. */
  skipped?: string;
  condition?: { id: string; label: string };
  testPoint?: { id: string; label: string; probe: string };
  expected?: ExpectedBand & { text: string };
  reading?: { text: string; value: number; outcome: string; branch: string };
  answer?: { id: string; label: string; customerLabel?: string };
  /** observe, caution: what the board's parts say the step should find (see WalkStep.expectation). */
  expectation?: string;
}

/** A walk so far, for printing, saving with a case, or the UI's summary. */
export interface Transcript {
  tree: { id: string; symptom: string };
  board: { id: string; name: string };
  substitutions: Record<string, number | string>;
  entries: TranscriptEntry[];
  /** Where the walk stands: a conclusion, a step waiting for an answer, or the safety hold. */
  current: WalkStep;
  /** Set by walkFromAnswers when it could not go on: the step, and why. */
  stopped?: { node: string; problem: Problem };
}

function answerLabels(walk: WalkSetup, node: string, id: string): { label: string; customerLabel?: string } {
  const n = walk.tree.nodes[node];
  if (n?.kind === 'observe') return { label: n.choices[id]?.label ?? id, customerLabel: n.choices[id]?.customerLabel };
  if (n?.kind === 'inspect') return INSPECT_CHOICES.find((c) => c.id === id) ?? INSPECT_CHOICES[1];
  return { label: id === 'done' ? 'acknowledged' : id };
}

const SUGGESTED_PROBE: Wording = {
  technician: 'Reading at the probe the ranking suggested.',
  customer: 'The extra reading you took where I suggested.',
};

/** The steps met (current one excluded), each with its reading or answer, from the walk's context. */
export function transcriptOf(walk: WalkSetup, snapshot: { value: unknown; context: WalkContext }): Transcript {
  const { context } = snapshot;
  const current = currentStep(walk, snapshot);
  const past = context.trail.at(-1) === current.node ? context.trail.slice(0, -1) : context.trail;
  const entries = past.map((id): TranscriptEntry => {
    const plan = walk.plans[id];
    const entry: TranscriptEntry = { node: id, kind: plan.node.kind, say: plan.node.say };
    if (context.skipped[id] !== undefined) entry.skipped = context.skipped[id];
    if (plan.condition) entry.condition = { id: plan.condition.id, label: plan.condition.label };
    if (plan.testPoint) entry.testPoint = { id: plan.testPoint.id, label: plan.testPoint.label, probe: plan.testPoint.probe };
    const r = context.readings[id];
    if (r) {
      entry.expected = { ...r.band, text: describeBand(r.band) };
      entry.reading = { text: r.text, value: r.value, outcome: r.outcome, branch: r.branch };
    }
    const a = context.answers[id];
    if (a !== undefined) entry.answer = { id: a, ...answerLabels(walk, id, a) };
    const expectation = expectationOf(walk, plan.node, context);
    if (expectation && entry.skipped === undefined) entry.expectation = expectation;
    return entry;
  });
  // Readings taken at the ranking's suggested probes, after the tree's own steps, judged on their bands alike.
  context.extraReadings.forEach((r, k) => {
    const tp = walk.view.board.testPoints.find((t) => t.id === r.testPoint);
    const condition = walk.view.board.conditions.find((c) => c.id === r.condition);
    if (!tp || !condition) return;
    const entry: TranscriptEntry = { node: `probe-${k + 1}`, kind: 'measure', say: SUGGESTED_PROBE };
    entry.condition = { id: condition.id, label: condition.label };
    entry.testPoint = { id: tp.id, label: tp.label, probe: tp.probe };
    const band = walk.view.band(tp.id, condition.id, context.substitutions);
    if (band) {
      const outcome = classifyReading(r.value, band, walk.view.railVolts);
      entry.expected = { ...band, text: describeBand(band) };
      entry.reading = { text: showValue(r.value, band.unit), value: r.value, outcome, branch: '' };
    }
    entries.push(entry);
  });
  return {
    tree: { id: walk.tree.id, symptom: walk.tree.symptom },
    board: { id: walk.view.board.id, name: walk.view.board.name },
    substitutions: context.substitutions,
    entries,
    current,
  };
}
