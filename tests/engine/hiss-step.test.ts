import { describe, expect, it } from 'vitest';
import { DEMO_BOARD_FILE, loadBoard, measureAll } from '../../src/board/index.js';
import { hissBand } from '../../src/circuit/analysis/index.js';
import { classifyReading, findTree, formatTranscriptText, walkFromAnswers } from '../../src/engine/index.js';
import { fromDbu, toDbu } from '../../src/units/index.js';

/**
 * The noisy-makeup tree on the demo board, down the "steady hiss, made in the module" route to the
 * hiss level: the measured hiss against what the design must make there decides between "the
 * design's own" and a fault. Every DC reading is the healthy board's own.
 */
const board = loadBoard(DEMO_BOARD_FILE);
const tree = findTree('noisy-makeup');
const hiss = hissBand(board, board.roles.testPoints['makeup-output']!, 'quiescent');

function answers(level: string | undefined): Record<string, string | boolean> {
  const out: Record<string, string | boolean> = { crackle: 'hiss', 'hiss-source': 'same' };
  for (const [id, n] of Object.entries(tree.nodes)) {
    if (n.kind === 'caution' || n.kind === 'setup') out[id] = true;
    else if (n.kind === 'inspect') out[id] = 'ok';
    else if (n.kind === 'measure' && n.quantity === 'dc') out[id] = measureAll(board, board.roles.conditions[n.condition]!)[board.roles.testPoints[n.testPoint]!].toPrecision(4);
  }
  if (level !== undefined) out['hiss-level'] = level;
  return out;
}

const walk = (level: string) => walkFromAnswers(tree, board, answers(level), { samples: 0 });

describe('the hiss level step', () => {
  it('calls a hiss at the design level the design\'s own, shows the band in µV rms and dBu, and keeps it out of the ranking', () => {
    const t = walk(`${(hiss.nominal * 1e6).toFixed(0)}uV`);
    expect(t.current.node).toBe('end-design-hiss');
    const entry = t.entries.find((e) => e.node === 'hiss-level')!;
    expect(entry.reading?.outcome).toBe('in-band');
    expect(entry.expected?.kind).toBe('noise');
    expect(entry.expected?.text).toMatch(/^\d+ µV to \d+ µV rms \(nominal \d+ µV, -\d+\.\d dBu\)$/);
    // The ranking compares DC readings with the fault dictionary; a hiss level is not one of them.
    const whys = (t.current.conclusion?.suspects ?? []).map((s) => s.why).join(' ');
    expect(whys).not.toMatch(/µV/);
    expect(formatTranscriptText(t)).toContain('[hiss-level] measure at TP25');
  }, 300_000);

  it('sends twice the design hiss to a fault, and a level below the resistors\' own noise to the measurement', () => {
    expect(walk(`${toDbu(hiss.max * 1.5).toFixed(1)} dBu`).current.node).toBe('end-makeup-noise');
    expect(walk(`${((hiss.min / 2) * 1e6).toFixed(1)} µV`).current.node).toBe('end-hiss-low');
  }, 300_000);

  it('goes to the fault conclusion, not "the design\'s own", when the level is skipped', () => {
    expect(tree.nodes['hiss-level']).toMatchObject({ skipTo: 'end-makeup-noise' });
    const t = walk('skip');
    expect(t.current.node).toBe('end-makeup-noise');
  }, 300_000);

  it('judges a hiss level on its band alone: no rail, no "near zero", no meter counts', () => {
    const band = { nominal: hiss.nominal, min: hiss.min, max: hiss.max, unit: 'V' as const, kind: 'noise' as const };
    // A few hundred µV would be "near zero" for a DC reading.
    expect(classifyReading(hiss.nominal, band, [12, -12])).toBe('in-band');
    expect(classifyReading(hiss.max * 1.01, band, [12, -12])).toBe('high');
    expect(classifyReading(hiss.min * 0.99, band, [12, -12])).toBe('low');
    expect(fromDbu(toDbu(hiss.nominal))).toBeCloseTo(hiss.nominal, 15);
  });
});
