import { describe, expect, it, vi } from 'vitest';
import { createActor, initialTransition, transition } from 'xstate';

// The ranking needs the solver and a real board; these tests are about routing and guards only.
vi.mock('../../src/engine/ranking.js', () => ({ rankFor: () => ({ note: 'ranking left out of engine tests' }) }));
vi.mock('../../src/engine/board-view.js', () => ({ createBoardView: () => { throw new Error('engine tests use fakeView'); } }));

import { walkMachineFor } from '../../src/engine/walk-machine.js';
import { answerEvent, currentStep, probeEvent, readingEvent, substituteEvent } from '../../src/engine/step-view.js';
import { SAFETY_HOLD } from '../../src/engine/walk-context.js';
import { transcriptOf } from '../../src/engine/transcript.js';
import { UserInputError } from '../../src/errors.js';
import { fakeView, smallTree } from './fake-view.js';

function walkTo(tree = smallTree(), view = fakeView()) {
  const { machine, walk } = walkMachineFor(tree, view);
  const actor = createActor(machine).start();
  const step = () => currentStep(walk, actor.getSnapshot());
  return { actor, walk, machine, step };
}

function toPoweredMeasure() {
  const w = walkTo();
  w.actor.send(answerEvent(w.step(), 'ok'));
  w.actor.send(readingEvent(w.step(), '10k'));
  w.actor.send({ type: 'user.acknowledge' });
  w.actor.send({ type: 'user.acknowledge' });
  return w;
}

describe('walk machine: routing', () => {
  it('starts at the tree start and follows inspect -> measure -> caution -> setup -> measure', () => {
    const w = walkTo();
    expect(w.step()).toMatchObject({ node: 'look', kind: 'inspect' });
    w.actor.send(answerEvent(w.step(), 'ok'));
    expect(w.step()).toMatchObject({ node: 'ohms', kind: 'measure', expected: { min: 9e3, max: 11e3, unit: 'Ω' } });
    w.actor.send(readingEvent(w.step(), '10k'));
    expect(w.step()).toMatchObject({ node: 'warn', kind: 'caution' });
    w.actor.send({ type: 'user.acknowledge' });
    expect(w.step()).toMatchObject({ node: 'power', kind: 'setup' });
    w.actor.send({ type: 'user.acknowledge' });
    expect(w.step()).toMatchObject({ node: 'out', kind: 'measure', expected: { nominal: 4.7 } });
    expect(w.actor.getSnapshot().context.acknowledged.sort()).toEqual(['mains-supply', 'rails']);
  });

  it.each([
    ['4.7 V', 'end-ok', 'in-band'],
    ['4.1', 'end-low', 'low'],
    ['11.2', 'end-rail', 'stuck-at-rail'],
    ['-11.4 V', 'end-rail', 'stuck-at-rail'],
    ['6.0', 'end-other', 'high'],
    // near-zero has no branch of its own here; below the band it falls back to "low"
    ['10mV', 'end-low', 'near-zero'],
  ])('a reading of %s goes to %s (%s)', (text, end, outcome) => {
    const w = toPoweredMeasure();
    w.actor.send(readingEvent(w.step(), text));
    expect(w.step().node).toBe(end);
    expect(w.actor.getSnapshot().context.readings.out.outcome).toBe(outcome);
  });

  it('a near-zero resistance takes the near-zero branch (a short)', () => {
    const w = walkTo();
    w.actor.send(answerEvent(w.step(), 'ok'));
    w.actor.send(readingEvent(w.step(), '0.3'));
    expect(w.step().node).toBe('end-short');
  });

  it('a typo in a reading is a one-line UserInputError, not an outcome', () => {
    const w = toPoweredMeasure();
    const attempt = () => readingEvent(w.step(), '4.7.1 V');
    expect(attempt).toThrow(UserInputError);
    try {
      attempt();
    } catch (e) {
      const message = (e as UserInputError).message;
      expect(message.split('\n')).toHaveLength(1);
      expect(message).toContain('TP1');
    }
    expect(w.step().node).toBe('out');
  });

  it('an answer that is not a choice names the accepted ones', () => {
    const w = walkTo();
    expect(() => answerEvent(w.step(), 'maybe')).toThrow(/ok, fault/);
  });

  it('a part substitution changes the expected band for the rest of the walk', () => {
    const w = toPoweredMeasure();
    expect(w.step().expected?.nominal).toBeCloseTo(4.7);
    w.actor.send(substituteEvent(w.walk, 'r1', '5k6'));
    expect(w.actor.getSnapshot().context.substitutions).toEqual({ R1: '5k6' });
    expect(w.step().expected?.nominal).toBeCloseTo(5.6);
    // 4.7 V was in band before the change; now it is low
    w.actor.send(readingEvent(w.step(), '4.7'));
    expect(w.step().node).toBe('end-low');
  });

  it('refuses substitutions for parts the board lacks or impossible values', () => {
    const w = walkTo();
    expect(() => substituteEvent(w.walk, 'R99', '1k')).toThrow(/no part "R99"/);
    expect(() => substituteEvent(w.walk, 'U1', '1k')).toThrow(/only resistors/);
    expect(() => substituteEvent(w.walk, 'R1', 'banana')).toThrow(UserInputError);
  });

  it('user.back returns to the previous step and forgets its answer, but keeps acknowledged cautions', () => {
    const w = toPoweredMeasure();
    w.actor.send({ type: 'user.back' });
    expect(w.step().node).toBe('power');
    w.actor.send({ type: 'user.back' });
    expect(w.step().node).toBe('warn');
    expect(w.actor.getSnapshot().context.answers.warn).toBeUndefined();
    expect(w.actor.getSnapshot().context.acknowledged).toContain('rails');
    w.actor.send({ type: 'user.back' });
    expect(w.step().node).toBe('ohms');
    expect(w.actor.getSnapshot().context.readings.ohms).toBeUndefined();
  });

  it('skips a step whose role the board lacks, and says so', () => {
    const w = walkTo(smallTree(), fakeView({ lacks: ['input-opamp'] }));
    const step = w.step();
    expect(step.node).toBe('ohms');
    expect(step.skippedOnTheWay).toEqual([{ node: 'look', reason: expect.stringContaining('"input-opamp"') }]);
  });

  it('an orientation check whose role holds only parts with no wrong way round is skipped, saying why', () => {
    const tree = smallTree();
    tree.nodes.look = { ...tree.nodes.look, part: 'input-gain-pot' } as typeof tree.nodes.look;
    const w = walkTo(tree);
    expect(w.step().node).toBe('ohms');
    expect(w.step().skippedOnTheWay).toEqual([{ node: 'look', reason: expect.stringContaining('fitted the wrong way round') }]);
  });

  it('the person may skip a measurement: the walk goes on as if in band, and the skip is recorded', () => {
    const w = toPoweredMeasure();
    w.actor.send({ type: 'user.skip' });
    expect(w.step().node).toBe('end-ok');
    expect(w.actor.getSnapshot().context.skipped.out).toBe('skipped by the person');
  });

  it('a skipped measurement with no in-band branch takes the default branch', () => {
    const w = walkTo();
    w.actor.send(answerEvent(w.step(), 'ok'));
    w.actor.send({ type: 'user.skip' });
    expect(w.step().node).toBe('warn');
  });

  it('works with the pure transition functions too', () => {
    const { machine } = walkMachineFor(smallTree(), fakeView());
    const [s0] = initialTransition(machine);
    expect(s0.value).toBe('look');
    const [s1] = transition(machine, s0, { type: 'user.answer', choice: 'fault' });
    expect(s1.value).toBe('end-reversed');
  });
});

