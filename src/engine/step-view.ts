import { UserInputError } from '../errors.js';
import type { Hazard, TreeNode, Wording } from '../schemas/tree.js';
import { HAZARDS } from '../schemas/tree.js';
import { bandsFor, formatBand, formatReading, formatValue, parseHissReading, parseReading, parseValue, toDbu } from '../units/index.js';
import type { ExpectedBand } from './outcome.js';
import type { TimeBand } from '../circuit/analysis/detector-times.js';
import { rankFor, type Ranking } from './ranking.js';
import { SAFETY_HOLD, type WalkContext, type WalkEvent } from './walk-context.js';
import { backTarget, type WalkSetup } from './walk-machine.js';

export interface PartView {
  ref: string;
  where: string;
  label?: string;
  orientation?: string;
  value?: string;
  /** Colour bands a resistor of that value shows (IEC 60062), for value checks. */
  bands?: string[];
}

/**
 * One step of a walk as the UI (or a transcript) shows it: the wording in both registers, and
 * everything computed for it on this board. Fields apply to the kinds named beside them.
 */
export interface WalkStep {
  /** Tree node id, or "safety_hold" when the runtime guard stopped the walk. */
  node: string;
  kind: 'caution' | 'setup' | 'measure' | 'observe' | 'inspect' | 'conclude' | 'blocked';
  say: Wording;
  /** Steps passed over since the previous step the person saw, with the reason (e.g. the board lacks the role). */
  skippedOnTheWay: Array<{ node: string; reason: string }>;
  canGoBack: boolean;
  canSkip: boolean;
  /** caution: what it covers, with each hazard in words. */
  covers?: Array<{ hazard: Hazard; text: string }>;
  /** setup, measure: the board's condition. */
  condition?: { id: string; label: string; instructions: string; powered: boolean };
  /** measure: where the probes go and the band expected for the current part values. */
  testPoint?: { id: string; label: string; probe: string; quantity: 'voltage' | 'resistance' };
  expected?: ExpectedBand & { text: string };
  /** measure (when the tree asks for it) and conclude: the ranking's next best probe. */
  suggestion?: Ranking['next'];
  /** observe, inspect: the answers accepted by `user.answer`. */
  choices?: Array<{ id: string; label: string; customerLabel?: string }>;
  instrument?: 'senses' | 'multimeter' | 'oscilloscope';
  /**
   * observe: what the board's parts say the answer should be (a detector time); caution before a
   * first power-up: the idle draw to set the current limit by. See expectationOf.
   */
  expectation?: string;
  /** inspect: what to look at and the parts behind the role. */
  look?: string;
  parts?: PartView[];
  /** conclude: what was found, the parts behind the roles, the ranked suspects when the ranking is available. */
  conclusion?: { title: string; parts: PartView[]; suspects?: Ranking['suspects']; groups?: Ranking['groups']; faultPresent?: boolean; unexplained?: string[]; rankingNote?: string };
  /** blocked: the step refused and the hazards not acknowledged. */
  blocked?: { node: string; missing: Array<{ hazard: Hazard; text: string }> };
}

/** What a person may type for a resistance the meter cannot show: the overload display. */
export const OVERLOAD = /^\s*(ol|o\.l\.?|overload|open|inf(inity)?|∞)\s*$/i;

/**
 * The two answers to every inspection. A customer is shown words, not a picture: the question
 * describes what to look for, so the answer says whether the board matches that description.
 */
export const INSPECT_CHOICES = [
  { id: 'ok', label: 'looks right', customerLabel: 'it matches the description' },
  { id: 'fault', label: 'found a problem', customerLabel: 'something looks different' },
] as const;

/** A value as a person reads it; an infinite resistance is the meter's overload display. */
export function showValue(value: number, unit: string, figures?: number): string {
  return Number.isFinite(value) ? formatReading(value, unit, figures) : 'overload (open)';
}

export function describeBand(band: ExpectedBand): string {
  if (band.kind === 'noise') {
    const shown = formatBand(band.min, band.max, band.nominal, band.unit);
    return `${shown.min} to ${shown.max} rms (nominal ${shown.nominal}, ${toDbu(band.nominal).toFixed(1)} dBu)`;
  }
  if (!Number.isFinite(band.min) && !Number.isFinite(band.max)) return `open: the meter shows overload (OL)`;
  if (!Number.isFinite(band.max)) return `${showValue(band.min, band.unit)} or more, up to overload (nominal ${showValue(band.nominal, band.unit)})`;
  const shown = formatBand(band.min, band.max, band.nominal, band.unit);
  return `${shown.min} to ${shown.max} (nominal ${shown.nominal})`;
}

