import { describe, expect, it } from 'vitest';
import { createActor } from 'xstate';
import { buildCircuit, DEMO_BOARD_FILE, loadBoard, measureAll, railSourceName, solvePatiently } from '../../src/board/index.js';
import { formatValue } from '../../src/units/index.js';
import { detectorTimeBand } from '../../src/circuit/analysis/index.js';
import { createWalkMachine, currentStep, findTree, formatTranscriptMarkdown, formatTranscriptText, walkFromAnswers } from '../../src/engine/index.js';
import { describeLeds, LED_FAINT_AMPS, LED_LIT_AMPS } from '../../src/engine/step-view.js';

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
    expect(formatTranscriptMarkdown(t)).toContain(`| ${entry.expectation} |  | about as shown (a third to three times) |`);
    // The oscilloscope route was passed over: no expectation is printed for a step not asked.
    expect(t.entries.find((e) => e.node === 'release-scope')?.expectation).toBeUndefined();
  });
});

describe('the first power-up caution beside the idle draw', () => {
  const board = loadBoard(DEMO_BOARD_FILE);
  const tree = findTree('first-power-up');
  const caution = Object.entries(tree.nodes).find(([, n]) => n.kind === 'caution' && n.covers.includes('first-power-up-current-limit'))![0];

  it('names what each rail supplies at rest, as the solver finds it, and follows a changed part', () => {
    const { machine, walk } = createWalkMachine(tree, board, { samples: 0, ranking: false });
    const actor = createActor(machine).start();
    const step = currentStep(walk, { value: caution, context: actor.getSnapshot().context });
    const { circuit } = buildCircuit(board, board.roles.conditions.quiescent!);
    const currents = solvePatiently(circuit).sourceCurrents;
    const draws = board.rails.map((r) => Math.abs(currents[railSourceName(r.id)]));
    // Tens of mA per rail on this board, as the caution's own words expect.
    for (const amps of draws) expect(amps).toBeGreaterThan(5e-3);
    expect(step.expectation).toBe(
      `idle draw about ${formatValue(draws[0], 'A')} from +12 V and ${formatValue(draws[1], 'A')} from −12 V (worked out from the parts, op-amps at their typical supply current): set the current limit a little above it`,
    );
    // R35 feeds the meter ladder from +12 V to ground: a tenth of its value (7k5 for 75k) loads that rail more.
    const fitted = walk.view.idleDraw({ R35: '7k5' })!;
    expect(fitted[0].amps).toBeGreaterThan(draws[0]);
    expect(fitted[0].amps - draws[0]).toBeGreaterThan(0.1e-3);
    const other = currentStep(walk, { value: 'look-electrolytics', context: actor.getSnapshot().context });
    expect(other.expectation).toBeUndefined();
  });
});

describe('an LED question beside the LEDs the solver finds lit', () => {
  const board = loadBoard(DEMO_BOARD_FILE);
  const tree = findTree('dead-meter');

  it('names which meter LEDs this board lights at the test level, from their solved currents, and follows a changed part', () => {
    const { machine, walk } = createWalkMachine(tree, board, { samples: 0, ranking: false });
    const actor = createActor(machine).start();
    const condition = board.roles.conditions['dc-injection-above-threshold']!;
    const { circuit, partElements } = buildCircuit(board, condition);
    const solved = solvePatiently(circuit);
    const amps = (ref: string) => solved.elements[partElements[ref][0]].current;
    // On the demo board the 1.00 V level lights the lower three meter LEDs and leaves the top one dark.
    expect(amps('LED2')).toBeGreaterThan(LED_LIT_AMPS);
    expect(amps('LED5')).toBeLessThan(LED_FAINT_AMPS);
    const step = currentStep(walk, { value: 'leds-now', context: actor.getSnapshot().context });
    expect(step.expectation).toBe(
      `LED2, LED3 and LED4 lit (${['LED2', 'LED3', 'LED4'].map((r) => formatValue(amps(r), 'A')).join(', ')}); LED5 dark (${formatValue(amps('LED5'), 'A')}), from the currents the solver finds in them`,
    );
    // LED4's series resistor at a hundred times its value (390k for 3k9) starves it.
    actor.send({ type: 'user.substitute', ref: 'R42', value: '390k' });
    const changed = currentStep(walk, { value: 'leds-now', context: actor.getSnapshot().context });
    expect(changed.expectation).toMatch(/^LED2 and LED3 lit \(5 mA, 5 mA\); LED4 and LED5 dark \(/);
  });

  it('calls an LED lit from 1 mA, faint from 0.1 mA, else dark', () => {
    expect(describeLeds([{ ref: 'LED1', amps: 2e-3 }, { ref: 'LED2', amps: 0.5e-3 }, { ref: 'LED3', amps: 1e-6 }])).toBe(
      'LED1 lit (2 mA); LED2 faint (500 µA); LED3 dark (1 µA), from the currents the solver finds in them',
    );
    // A reversed-biased LED carries a tiny negative current: shown as nothing flowing forward.
    expect(describeLeds([{ ref: 'LED1', amps: -1e-12 }])).toBe('LED1 dark (0 A), from the currents the solver finds in them');
  });
});
