import { describe, expect, it } from 'vitest';
import { createActor } from 'xstate';
import { DEMO_BOARD_FILE, loadBoard, measureAll } from '../../src/board/index.js';
import { detectorTimeBand } from '../../src/circuit/analysis/index.js';
import { createWalkMachine, currentStep, findTree, formatTranscriptText, walkFromAnswers } from '../../src/engine/index.js';

/**
 * The pumping-release tree's release question shows the release time this board's parts give,
 * with the release knob at its slow end, as a band over their tolerances; the person answers
 * against it, so a board whose healthy release is 50 ms at the fast end is never called "too fast".
 */
describe('a release question beside the computed release time', () => {
  const board = loadBoard(DEMO_BOARD_FILE);
  const tree = findTree('pumping-release');

  it('shows the band worked from the parts, in the step and in the transcript, and follows a changed part', () => {
    const band = detectorTimeBand(board, 'release', 'slowest');
    const { machine, walk } = createWalkMachine(tree, board, { samples: 0, ranking: false });
    const actor = createActor(machine).start();
    const at = (node: string) => {
      // Drive the machine's snapshot to the question directly: the step view is pure.
      const snap = actor.getSnapshot();
      return currentStep(walk, { value: node, context: snap.context });
    };
    const step = at('release-meter');
    expect(step.kind).toBe('observe');
    expect(step.expectation).toBe(
      `release time (10–90 %), release knob at its slow end: ${band.nominal.toFixed(2)} s (${band.min.toFixed(2)} s to ${band.max.toFixed(2)} s with part tolerances), from R22 22 kΩ + RV3 1 MΩ with C14`,
    );
    // The demo board's own numbers, by hand: (22 kΩ + 1 MΩ) × 1 µF × ln 9 = 2.25 s.
    expect(band.nominal).toBeCloseTo(1.022 * Math.log(9), 6);

    // A 2.2 µF hold capacitor fitted instead doubles the time the question shows.
    actor.send({ type: 'user.substitute', ref: 'C14', value: '2u2' });
    const changed = currentStep(walk, { value: 'release-meter', context: actor.getSnapshot().context });
    expect(changed.expectation).toContain(`${(2.2 * 1.022 * Math.log(9)).toFixed(2)} s`);

  });

  it('writes the same expectation beside the answer in the transcript', () => {
    const answers: Record<string, string | boolean> = { 'release-meter': 'normal', 'sidechain-in': 'skip' };
    for (const [id, n] of Object.entries(tree.nodes)) {
      if (n.kind === 'caution' || n.kind === 'setup') answers[id] = true;
      else if (n.kind === 'inspect') answers[id] = 'ok';
      else if (n.kind === 'measure' && answers[id] === undefined) answers[id] = measureAll(board, board.roles.conditions[n.condition]!)[board.roles.testPoints[n.testPoint]!].toPrecision(4);
    }
    const t = walkFromAnswers(tree, board, answers, { samples: 0, ranking: false });
    const entry = t.entries.find((e) => e.node === 'release-meter')!;
    expect(entry.answer?.id).toBe('normal');
    expect(entry.expectation).toMatch(/^release time \(10–90 %\), release knob at its slow end: 2\.25 s/);
    expect(formatTranscriptText(t)).toContain(`    expected: ${entry.expectation}`);
    // The oscilloscope route was passed over: no expectation is printed for a step not asked.
    expect(t.entries.find((e) => e.node === 'release-scope')?.expectation).toBeUndefined();
  });
});
