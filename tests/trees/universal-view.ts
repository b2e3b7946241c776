import { readFileSync } from 'node:fs';
import type { Board } from '../../src/schemas/board.js';
import { CONDITION_ROLES, PART_ROLES, TEST_POINT_ROLES } from '../../src/schemas/roles.js';
import type { Tree } from '../../src/schemas/tree.js';
import type { BoardView } from '../../src/engine/board-view.js';
import { validateTree } from '../../src/engine/check-tree.js';
import { bundledTreeFiles } from '../../src/engine/load-tree.js';

/**
 * A board that has every role, with made-up bands (1–2 V, 1–2 kΩ), so graph tests can reach
 * every branch of every tree without the solver. Invented numbers: they prove routing only.
 */
export const VOLT_BAND = { nominal: 1.5, min: 1, max: 2, unit: 'V' as const };
export const OHM_BAND = { nominal: 1500, min: 1000, max: 2000, unit: 'Ω' as const };

/** One reading per outcome, for each quantity (against the bands above and ±12 V rails). */
export const READINGS = {
  V: { 'in-band': 1.5, low: 0.5, high: 3, 'stuck-at-rail': 11.2, 'near-zero': 0.001 },
  Ω: { 'in-band': 1500, low: 500, high: 1e6, 'near-zero': 0.2 },
};

export function universalView(): BoardView {
  // Electrolytics: a part with a value that can also be fitted backwards, so every kind of
  // inspection step is presented rather than skipped.
  const parts = Object.keys(PART_ROLES).map((role, i) => ({ ref: `X${i + 1}`, kind: 'electrolytic', value: '10u', pins: {}, where: `where ${role} is` }));
  const board = { id: 'universal', name: 'every role', rails: [], parts } as unknown as Board;
  const unpoweredTp = new Set(['pos-rail-resistance', 'neg-rail-resistance']);
  return {
    board,
    testPoint: (role) => ({ id: `TP-${role}`, label: role, net: role, quantity: unpoweredTp.has(role) ? 'resistance' : 'voltage', probe: `red on ${role}`, access: 'pad' }),
    condition: (role) => ({ id: role, label: role, powered: role !== 'unpowered', instructions: CONDITION_ROLES[role], settings: {} }),
    parts: (role) => [parts[Object.keys(PART_ROLES).indexOf(role)] as unknown as Board['parts'][number]],
    band: (testPoint) => (testPoint === 'TP-pos-rail-resistance' || testPoint === 'TP-neg-rail-resistance' ? OHM_BAND : VOLT_BAND),
    railVolts: [12, -12],
    time: () => undefined,
    idleDraw: () => undefined,
    ledCurrents: () => undefined,
  };
}

/** Boards for the role check that define every role, so these tests do not depend on the bundled boards. */
export const EVERY_ROLE_BOARD = {
  roles: {
    stages: {},
    testPoints: Object.fromEntries(Object.keys(TEST_POINT_ROLES).map((r) => [r, 'TP1'])),
    parts: Object.fromEntries(Object.keys(PART_ROLES).map((r) => [r, ['X1']])),
    conditions: Object.fromEntries(Object.keys(CONDITION_ROLES).map((r) => [r, 'c'])),
  },
} as unknown as Board;

export function bundledTreesForGraphs(): Tree[] {
  return bundledTreeFiles().map((f) => {
    const { tree, problems } = validateTree(JSON.parse(readFileSync(f, 'utf8')), f, [EVERY_ROLE_BOARD]);
    if (!tree) throw new Error(problems.map((p) => p.message).join('\n'));
    return tree;
  });
}
