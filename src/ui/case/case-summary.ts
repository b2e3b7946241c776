import type { Board } from '../../schemas/board.js';
import { HAZARDS } from '../../schemas/tree.js';
import type { WalkSetup } from '../../engine/walk-machine.js';
import type { WalkContext } from '../../engine/walk-context.js';
import { transcriptOf } from '../../engine/transcript.js';
import type { WalkStep } from '../../engine/step-view.js';
import type { Wordings } from '../walk/wording.js';
import { faultLabel, NO_FAULT } from '../../diagnosis/dictionary-model.js';

/**
 * A walk told as a case, for whoever picks it up next (a colleague, the support chat): the board
 * and symptom, changed parts, each reading against its band, the suspects with reasons and what to
 * measure next — with the question to put to the customer in plain words. Pure: built from the
 * engine's transcript of the walk; nothing is computed here.
 */
export interface CaseSummary {
  board: { id: string; name: string };
  tree: { id: string; symptom: string };
  wording: Wordings;
  finished: boolean;
  substitutions: Array<{ ref: string; value: string; was?: string }>;
  readings: Array<{
    testPoint: string;
    label: string;
    condition: string;
    text: string;
    value: number;
    unit: 'V' | 'Ω';
    min: number;
    max: number;
    nominal: number;
    outcome: string;
  }>;
  answers: Array<{ step: string; question: string; answer: string }>;
  skipped: Array<{ step: string; reason: string }>;
  /** `faultPresent`: the walk concluded a fault, so the suspects leave "no fault" out. */
  conclusion?: { title: string; advice: string; parts: string[]; faultPresent?: boolean };
  suspects: Array<{ rank: number; parts: string[]; faults: string[]; probability: number; why: string; where: string[] }>;
  /** Readings no single modelled fault explains, as sentences (the suspects are then only the nearest fits). */
  unexplained: string[];
  /**
   * `caution` is the powered-work caution in the summary's wording, present when the reading needs
   * power; `question` then opens with it (the person at the board may not have seen the walk's own).
   */
  next?: { testPoint: string; label: string; condition: string; conditionLabel: string; caution?: string; probe: string; question: string };
  /** Where the walk stands when it is not finished: the step waiting for an answer. */
  waitingAt?: { step: string; kind: string; prompt: string };
}

export function buildCaseSummary(walk: WalkSetup, snapshot: { value: unknown; context: WalkContext }, wording: Wordings): CaseSummary {
  const t = transcriptOf(walk, snapshot);
  const board = walk.view.board;
  const current = t.current;
  const summary: CaseSummary = {
    board: t.board,
    tree: t.tree,
    wording,
    finished: current.kind === 'conclude',
    substitutions: Object.entries(t.substitutions).map(([ref, value]) => ({ ref, value: String(value), was: wasValue(board, ref) })),
    readings: t.entries.flatMap((e) =>
      e.reading && e.expected && e.testPoint
        ? [
            {
              testPoint: e.testPoint.id,
              label: e.testPoint.label,
              condition: e.condition?.label ?? '',
              text: e.reading.text,
              value: e.reading.value,
              unit: e.expected.unit,
              min: e.expected.min,
              max: e.expected.max,
              nominal: e.expected.nominal,
              outcome: e.reading.outcome,
            },
          ]
        : [],
    ),
    answers: t.entries.flatMap((e) => (e.answer && (e.kind === 'observe' || e.kind === 'inspect') ? [{ step: e.node, question: firstSentence(e.say[wording]), answer: e.answer.label }] : [])),
    skipped: t.entries.flatMap((e) => (e.skipped ? [{ step: e.node, reason: e.skipped }] : [])),
    suspects: [],
    unexplained: [],
  };
  if (current.conclusion) {
    summary.conclusion = {
      title: current.conclusion.title,
      advice: current.say[wording],
      parts: current.conclusion.parts.map((p) => p.ref),
      ...(current.conclusion.faultPresent ? { faultPresent: true } : {}),
    };
    summary.suspects = groupSuspects(board, current.conclusion.suspects ?? [], current.conclusion.groups ?? []);
    summary.unexplained = current.conclusion.unexplained ?? [];
  } else {
    summary.waitingAt = { step: current.node, kind: current.kind, prompt: current.say[wording] };
  }
  summary.next = nextQuestion(board, current, wording);
  return summary;
}

type Conclusion = NonNullable<WalkStep['conclusion']>;
type Suspects = NonNullable<Conclusion['suspects']>;

