import { describe, expect, it } from 'vitest';
import { loadBoard, measureAll } from '../../src/board/index.js';
import { applyFault, buildDictionary, clearDictionaryCache, dictionaryReady, faultsFor } from '../../src/diagnosis/index.js';
import { findTree, walkFromAnswers, formatTranscriptText } from '../../src/engine/index.js';
import { BOARDS_DIR } from '../../src/paths.js';
import type { Board } from '../../src/schemas/board.js';
import { join } from 'node:path';
import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';

// The conclusion carries the ranking's suspects for the readings the walk took. Building the fault
// dictionary for a board takes a while, hence the long timeout.
describe('conclusion with ranked suspects', () => {
  it('lists the injected fault among the ranked suspects beside the tree conclusion', () => {
    const board = loadBoard(join(BOARDS_DIR, 'wenlow-nib.json'));
    const fault = faultsFor(board).find((f) => f.id === 'D1/reversed')!;
    const faulty = applyFault(board, fault);
    const tree = findTree('first-power-up');
    const t = walkFromAnswers(tree, board, answersReadOn(faulty, tree, board), { samples: 0 });
    const c = t.current.conclusion!;
    expect(c.parts.map((p) => p.ref)).toContain('D1');
    expect(c.suspects?.length).toBeGreaterThan(0);
    expect(c.suspects!.map((s) => s.part)).toContain('D1');
    // The walk concluded a fault (the conclusion names parts): "no fault" is no candidate, and the heading says so.
    expect(c.faultPresent).toBe(true);
    expect(c.suspects!.map((s) => s.part)).not.toContain('none');
    expect(c.groups!.flatMap((g) => g.members)).not.toContain('none');
    expect(formatTranscriptText(t)).toContain('Ranked suspects (from the readings; a fault was found, so "no fault" is left out):');
    // Every reading is the injected fault's own: some candidate foresees each one.
    expect(c.unexplained).toBeUndefined();

    // One reading no candidate foresees (30 V on a ±12 V board) is named before the suspects.
    const answers = answersReadOn(faulty, tree, board);
    const first = Object.entries(tree.nodes).find(
      ([, n]) => n.kind === 'measure' && board.testPoints.find((p) => p.id === board.roles.testPoints[n.testPoint])?.quantity === 'voltage',
    )![0];
    const odd = walkFromAnswers(tree, board, { ...answers, [first]: '30' }, { samples: 0 });
    const note = odd.current.conclusion?.unexplained ?? [];
    expect(note).toHaveLength(1);
    expect(note[0]).toMatch(/^TP\d+ = 30 V fits no single modelled fault/);
    const text = formatTranscriptText(odd);
    expect(text.indexOf(`! ${note[0]}`)).toBeLessThan(text.indexOf('Ranked suspects (from the readings'));
  }, 300_000);

  it("takes the walk's conditions out of the whole board's dictionary when that is built, instead of building another", () => {
    clearDictionaryCache();
    const board = loadBoard(join(BOARDS_DIR, 'wenlow-nib.json'));
    const tree = findTree('first-power-up');
    const answers = answersReadOn(board, tree, board);
    const walked = walkFromAnswers(tree, board, answers, { samples: 0 });
    // The ranking covers the conditions of the tree's measure steps, in the tree's order.
    const conditions = [...new Set(Object.values(tree.nodes).flatMap((n) => (n.kind === 'measure' ? [board.roles.conditions[n.condition]!] : [])))];
    // Without the whole dictionary, the walk builds one for its own conditions (and keeps it).
    expect(dictionaryReady(board, { conditions })).toBe(true);
    const before = walked.current.conclusion!.suspects!;
    // A healthy board's own readings: "no fault" is among the suspects, worded as such.
    expect(before.map((s) => s.part)).toContain('none');
    const text = formatTranscriptText(walked);
    expect(text).toMatch(/ \d+\. no fault — \d+ % (\(group \d+\) )?— /);
    // Many faults read as a healthy board does at these test points: the group is listed whole, with
    // its whole probability, more than the shown members' sum (the list shows five suspects).
    const healthy = walked.current.conclusion!.groups!.find((g) => g.members.includes('none'))!;
    expect(healthy.labels.length).toBeGreaterThan(5);
    const shownSum = before.filter((s) => s.group === healthy.group).reduce((a, s) => a + s.probability, 0);
    expect(healthy.probability).toBeGreaterThan(shownSum);
    expect(text).toContain(`    group ${healthy.group}, ${(healthy.probability * 100).toFixed(0)} % together: no fault, `);
    expect(text).toContain(` and ${healthy.labels.length - 8} more`);

    clearDictionaryCache();
    buildDictionary(board);
    const again = walkFromAnswers(tree, board, answers, { samples: 0 });
    expect(dictionaryReady(board, { conditions })).toBe(false);
    // The same suspects, as the predictions are the same numbers.
    expect(again.current.conclusion!.suspects!.map((s) => [s.part, s.fault, s.group])).toEqual(before.map((s) => [s.part, s.fault, s.group]));

    // Kept on disk by an earlier run, it is read from there (and nothing is written).
    const dir = mkdtempSync(join(tmpdir(), 'voltwalk-walk-cache-'));
    const diskCache = { dir, version: 'test' };
    clearDictionaryCache();
    buildDictionary(board, { diskCache });
    const files = readdirSync(dir);
    expect(files).toHaveLength(1);
    clearDictionaryCache();
    const fromDisk = walkFromAnswers(tree, board, answers, { samples: 0, diskCache });
    expect(dictionaryReady(board, { conditions })).toBe(false);
    expect(dictionaryReady(board)).toBe(true);
    expect(readdirSync(dir)).toEqual(files);
    expect(fromDisk.current.conclusion!.suspects!.map((s) => [s.part, s.fault, s.group])).toEqual(before.map((s) => [s.part, s.fault, s.group]));
    rmSync(dir, { recursive: true, force: true });
  }, 300_000);
});

/** Every step answered as a person would on `measured`: cautions read, parts looking right, readings as the solver predicts them. */
function answersReadOn(measured: Board, tree: ReturnType<typeof findTree>, board: Board): Record<string, string | boolean> {
  const answers: Record<string, string | boolean> = { 'current-limit': 'no' };
  for (const [id, n] of Object.entries(tree.nodes)) {
    if (n.kind === 'caution' || n.kind === 'setup') answers[id] = true;
    else if (n.kind === 'inspect') answers[id] = 'ok';
    else if (n.kind === 'measure') {
      const v = measureAll(measured, board.roles.conditions[n.condition]!)[board.roles.testPoints[n.testPoint]!];
      answers[id] = Number.isFinite(v) ? v.toPrecision(4) : 'OL';
    }
  }
  return answers;
}
