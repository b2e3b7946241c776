import { describe, expect, it } from 'vitest';
import { bundledBoardFiles, loadBoard, measureAll, roleParts } from '../../src/board/index.js';
import { applyFault, faultsFor, type Fault, type FaultModeId } from '../../src/diagnosis/index.js';
import { loadAllTrees, walkFromAnswers, type Answers } from '../../src/engine/index.js';
import type { Board } from '../../src/schemas/board.js';
import type { PartRole, TestPointRole } from '../../src/schemas/roles.js';
import type { Tree } from '../../src/schemas/tree.js';

/**
 * Each tree walked on each bundled board with one fault injected: every reading comes from the
 * simulated meter on the faulted board (the solver), the inspections are passed as "looks right"
 * (the person missed the fault by eye), and each observation is what a person would see — derived
 * from the faulted board's readings where a reading decides it, else stated with the scenario.
 * The walk must end at a conclusion that names the faulted part.
 */

interface Scenario {
  role: PartRole;
  mode: FaultModeId;
  /** For a dual or quad op-amp: which amplifier (the first listed otherwise). */
  amplifier?: string;
  /** Observations for this fault, by step id, when no reading decides them. */
  observe?: Record<string, string>;
  /** Boards this scenario applies to (all when absent): a board built differently may hide the fault from this tree. */
  boards?: string[];
}

const SCENARIOS: Record<string, Scenario[]> = {
  'first-power-up': [
    { role: 'rail-decoupling', mode: 'short' },
    { role: 'pos-rail-protection', mode: 'reversed' },
    { role: 'input-opamp', mode: 'output-stuck-low' },
  ],
  'no-gain-reduction': [
    { role: 'input-opamp', mode: 'output-stuck-low' },
    { role: 'neg-rail-protection', mode: 'reversed' },
  ],
  'distortion-high-ratio': [
    { role: 'pos-rail-protection', mode: 'reversed' },
    // the Nib has no maximum-ratio condition, so this tree's control-chain steps are skipped there
    // the amplifier that drives the control line; the Tamp's worst-case band there is wide enough
    // (from no gain reduction to full) that its other amplifier stuck high still reads in band
    { role: 'control-opamp', mode: 'output-stuck-high', amplifier: 'b', boards: ['wenlow-tamp'] },
  ],
  'dead-meter': [
    { role: 'neg-rail-protection', mode: 'reversed' },
    { role: 'meter-drivers', mode: 'reversed', observe: { 'leds-now': 'none' } },
  ],
  'noisy-makeup': [
    { role: 'pos-rail-protection', mode: 'reversed' },
    { role: 'makeup-feedback-resistor', mode: 'open', observe: { crackle: 'hiss', 'hiss-source': 'same' } },
  ],
  'gr-led-stuck': [
    { role: 'neg-rail-protection', mode: 'short' },
    // On the Tamp the healthy band at the LED sense point under DC injection reaches 0 V (tolerances
    // can leave the LED off), so a dead driver reads "in band" there and this route cannot catch it.
    { role: 'gr-led-driver', mode: 'open-be', boards: ['wenlow-nib'] },
    { role: 'gr-led-resistor', mode: 'open' },
    { role: 'gr-led', mode: 'open' },
  ],
  'no-output': [
    // On the Tamp a rotated U1 leaves every stage inside its (wide) band under DC injection.
    { role: 'input-opamp', mode: 'rotated', boards: ['wenlow-nib'] },
    { role: 'pos-rail-protection', mode: 'reversed' },
    { role: 'makeup-feedback-resistor', mode: 'open' },
  ],
  'pumping-release': [
    { role: 'neg-rail-protection', mode: 'short' },
    // an open discharge path never lets the held level fall: the person sees it hardly move
    { role: 'release-resistor', mode: 'open', observe: { 'release-meter': 'slow', 'release-scope': 'slow' } },
  ],
};

const boards = bundledBoardFiles().map((f) => loadBoard(f));
const trees = loadAllTrees();

