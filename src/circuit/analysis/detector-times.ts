import type { Board, Part } from '../../schemas/board.js';
import type { Potentiometer } from '../netlist.js';
import { potResistances } from '../index.js';
import { DEFAULT_POT_POSITION } from '../../board/defaults.js';
import { partTolerance, partValue, preparedPart } from '../../board/values.js';
import { roleParts } from '../../board/lookup.js';
import type { PartRole } from '../../schemas/roles.js';
import { UserInputError } from '../../errors.js';

/**
 * Attack and release times of the peak detector from part values and knob positions.
 *
 * The detector capacitor charges through the attack path and discharges through the release path;
 * each is a single RC (the driving op-amp and the diode are taken as ideal, the next stage's load
 * as negligible), so the step response is exponential with τ = R·C and its 10 %–90 % time is
 * τ·ln 9 ≈ 2.197 τ (textbook first-order response: t(p) = −τ ln(1 − p), so t90 − t10 = τ ln(0.9/0.1)).
 *
 * Parts come from the board's roles, so any board works:
 *   detector-capacitor (all of them in parallel), attack-resistor + attack-pot (in series),
 *   release-resistor + release-pot (in series).
 * A pot counts with the part of its track that is in the path at its knob position: the segment
 * away from a wiper tied to one end, or the segment towards the end that is connected when the
 * other end is left unconnected; if all three pins go to different nets, the whole track.
 */

export const LN9 = Math.log(9);

export interface PathPart {
  ref: string;
  /** Ohms in the path. */
  ohms: number;
  /** Pots: knob position used (0..1). */
  position?: number;
}

export interface PathTime {
  /** Seconds. */
  tau: number;
  /** 10 %–90 % time, seconds. */
  riseTime: number;
  resistance: number;
  capacitance: number;
  parts: PathPart[];
}

export interface DetectorTimes {
  condition?: string;
  capacitors: string[];
  attack: PathTime;
  release: PathTime;
}

export function detectorTimes(board: Board, condition?: string, knobs: Record<string, number> = {}): DetectorTimes {
  const settings = { ...conditionSettings(board, condition), ...knobs };
  const caps = roleRefs(board, 'detector-capacitor');
  if (caps.length === 0) throw missingRole(board, 'detector-capacitor');
  const capacitance = caps.reduce((sum, ref) => sum + partValue(board, ref), 0);
  const path = (resistorRole: PartRole, potRole: PartRole): PathTime => {
    const refs = [...roleRefs(board, resistorRole), ...roleRefs(board, potRole)];
    if (refs.length === 0) throw missingRole(board, `${resistorRole} or ${potRole}`);
    const parts = refs.map((ref) => pathPart(board, ref, settings));
    const resistance = parts.reduce((sum, p) => sum + p.ohms, 0);
    const tau = resistance * capacitance;
    return { tau, riseTime: tau * LN9, resistance, capacitance, parts };
  };
  return {
    condition,
    capacitors: caps,
    attack: path('attack-resistor', 'attack-pot'),
    release: path('release-resistor', 'release-pot'),
  };
}

function roleRefs(board: Board, role: PartRole): string[] {
  return roleParts(board, role).map((p) => p.ref);
}

function missingRole(board: Board, role: string): UserInputError {
  return new UserInputError({
    code: 'board.missing-role',
    path: 'roles.parts',
    message: `board ${board.id} names no part for the role ${role}, so the detector times cannot be worked out`,
    accepted: `roles.parts["${role.split(' ')[0]}"]: a list of designators`,
  });
}

function conditionSettings(board: Board, condition: string | undefined): Record<string, number | string> {
  if (condition === undefined) return {};
  const c = board.conditions.find((x) => x.id === condition);
  if (!c) {
    throw new UserInputError({
      code: 'board.unknown-condition',
      path: 'conditions',
      message: `no condition "${condition}" on board ${board.id}`,
      accepted: board.conditions.map((x) => x.id).join(', '),
    });
  }
  return c.settings;
}

function pathPart(board: Board, ref: string, settings: Record<string, number | string>): PathPart {
  const part = preparedPart(board, ref).part;
  const value = partValue(board, ref);
  if (part.kind !== 'pot') return { ref, ohms: value };
  const set = settings[ref];
  const position = typeof set === 'number' ? set : typeof part.position === 'number' ? part.position : DEFAULT_POT_POSITION;
  const pot: Potentiometer = {
    kind: 'pot',
    name: ref.toLowerCase(),
    nodes: [part.pins['1'], part.pins['2'], part.pins['3']],
    value,
    position,
    taper: part.taper ?? 'linear',
  };
  const [aw, wb] = potResistances(pot);
  return { ref, ohms: potSegmentInPath(board, part, aw, wb), position };
}

function potSegmentInPath(board: Board, part: Part, aw: number, wb: number): number {
  const [a, w, b] = [part.pins['1'], part.pins['2'], part.pins['3']];
  if (w === a) return wb;
  if (w === b) return aw;
  const used = (net: string) => board.parts.some((p) => p.ref !== part.ref && Object.values(p.pins).includes(net));
  if (!used(a)) return wb;
  if (!used(b)) return aw;
  return aw + wb;
}

export interface TimeBand {
  which: 'attack' | 'release';
  knob: 'fastest' | 'slowest';
  /** 10 %–90 % times in seconds: the parts at their values, and at the ends of their tolerances. */
  nominal: number;
  min: number;
  max: number;
  /** The path behind the nominal, and each pot's position in it. */
  path: PathTime;
  capacitors: string[];
}

/**
 * A detector time as a band, with its knob at the fast or the slow end of its travel (whichever end
 * puts less or more resistance in the path on this board, so a tree need not know how a pot is
 * wired). Each part's tolerance (board file, value text, else the kind's default) moves its ohms or
 * farads: τ = (ΣR)·(ΣC) grows with every one of them, so the band's ends are the products of the
 * sums at their low and high ends, exactly (worst case, no sensitivity needed).
 */
export function detectorTimeBand(board: Board, which: 'attack' | 'release', knob: 'fastest' | 'slowest'): TimeBand {
  const potRefs = roleRefs(board, which === 'attack' ? 'attack-pot' : 'release-pot');
  const at = (position: number) => detectorTimes(board, undefined, Object.fromEntries(potRefs.map((ref) => [ref, position])));
  const ends = [at(0), at(1)].sort((a, b) => a[which].tau - b[which].tau);
  const times = knob === 'fastest' ? ends[0] : ends[1];
  const path = times[which];
  const spread = (ref: string) => partTolerance(board, ref) ?? 0;
  const ohms = (sign: number) => path.parts.reduce((sum, p) => sum + p.ohms * (1 + sign * spread(p.ref)), 0);
  const farads = (sign: number) => times.capacitors.reduce((sum, ref) => sum + partValue(board, ref) * (1 + sign * spread(ref)), 0);
  return { which, knob, nominal: path.riseTime, min: ohms(-1) * farads(-1) * LN9, max: ohms(1) * farads(1) * LN9, path, capacitors: times.capacitors };
}
