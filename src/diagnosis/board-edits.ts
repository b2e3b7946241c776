import type { Board, Part } from '../schemas/board.js';

/**
 * Small edits of a board that fault models are made of. Each returns a new board and leaves the
 * original alone (boards are shared, and cached by identity downstream); untouched parts keep
 * their identity.
 */

/** A resistance that stands for "not connected": far above any meter's top range. */
export const OPEN_OHMS = 1e9;
/** A solder blob or a shorted part: small against every resistor on a module board. */
export const SHORT_OHMS = 0.1;

export function part(board: Board, ref: string): Part {
  const found = board.parts.find((p) => p.ref === ref);
  if (!found) throw new Error(`fault model: no part ${ref} on board ${board.id}`);
  return found;
}

export function editPart(board: Board, ref: string, edit: (p: Part) => Part): Board {
  return { ...board, parts: board.parts.map((p) => (p.ref === ref ? edit(p) : p)) };
}

/** Re-lands pins: each pin in `landing` takes the net the named pin had. */
export function relandPins(board: Board, ref: string, landing: Record<string, string>): Board {
  return editPart(board, ref, (p) => {
    const pins = { ...p.pins };
    for (const [pin, from] of Object.entries(landing)) pins[pin] = p.pins[from];
    return { ...p, pins };
  });
}

function freeRef(board: Board): string {
  const taken = new Set(board.parts.map((p) => p.ref));
  for (let n = 901; n < 1000; n++) if (!taken.has(`XF${n}`)) return `XF${n}`;
  throw new Error('fault model: no free designator');
}

/**
 * Joins two nets through a resistance: a short, a bridge, a leakage path. The added part carries a
 * designator of its own (XF9xx) so it never collides with the kit's parts.
 */
export function link(board: Board, netA: string, netB: string, ohms: number, why: string): Board {
  const added: Part = { ref: freeRef(board), kind: 'resistor', value: ohms, tolerance: 0.01, pins: { '1': netA, '2': netB }, where: why };
  return { ...board, parts: [...board.parts, added] };
}

/**
 * Opens one pin: the pin moves to a net of its own, tied back through OPEN_OHMS so the solver never
 * meets a node with nothing on it.
 */
export function openPin(board: Board, ref: string, pin: string): Board {
  const net = part(board, ref).pins[pin];
  const lone = `open-${ref.toLowerCase()}-${pin.toLowerCase().replace(/[^a-z0-9]/g, '')}`;
  const moved = editPart(board, ref, (p) => ({ ...p, pins: { ...p.pins, [pin]: lone } }));
  return link(moved, lone, net, OPEN_OHMS, `${ref} pin ${pin} not connected`);
}

/** Puts a short across two pins of a part. */
export function shortPins(board: Board, ref: string, a: string, b: string, why: string): Board {
  const p = part(board, ref);
  return link(board, p.pins[a], p.pins[b], SHORT_OHMS, why);
}