/**
 * A detector time as the person reads it beside the question: "release time (10–90 %), release knob
 * at its slow end: 2.25 s (1.72 s to 2.82 s with part tolerances), from R22 22 kΩ + RV3 1 MΩ with C14".
 */
export function describeTime(t: TimeBand): string {
  const shown = formatBand(t.min, t.max, t.nominal, 's');
  // A pot at the end of its track adds next to nothing: name only the parts that set the time.
  const path = t.path.parts.filter((p) => p.ohms >= 1).map((p) => `${p.ref} ${formatValue(p.ohms, 'Ω')}`).join(' + ');
  const knob = t.path.parts.some((p) => p.position !== undefined) ? `, ${t.which} knob at its ${t.knob === 'fastest' ? 'fast' : 'slow'} end` : '';
  return `${t.which} time (10–90 %)${knob}: ${shown.nominal} (${shown.min} to ${shown.max} with part tolerances), from ${path} with ${t.capacitors.join(' + ')}`;
}

/**
 * What a step should find on this board, worked out from its parts, in words: the detector time an
 * observe step asks about, or the idle draw to set the current limit by before a first power-up.
 * Undefined when the step asks for nothing, or the board lacks what it takes.
 */
export function expectationOf(walk: WalkSetup, node: TreeNode, context: WalkContext): string | undefined {
  if (node.kind === 'caution' && node.covers.includes('first-power-up-current-limit')) {
    const draw = walk.view.idleDraw(context.substitutions);
    if (!draw || draw.some((d) => !Number.isFinite(d.amps))) return undefined;
    return `idle draw about ${inWords(draw.map((d) => `${formatValue(d.amps, 'A')} from ${d.rail}`))} (worked out from the parts, op-amps at their typical supply current): set the current limit a little above it`;
  }
  if (node.kind !== 'observe' || !node.expect) return undefined;
  if ('leds' in node.expect) {
    const leds = walk.view.ledCurrents(node.expect.leds, node.expect.condition, context.substitutions);
    return leds && !leds.some((l) => !Number.isFinite(l.amps)) ? describeLeds(leds) : undefined;
  }
  const time = walk.view.time(node.expect.time, node.expect.knob, context.substitutions);
  return time && describeTime(time);
}

/**
 * How bright an LED looks at a current: lit from LED_LIT_AMPS, faint from LED_FAINT_AMPS, else dark.
 * A judgement for indicator LEDs in a lit room (they are specified at 2–20 mA and still glow,
 * dimly, at a tenth of a milliamp), not a datasheet figure.
 */
export const LED_LIT_AMPS = 1e-3;
export const LED_FAINT_AMPS = 0.1e-3;

/** "LED2, LED3 and LED4 lit (5.00 mA each); LED5 dark (4 µA)", from the solved currents. */
export function describeLeds(leds: Array<{ ref: string; amps: number }>): string {
  const look = (amps: number) => (amps >= LED_LIT_AMPS ? 'lit' : amps >= LED_FAINT_AMPS ? 'faint' : 'dark');
  const groups = (['lit', 'faint', 'dark'] as const)
    .map((state) => ({ state, leds: leds.filter((l) => look(l.amps) === state) }))
    .filter((g) => g.leds.length > 0)
    .map(({ state, leds: some }) => {
      const names = inWords(some.map((l) => l.ref));
      const currents = some.map((l) => formatValue(Math.max(l.amps, 0), 'A')).join(', ');
      return `${names} ${state} (${currents})`;
    });
  return `${groups.join('; ')}, from the currents the solver finds in them`;
}

function partView(walk: WalkSetup, ref: string, context: WalkContext): PartView {
  const part = walk.view.board.parts.find((p) => p.ref === ref)!;
  const raw = context.substitutions[ref] ?? part.value;
  const view: PartView = { ref, where: part.where, label: part.label, orientation: part.orientation };
  if (raw !== undefined) {
    view.value = String(raw);
    if (part.kind === 'resistor') {
      const ohms = typeof raw === 'number' ? raw : parseValue(raw, { unit: 'Ω' }).value;
      view.bands = bandsFor(ohms, part.tolerance ?? 0.01);
    }
  }
  return view;
}