/**
 * Suspects the readings cannot tell apart share a group; a group is one line of the case. The
 * ranking's own groups give each line every member and the group's whole probability: the shown
 * suspects are only the most likely few, and a group of a healthy board with forty faults no test
 * point sees would otherwise be summed over the three of them that made the list.
 */
export function groupSuspects(board: Board, suspects: Suspects, groups: NonNullable<Conclusion['groups']>) {
  const whole = new Map(groups.map((g) => [g.group, g]));
  const shown = new Map<number, Suspects>();
  for (const s of suspects) shown.set(s.group, [...(shown.get(s.group) ?? []), s]);
  return [...shown.entries()]
    .map(([n, members]) => {
      const g = whole.get(n);
      const parts = g ? g.parts.filter((p) => p !== NO_FAULT) : [...new Set(members.map((m) => m.part).filter((p) => p !== NO_FAULT))];
      return {
        parts,
        faults: g ? g.labels : members.map(faultLabel),
        probability: g ? g.probability : members.reduce((sum, m) => sum + m.probability, 0),
        why: members[0].why,
        where: [...new Set(parts.map((ref) => board.parts.find((p) => p.ref === ref)?.where).filter((w): w is string => Boolean(w)))],
      };
    })
    .sort((a, b) => b.probability - a.probability)
    .map((g, i) => ({ rank: i + 1, ...g }));
}

/** The next reading to ask for: the step the walk waits at, else the ranking's suggested probe. */
export function nextQuestion(board: Board, current: WalkStep, wording: Wordings): CaseSummary['next'] {
  if (current.kind === 'measure' && current.testPoint && current.condition) {
    return {
      testPoint: current.testPoint.id,
      label: current.testPoint.label,
      condition: current.condition.id,
      conditionLabel: current.condition.label,
      probe: current.testPoint.probe,
      ...withCaution(current.condition.powered, wording, wording === 'customer' ? current.say.customer : `${current.say.technician} (${current.testPoint.probe})`),
    };
  }
  const s = current.suggestion;
  if (!s) return undefined;
  const tp = board.testPoints.find((x) => x.id === s.testPoint);
  const cond = board.conditions.find((c) => c.id === s.condition);
  if (!tp || !cond) return undefined;
  const unit = tp.quantity === 'resistance' ? 'ohms' : 'volts';
  const question =
    wording === 'customer'
      ? `Could you take one more reading? First: ${sentence(cond.instructions)} Then place the meter's probes like this: ${sentence(tp.probe)} What number does the meter show, in ${unit}?`
      : // Single quotes inside: the summary puts the whole question in double quotes.
        `Measure ${tp.id} (${tp.label}) under '${cond.label}': ${sentence(tp.probe)}`;
  return { testPoint: tp.id, label: tp.label, condition: cond.id, conditionLabel: cond.label, probe: tp.probe, ...withCaution(cond.powered, wording, question) };
}

/**
 * What to say before any powered reading, in each wording (SAFETY.md): the supply is mains powered,
 * and the rails are live once it is on.
 */
export const POWERED_CAUTION: Record<Wordings, string> = {
  technician: `Caution, powered: ${HAZARDS['mains-supply']}; ${HAZARDS.rails}.`,
  customer:
    'Please take care: the power supply runs from the mains, so keep it closed and dry. Once the module is on, its ±12 V supply is live: ' +
    'keep the black probe on ground, move only the red one, and never let a probe tip touch two pins at once.',
};

/** The question, opened by the caution when the reading needs power. */
function withCaution(powered: boolean, wording: Wordings, question: string): { caution?: string; question: string } {
  if (!powered) return { question };
  const caution = POWERED_CAUTION[wording];
  return { caution, question: `${caution} ${question}` };
}

function wasValue(board: Board, ref: string): string | undefined {
  const v = board.parts.find((p) => p.ref === ref)?.value;
  return v === undefined ? undefined : String(v);
}

function sentence(text: string): string {
  const t = text.trim();
  return /[.!?]$/.test(t) ? t : `${t}.`;
}

/**
 * The sentence that names the check: the first of at least MIN_WORDS words, so a short preamble such
 * as "Power off." does not stand for "Check the meter LEDs' orientation".
 */
export function firstSentence(text: string): string {
  // A sentence ends at . ? or ! before a space: "11.77 V" does not end one.
  const sentences = text.split(/(?<=[.?!])\s+/).map((s) => s.trim()).filter(Boolean);
  return (sentences.find((s) => s.split(/\s+/).length >= MIN_WORDS) ?? sentences[0] ?? text).slice(0, 120);
}
const MIN_WORDS = 4;