function readingsOn(board: Board) {
  const cache = new Map<string, Record<string, number>>();
  return (condition: string): Record<string, number> => {
    if (!cache.has(condition)) {
      let values: Record<string, number> = {};
      try {
        values = measureAll(board, condition);
      } catch {
        // a faulted board the solver cannot settle leaves those steps unanswered; the walk reports it
      }
      cache.set(condition, values);
    }
    return cache.get(condition)!;
  };
}

/** What the person answers, step by step, on the faulted board. */
function answersFor(tree: Tree, healthy: Board, faulty: Board, observe: Record<string, string>): Answers {
  const read = readingsOn(faulty);
  const readHealthy = readingsOn(healthy);
  const at = (b: Board, r: (c: string) => Record<string, number>, tp: TestPointRole, cond: 'quiescent' | 'dc-injection-above-threshold') => {
    const c = b.roles.conditions[cond];
    const t = b.roles.testPoints[tp];
    return c && t ? r(c)[t] : undefined;
  };
  // The GR LED is lit when its sense point carries at least half the current it does when a healthy board is reducing gain.
  const ledLit = (cond: 'quiescent' | 'dc-injection-above-threshold') => {
    const reference = at(healthy, readHealthy, 'gr-led-current-sense', 'dc-injection-above-threshold');
    const now = at(faulty, read, 'gr-led-current-sense', cond);
    return reference !== undefined && now !== undefined && Math.abs(now) > 0.5 * Math.abs(reference) ? 'lit' : 'dark';
  };
  const answers: Answers = {};
  for (const [id, node] of Object.entries(tree.nodes)) {
    if (node.kind === 'caution' || node.kind === 'setup') answers[id] = true;
    else if (node.kind === 'inspect') answers[id] = 'ok';
    else if (node.kind === 'measure') {
      const c = healthy.roles.conditions[node.condition];
      const t = healthy.roles.testPoints[node.testPoint];
      const v = c && t ? read(c)[t] : undefined;
      if (v !== undefined) answers[id] = Number.isFinite(v) ? v.toPrecision(4) : 'OL';
    }
  }
  Object.assign(answers, {
    'current-limit': 'no',
    'lit-at-rest': ledLit('quiescent'),
    'lit-now': ledLit('dc-injection-above-threshold'),
    'leds-now': 'none',
    crackle: 'hiss',
    'hiss-source': 'same',
    'release-meter': 'normal',
    'release-scope': 'normal',
    ...observe,
  });
  return answers;
}

function faultFor(board: Board, s: Scenario): Fault | undefined {
  const part = roleParts(board, s.role)[0];
  return part && faultsFor(board).find((f) => f.part === part.ref && f.mode === s.mode && (s.amplifier === undefined || f.amplifier === s.amplifier));
}

describe.each(boards.map((b) => [b.id, b] as const))('faults injected into %s', (_id, board) => {
  describe.each(trees.map((t) => [t.id, t] as const))('tree %s', (_treeId, tree) => {
    const scenarios = (SCENARIOS[tree.id] ?? []).filter((s) => !s.boards || s.boards.includes(board.id));
    const applicable = scenarios.map((s) => ({ s, fault: faultFor(board, s) })).filter((x): x is { s: Scenario; fault: Fault } => x.fault !== undefined);

    it('has at least one fault scenario on this board', () => {
      expect(applicable.length).toBeGreaterThan(0);
    });

    it.each(applicable.map((x) => [`${x.s.role} ${x.s.mode} (${x.fault.id})`, x] as const))(
      '%s ends at a conclusion naming the part',
      (_name, { s, fault }) => {
        const faulty = applyFault(board, fault);
        const transcript = walkFromAnswers(tree, board, answersFor(tree, board, faulty, s.observe ?? {}), { samples: 0, ranking: false });
        const route = transcript.entries.map((e) => `${e.node}${e.reading ? `=${e.reading.outcome}` : e.answer ? `:${e.answer.id}` : ''}`).join(' ');
        expect(transcript.stopped, `stopped: ${JSON.stringify(transcript.stopped)}; route ${route}`).toBeUndefined();
        expect(transcript.current.kind).toBe('conclude');
        const named = transcript.current.conclusion!.parts.map((p) => p.ref);
        expect(named, `${transcript.current.node} after ${route}`).toContain(fault.part);
      },
      600_000,
    );
  });
});