/** Skipped steps between the last step seen and the current one, read off the trail. */
function skippedTail(context: WalkContext, current: string): Array<{ node: string; reason: string }> {
  const trail = context.trail.at(-1) === current ? context.trail.slice(0, -1) : context.trail;
  const out: Array<{ node: string; reason: string }> = [];
  for (let i = trail.length - 1; i >= 0 && context.skipped[trail[i]] !== undefined; i--) out.unshift({ node: trail[i], reason: context.skipped[trail[i]] });
  return out;
}

/** The current step of a walk, from the machine's snapshot. Pure: the same snapshot gives the same step. */
export function currentStep(walk: WalkSetup, snapshot: { value: unknown; context: WalkContext }): WalkStep {
  const { context } = snapshot;
  const id = String(snapshot.value);
  const base = { node: id, skippedOnTheWay: skippedTail(context, id), canGoBack: backTarget(context) !== undefined, canSkip: false };
  const hazardText = (h: Hazard) => ({ hazard: h, text: HAZARDS[h] });
  if (id === SAFETY_HOLD) {
    const blocked = context.blocked ?? { node: '?', missing: [] };
    const missing = blocked.missing.map((h) => HAZARDS[h]).join('; ');
    return {
      ...base,
      kind: 'blocked',
      say: {
        technician: `Stopped before "${blocked.node}": it needs power, and its caution was not acknowledged in this session (${missing}). Go back and acknowledge it.`,
        customer: `Let's stop here: the next check needs the module switched on, and we have not gone through the safety notes for that yet. Go back one step.`,
      },
      blocked: { node: blocked.node, missing: blocked.missing.map(hazardText) },
    };
  }
  const plan = walk.plans[id];
  const node = plan.node;
  const condition = plan.condition && { id: plan.condition.id, label: plan.condition.label, instructions: plan.condition.instructions, powered: plan.condition.powered };
  switch (node.kind) {
    case 'caution': {
      const expectation = expectationOf(walk, node, context);
      return { ...base, kind: 'caution', say: node.say, covers: node.covers.map(hazardText), ...(expectation ? { expectation } : {}) };
    }
    case 'setup':
      return { ...base, kind: 'setup', say: node.say, condition };
    case 'measure': {
      const tp = plan.testPoint!;
      const band = walk.view.band(tp.id, plan.condition!.id, context.substitutions, node.quantity);
      const step: WalkStep = {
        ...base,
        kind: 'measure',
        say: node.say,
        canSkip: true,
        condition,
        testPoint: { id: tp.id, label: tp.label, probe: tp.probe, quantity: tp.quantity },
        expected: band && { ...band, text: describeBand(band) },
      };
      if (node.suggestProbe) step.suggestion = rankFor(walk, context).next;
      return step;
    }
    case 'observe': {
      const expectation = expectationOf(walk, node, context);
      return {
        ...base,
        kind: 'observe',
        say: node.say,
        canSkip: node.alternative !== undefined,
        instrument: node.instrument,
        choices: Object.entries(node.choices).map(([cid, c]) => ({ id: cid, label: c.label, customerLabel: c.customerLabel })),
        ...(expectation ? { expectation } : {}),
      };
    }
    case 'inspect':
      return {
        ...base,
        kind: 'inspect',
        say: node.say,
        canSkip: true,
        look: node.look,
        parts: plan.parts.map((p) => partView(walk, p.ref, context)),
        choices: [...INSPECT_CHOICES],
      };
    case 'conclude': {
      // A conclusion that names parts is a fault the person has seen (the meter stays dark), whatever
      // the readings say: many faults read as a healthy board does at every test point.
      const ranking = rankFor(walk, context, node.parts.length > 0);
      return {
        ...base,
        kind: 'conclude',
        say: node.say,
        suggestion: ranking.next,
        conclusion: { title: node.title, parts: plan.parts.map((p) => partView(walk, p.ref, context)), suspects: ranking.suspects, groups: ranking.groups, faultPresent: ranking.faultPresent, unexplained: ranking.unexplained, rankingNote: ranking.note },
      };
    }
  }
}

/**
 * Turns what the person typed at a measure step into the machine's event. A typo is a
 * UserInputError naming the test point and the accepted forms — never an outcome.
 */
