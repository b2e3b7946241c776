import { describe, expect, it } from 'vitest';
import { createActor } from 'xstate';
import { DEMO_BOARD_FILE, loadBoard, roleParts } from '../../src/board/index.js';
import { createBoardView, findTree } from '../../src/engine/index.js';
import { walkMachineFor } from '../../src/engine/walk-machine.js';
import { currentStep } from '../../src/engine/step-view.js';
import type { PartRole } from '../../src/schemas/roles.js';

describe('orientation checks on the bundled demo board', () => {
  it('the first power-up look at the rail decoupling names only the parts that have a wrong way round', () => {
    const board = loadBoard(DEMO_BOARD_FILE);
    const tree = findTree('first-power-up');
    const look = tree.nodes[tree.start];
    if (look.kind !== 'inspect') throw new Error(`first-power-up starts with a ${look.kind} step, not an inspection`);
    expect(look.look).toBe('orientation');
    // The demo board's decoupling role holds electrolytics and ceramics alike.
    const kinds = new Set(roleParts(board, look.part as PartRole).map((p) => p.kind));
    expect(kinds).toEqual(new Set(['electrolytic', 'capacitor']));
    const { machine, walk } = walkMachineFor(tree, createBoardView(board, { samples: 0 }));
    const actor = createActor(machine).start();
    const shown = currentStep(walk, actor.getSnapshot()).parts!.map((p) => p.ref);
    expect(shown.length).toBeGreaterThan(0);
    expect(shown.filter((ref) => board.parts.find((p) => p.ref === ref)?.kind === 'electrolytic')).toEqual(shown);
    actor.stop();
  });
});
