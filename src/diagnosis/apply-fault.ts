import type { Board } from '../schemas/board.js';
import { DIP_PIN_COUNT, FIXED_PINS, OPAMP_PACKAGES } from '../board/pins.js';
import { editPart, link, openPin, part, relandPins, shortPins, OPEN_OHMS } from './board-edits.js';
import type { Fault } from './fault.js';

/**
 * Conductance of an electrolytic fitted backwards, as a resistance in parallel (what the circuit
 * model's capacitor `leakage` stands for). A reverse-biased aluminium electrolytic passes milliamps
 * at a few volts and more as it heats (from memory); 1 kΩ stands for that.
 */
export const REVERSED_ELECTROLYTIC_OHMS = 1e3;

/**
 * The board as it is with this fault: a new board, the original untouched. Every fault is a board
 * edit (a value changed, pins re-landed, a pin opened, two nets joined, a rail changed), so everything
 * that reads a board — buildCircuit, measureAll, expectBands — sees the fault with no special case.
 */
export function applyFault(board: Board, fault: Fault): Board {
  const p = fault.kind === 'rail' ? undefined : part(board, fault.part);
  switch (fault.mode) {
    case 'open':
      return openPin(board, fault.part, FIXED_PINS[p!.kind]![1]);
    case 'short': {
      const [a, b] = FIXED_PINS[p!.kind]!;
      return shortPins(board, fault.part, a, b, `${fault.part} shorted`);
    }
    case 'wrong-value':
      return editPart(board, fault.part, (q) => ({ ...q, value: fault.value! }));
    case 'wiper-open':
      return openPin(board, fault.part, '2');
    case 'track-open':
      // A break between the wiper and pin 3: at DC the same as lug 3 not connected.
      return openPin(board, fault.part, '3');
    case 'reversed': {
      if (p!.kind === 'npn' || p!.kind === 'pnp') return relandPins(board, fault.part, fault.pinMap!);
      const [a, b] = FIXED_PINS[p!.kind]!;
      const swapped = relandPins(board, fault.part, { [a]: b, [b]: a });
      return p!.kind === 'electrolytic' ? link(swapped, p!.pins[a], p!.pins[b], REVERSED_ELECTROLYTIC_OHMS, `${fault.part} reversed, leaking`) : swapped;
    }
    case 'open-be':
      return openPin(board, fault.part, 'E');
    case 'open-bc':
      return openPin(board, fault.part, 'C');
    case 'short-ce':
      return shortPins(board, fault.part, 'C', 'E', `${fault.part} collector–emitter short`);
    case 'other-pinout':
      return relandPins(board, fault.part, fault.pinMap!);
    case 'output-floating':
      return openPin(board, fault.part, amplifier(p!.kind, fault).out);
    case 'output-stuck-high':
    case 'output-stuck-low': {
      // A dead amplifier pinned to one rail: its inputs moved onto the supply pins drive it into
      // saturation on that side, with the model's own headroom, whatever its feedback does.
      const pkg = OPAMP_PACKAGES[p!.kind]!;
      const amp = amplifier(p!.kind, fault);
      const high = fault.mode === 'output-stuck-high';
      return relandPins(board, fault.part, { [amp.plus]: high ? pkg.vPlus : pkg.vMinus, [amp.minus]: high ? pkg.vMinus : pkg.vPlus });
    }
    case 'rotated': {
      // Pin 1 at the notch's far end: chip pin k sits in hole k + n/2 (a DIP turned half a turn).
      const n = DIP_PIN_COUNT[p!.kind]!;
      const landing: Record<string, string> = {};
      for (let k = 1; k <= n; k++) landing[String(k)] = String(((k - 1 + n / 2) % n) + 1);
      return relandPins(board, fault.part, landing);
    }
    case 'missing-pos-supply':
      return openPin(board, fault.part, OPAMP_PACKAGES[p!.kind]!.vPlus);
    case 'missing-neg-supply':
      return openPin(board, fault.part, OPAMP_PACKAGES[p!.kind]!.vMinus);
    case 'bridge':
      return shortPins(board, fault.part, fault.pins![0], fault.pins![1], `solder bridge on ${fault.part}`);
    case 'rail-missing':
      return railMissing(board, fault.rail!);
    case 'rails-reversed':
      return { ...board, rails: board.rails.map((r) => ({ ...r, volts: -r.volts })) };
  }
}

function amplifier(kind: string, fault: Fault) {
  const amp = OPAMP_PACKAGES[kind as 'opamp-dual']?.amplifiers.find((a) => a.suffix === fault.amplifier);
  if (!amp) throw new Error(`fault model: ${fault.part} has no amplifier ${fault.amplifier}`);
  return amp;
}

/**
 * A rail whose wire does not arrive: the supply is gone from that net. What remains holds it only
 * through the module's own parts; it is tied to ground through OPEN_OHMS so the net is never left
 * with nothing on it.
 */
function railMissing(board: Board, railId: string): Board {
  const rail = board.rails.find((r) => r.id === railId);
  if (!rail) throw new Error(`fault model: no rail ${railId} on board ${board.id}`);
  const rest = { ...board, rails: board.rails.filter((r) => r.id !== railId) };
  return link(rest, rail.net, board.ground, OPEN_OHMS, `${rail.label} rail missing`);
}

/**
 * For a fault that is one added resistor away from the healthy board, that resistor and the
 * resistance at which it leaves the board as it was: an opened pin's tie (the pin on a node of
 * its own, tied back through OPEN_OHMS; nearly healthy at NEAR_SHORT_OHMS) or the link of a short
 * or bridge (in parallel with what was there; nearly healthy at OPEN_OHMS). The dictionary walks
 * such a fault in from that value when plain Newton cannot reach the faulty circuit (value-walk.ts).
 * undefined for every other fault (pins re-landed, rails changed, a resistor's value).
 */
export interface FaultLink {
  /** Designator of the added resistor on the faulty board. */
  ref: string;
  /** Its resistance on the faulty board. */
  ohms: number;
  /** A resistance at which the faulty circuit is the healthy one to within a small perturbation. */
  nearHealthyOhms: number;
  /** For an opened pin: [the pin's own net, the net it was on], to start the lone node there. */
  opened?: [string, string];
}

/** Small against every resistance on a module board, large against the solver's 1 µΩ floor. */
export const NEAR_SHORT_OHMS = 1e-2;

const OPENED_PIN_MODES: ReadonlySet<Fault['mode']> = new Set(['open', 'wiper-open', 'track-open', 'open-be', 'open-bc', 'output-floating', 'missing-pos-supply', 'missing-neg-supply']);
const LINKED_PIN_MODES: ReadonlySet<Fault['mode']> = new Set(['short', 'bridge', 'short-ce']);

export function faultLink(board: Board, faulty: Board, fault: Fault): FaultLink | undefined {
  const opened = OPENED_PIN_MODES.has(fault.mode);
  if (!opened && !LINKED_PIN_MODES.has(fault.mode)) return undefined;
  // The link is the one part the fault added (board-edits.ts: link()); nothing else was added.
  if (faulty.parts.length !== board.parts.length + 1) return undefined;
  const added = faulty.parts[faulty.parts.length - 1];
  if (board.parts.some((p) => p.ref === added.ref) || added.kind !== 'resistor' || typeof added.value !== 'number') return undefined;
  if (opened) return { ref: added.ref, ohms: added.value, nearHealthyOhms: NEAR_SHORT_OHMS, opened: [added.pins['1'], added.pins['2']] };
  return { ref: added.ref, ohms: added.value, nearHealthyOhms: OPEN_OHMS };
}