export function readingEvent(step: WalkStep, text: string): WalkEvent {
  if (step.kind !== 'measure' || !step.testPoint) {
    throw new UserInputError({ code: 'walk.not-a-measurement', path: step.node, message: `step "${step.node}" does not take a reading`, accepted: 'a reading only at a measure step' });
  }
  if (!step.expected) {
    throw new UserInputError({
      code: 'walk.no-band',
      path: step.node,
      message: `no expected value could be computed at ${step.testPoint.id} with the parts as changed, so this reading cannot be judged`,
      accepted: 'undo the part change, or skip this step',
    });
  }
  if (step.expected.kind === 'noise') return { type: 'user.reading', value: parseHissReading(text, `hiss level at ${step.testPoint.id} (${step.node})`), text };
  // A meter on an open circuit shows overload ("OL") rather than a number.
  if (step.testPoint.quantity === 'resistance' && OVERLOAD.test(text)) return { type: 'user.reading', value: Infinity, text };
  const value = parseReading(text, step.testPoint.quantity, `reading at ${step.testPoint.id} (${step.node})`);
  return { type: 'user.reading', value, text };
}

/**
 * A reading taken off the tree's route, at the ranking's suggested probe (or any test point under
 * any condition of the board): the test point and condition checked against the board, the text
 * parsed as that test point's quantity ("OL" for an open resistance). A typo is a UserInputError
 * naming the test point and the accepted forms. The machine records it only where the walk's
 * cautions allow it (see probeAllowed).
 */
export function probeEvent(walk: WalkSetup, testPointId: string, conditionId: string, text: string): WalkEvent {
  const board = walk.view.board;
  const tp = board.testPoints.find((t) => t.id === testPointId);
  const condition = board.conditions.find((c) => c.id === conditionId);
  if (!tp || !condition) {
    throw new UserInputError({ code: 'walk.unknown-probe', path: `${testPointId} under ${conditionId}`, message: 'this board has no such test point or condition', accepted: 'a test point and condition of the board' });
  }
  if (tp.quantity === 'resistance' && OVERLOAD.test(text)) return { type: 'user.probe', testPoint: tp.id, condition: condition.id, value: Infinity };
  return { type: 'user.probe', testPoint: tp.id, condition: condition.id, value: parseReading(text, tp.quantity, `reading at ${tp.id}`) };
}

/** The answer event for an observe or inspect step; an unknown choice names the accepted ones. */
export function answerEvent(step: WalkStep, choice: string): WalkEvent {
  const ids = (step.choices ?? []).map((c) => c.id);
  if (!ids.includes(choice)) {
    throw new UserInputError({ code: 'walk.unknown-choice', path: step.node, message: `"${choice}" is not an answer to step "${step.node}"`, accepted: ids.join(', ') || 'no answer: this step takes none' });
  }
  return { type: 'user.answer', choice };
}

/** A part swapped on the board: the designator must exist and the value must parse as that part's kind. */
export function substituteEvent(walk: WalkSetup, ref: string, value: string): WalkEvent {
  const part = walk.view.board.parts.find((p) => p.ref.toUpperCase() === ref.trim().toUpperCase());
  if (!part) {
    throw new UserInputError({ code: 'walk.unknown-part', path: ref, message: `this board has no part "${ref}"`, accepted: 'a designator from the board, e.g. R12' });
  }
  const unit = { resistor: 'Ω', pot: 'Ω', capacitor: 'F', electrolytic: 'F', inductor: 'H' }[part.kind as string] as 'Ω' | 'F' | 'H' | undefined;
  if (!unit) {
    throw new UserInputError({ code: 'walk.not-substitutable', path: part.ref, message: `${part.ref} is a ${part.kind}; only resistors, pots, capacitors and inductors take a new value here`, accepted: 'a passive part' });
  }
  const parsed = parseValue(value, { unit, field: `new value of ${part.ref}` });
  if (!(parsed.value > 0)) {
    throw new UserInputError({ code: 'walk.impossible-value', path: part.ref, message: `${value} is not a possible value for ${part.ref}`, accepted: `a positive value in ${unit}` });
  }
  return { type: 'user.substitute', ref: part.ref, value: value.trim() };
}

/** "a", "a and b", "a, b and c". */
function inWords(items: string[]): string {
  return items.length > 1 ? `${items.slice(0, -1).join(', ')} and ${items.at(-1)}` : (items[0] ?? '');
}