describe('walk machine: runtime safety guard', () => {
  // A tree the loader would reject: a powered measurement with no caution before it. Compiled
  // directly, the machine must still refuse to present the step.
  const unsafe = () =>
    smallTree({
      ohms: { kind: 'measure', testPoint: 'pos-rail-resistance', condition: 'unpowered', powered: false, say: { technician: 'o', customer: 'o' }, branches: { default: 'out' } },
    });

  it('holds before a powered step whose caution was not acknowledged', () => {
    const w = walkTo(unsafe());
    w.actor.send(answerEvent(w.step(), 'ok'));
    w.actor.send(readingEvent(w.step(), '10k'));
    const snapshot = w.actor.getSnapshot();
    expect(snapshot.value).toBe(SAFETY_HOLD);
    expect(snapshot.context.blocked).toEqual({ node: 'out', missing: ['rails'] });
    expect(snapshot.context.trail).not.toContain('out');
    const step = w.step();
    expect(step.kind).toBe('blocked');
    expect(step.testPoint).toBeUndefined();
    // a reading sent anyway changes nothing
    w.actor.send({ type: 'user.reading', value: 4.7, text: '4.7' });
    expect(w.actor.getSnapshot().value).toBe(SAFETY_HOLD);
    expect(w.actor.getSnapshot().context.readings.out).toBeUndefined();
  });

  it('records a reading off the route under power only once the rails caution was acknowledged', () => {
    const w = walkTo();
    // Unpowered: taken at once.
    w.actor.send({ type: 'user.probe', testPoint: 'TP2', condition: 'off', value: 1e4 });
    // Powered, before the caution step: refused (not recorded); likewise a condition the board does not name.
    w.actor.send({ type: 'user.probe', testPoint: 'TP1', condition: 'rest', value: 4.7 });
    w.actor.send({ type: 'user.probe', testPoint: 'TP1', condition: 'made-up', value: 4.7 });
    expect(w.actor.getSnapshot().context.extraReadings.map((r) => r.condition)).toEqual(['off']);
    // After the caution: taken.
    w.actor.send(answerEvent(w.step(), 'ok'));
    w.actor.send(readingEvent(w.step(), '10k'));
    w.actor.send({ type: 'user.acknowledge' });
    w.actor.send({ type: 'user.probe', testPoint: 'TP1', condition: 'rest', value: 4.7 });
    expect(w.actor.getSnapshot().context.extraReadings.map((r) => r.condition)).toEqual(['off', 'rest']);
    // Both go into the transcript after the tree's own steps, judged against their bands.
    const probes = transcriptOf(w.walk, w.actor.getSnapshot()).entries.filter((e) => e.node.startsWith('probe-'));
    expect(probes.map((e) => [e.node, e.testPoint?.id, e.condition?.id, e.reading?.outcome])).toEqual([
      ['probe-1', 'TP2', 'off', 'in-band'],
      ['probe-2', 'TP1', 'rest', 'in-band'],
    ]);
    expect(probes[1].expected?.text).toBe('4.50 V to 4.90 V (nominal 4.70 V)');
  });

  it('builds a probe event from what was typed at a suggested test point, or names the accepted forms', () => {
    const w = walkTo();
    expect(probeEvent(w.walk, 'TP1', 'rest', '4.7')).toEqual({ type: 'user.probe', testPoint: 'TP1', condition: 'rest', value: 4.7 });
    expect(probeEvent(w.walk, 'TP2', 'off', '10k')).toMatchObject({ value: 10_000 });
    // A resistance past the meter's top range is read as overload.
    expect(probeEvent(w.walk, 'TP2', 'off', 'OL')).toMatchObject({ value: Infinity });
    expect(() => probeEvent(w.walk, 'TP1', 'rest', '4.7x')).toThrow(UserInputError);
    expect(() => probeEvent(w.walk, 'TP1', 'rest', '4.7x')).toThrow(/reading at TP1/);
    expect(() => probeEvent(w.walk, 'TP9', 'rest', '1')).toThrow(/no such test point or condition/);
  });

  it('user.back leaves the hold for the step before it', () => {
    const w = walkTo(unsafe());
    w.actor.send(answerEvent(w.step(), 'ok'));
    w.actor.send(readingEvent(w.step(), '10k'));
    expect(w.step().kind).toBe('blocked');
    w.actor.send({ type: 'user.back' });
    expect(w.step().node).toBe('ohms');
    expect(w.actor.getSnapshot().context.blocked).toBeNull();
  });

  it('lets the same step through once the hazard was acknowledged in this session', () => {
    const { machine } = walkMachineFor(unsafe(), fakeView());
    const [s0] = initialTransition(machine);
    const primed = machine.resolveState({ value: 'look', context: { ...s0.context, acknowledged: ['rails'] } });
    const [s1] = transition(machine, primed, { type: 'user.answer', choice: 'ok' });
    const [s2] = transition(machine, s1, { type: 'user.reading', value: 1e4, text: '10k' });
    expect(s2.value).toBe('out');
  });

  it('gates a step the board calls powered even when the tree says unpowered', () => {
    const tree = smallTree({
      ohms: { kind: 'measure', testPoint: 'input-stage-output', condition: 'quiescent', powered: false, say: { technician: 'o', customer: 'o' }, branches: { default: 'end-ok' } },
    });
    const w = walkTo(tree);
    w.actor.send(answerEvent(w.step(), 'ok'));
    expect(w.actor.getSnapshot().value).toBe(SAFETY_HOLD);
  });
});

describe('readings the engine cannot judge', () => {
  it('accepts the overload display for an open resistance', () => {
    const w = walkTo();
    w.actor.send(answerEvent(w.step(), 'ok'));
    expect(readingEvent(w.step(), 'OL')).toEqual({ type: 'user.reading', value: Infinity, text: 'OL' });
    // a voltage step does not take "OL"
    const v = toPoweredMeasure();
    expect(() => readingEvent(v.step(), 'OL')).toThrow(UserInputError);
  });

  it('refuses a reading where no band could be computed, naming the step', () => {
    const view = fakeView();
    const { machine, walk } = walkMachineFor(smallTree(), { ...view, band: (tp, c, subs) => (subs.R1 ? undefined : view.band(tp, c, subs)) });
    const actor = createActor(machine).start();
    const step = () => currentStep(walk, actor.getSnapshot());
    actor.send(answerEvent(step(), 'ok'));
    actor.send(substituteEvent(walk, 'R1', '1k'));
    expect(step().expected).toBeUndefined();
    expect(() => readingEvent(step(), '10k')).toThrow(/no expected value could be computed at TP2/);
  });
});
