import type { Board, Part } from '../schemas/board.js';
import { neighbourPins } from '../board/neighbours.js';
import { partValue } from '../board/values.js';
import { OPAMP_PACKAGES } from '../board/pins.js';
import { DEFAULT_TOLERANCE } from '../board/defaults.js';
import { formatValue } from '../units/index.js';
import { colourMisreads } from './colour-misreads.js';
import { FAULT_MODES, modeWeight, type FaultModeId } from './fault-modes.js';
import type { Fault } from './fault.js';
import { LEG_ORDERS, legOrderOf, pinLanding } from './transistor-pinouts.js';

/** Every single fault voltwalk models on this board, with its prior weight. */
export function faultsFor(board: Board): Fault[] {
  const faults: Fault[] = [];
  for (const part of board.parts) faults.push(...partFaults(board, part), ...bridgeFaults(board, part));
  faults.push(...railFaults(board));
  return faults.filter((f) => f.prior > 0);
}

function make(board: Board, part: Part, mode: FaultModeId, extra: Partial<Fault> = {}, share = 1, suffix = ''): Fault {
  return {
    id: `${part.ref}/${mode}${suffix}`,
    part: part.ref,
    kind: part.kind,
    mode,
    fault: FAULT_MODES[mode].words,
    prior: modeWeight(board, part.kind, mode) / share,
    ...extra,
  };
}

function partFaults(board: Board, part: Part): Fault[] {
  switch (part.kind) {
    case 'resistor': {
      const value = partValue(board, part.ref);
      const misreads = colourMisreads(value, part.tolerance ?? DEFAULT_TOLERANCE.resistor ?? 0.05);
      return [
        make(board, part, 'open'),
        make(board, part, 'short'),
        ...misreads.map((m) =>
          make(board, part, 'wrong-value', { value: m.value, fault: `wrong value ${formatValue(m.value, 'Ω')} (band ${m.band} ${m.read} read for ${m.meant})` }, misreads.length, `/${m.value}`),
        ),
      ];
    }
    case 'capacitor':
      return [make(board, part, 'short')];
    case 'electrolytic':
      return [make(board, part, 'short'), make(board, part, 'reversed')];
    case 'diode':
    case 'zener':
    case 'led':
      return [make(board, part, 'open'), make(board, part, 'short'), make(board, part, 'reversed')];
    case 'npn':
    case 'pnp': {
      const drawn = legOrderOf(part.model);
      const reversed = [...drawn].reverse().join('');
      const others = LEG_ORDERS.filter((o) => o !== drawn && o !== reversed);
      return [
        make(board, part, 'open-be'),
        make(board, part, 'open-bc'),
        make(board, part, 'short-ce'),
        make(board, part, 'reversed', { fault: `fitted backwards (a ${reversed} type in this ${drawn} place does the same)`, pinMap: pinLanding(drawn, reversed) }),
        ...others.map((o) =>
          make(board, part, 'other-pinout', { fault: `a ${o} type fitted where a ${drawn} type belongs`, pinMap: pinLanding(drawn, o) }, others.length, `/${o}`),
        ),
      ];
    }
    case 'pot':
      return [make(board, part, 'wiper-open'), make(board, part, 'track-open')];
    case 'opamp-dual':
    case 'opamp-quad': {
      const pkg = OPAMP_PACKAGES[part.kind]!;
      const perAmp = pkg.amplifiers.flatMap((amp) =>
        (['output-floating', 'output-stuck-high', 'output-stuck-low'] as const).map((mode) =>
          make(board, part, mode, { amplifier: amp.suffix, fault: `amplifier ${amp.suffix.toUpperCase()} ${FAULT_MODES[mode].words}` }, 1, `/${amp.suffix}`),
        ),
      );
      return [...perAmp, make(board, part, 'rotated'), make(board, part, 'missing-pos-supply'), make(board, part, 'missing-neg-supply')];
    }
    default:
      return [];
  }
}

/** Neighbouring pins on different nets; two-pin parts are covered by their own short. */
function bridgeFaults(board: Board, part: Part): Fault[] {
  if (Object.keys(part.pins).length < 3) return [];
  const pairs = neighbourPins(board, part.ref).filter(([a, b]) => part.pins[a] !== undefined && part.pins[b] !== undefined && part.pins[a] !== part.pins[b]);
  return pairs.map(([a, b]) => make(board, part, 'bridge', { pins: [a, b], fault: `solder bridge between pins ${a} and ${b}` }, 1, `/${a}-${b}`));
}

/** Rail faults sit at the power header (the part with that role, else the first connector). */
function railFaults(board: Board): Fault[] {
  const header = board.roles.parts['power-header']?.[0] ?? board.parts.find((p) => p.kind === 'connector')?.ref ?? 'rails';
  const faults: Fault[] = board.rails.map((rail) => ({
    id: `${header}/rail-missing/${rail.id}`,
    part: header,
    kind: 'rail' as const,
    mode: 'rail-missing' as const,
    fault: `${rail.label} rail missing at the power header`,
    prior: modeWeight(board, 'rail', 'rail-missing'),
    rail: rail.id,
  }));
  const hasPair = board.rails.some((a) => board.rails.some((b) => a.volts > 0 && Math.abs(a.volts + b.volts) < 1e-9));
  if (hasPair) {
    faults.push({ id: `${header}/rails-reversed`, part: header, kind: 'rail', mode: 'rails-reversed', fault: FAULT_MODES['rails-reversed'].words, prior: modeWeight(board, 'rail', 'rails-reversed') });
  }
  return faults;
}
