import type { Board, BoardModel, Part } from '../schemas/board.js';
import type { OpAmpParams } from '../circuit/netlist.js';
import { UserInputError } from '../errors.js';
import { parseValue } from '../units/index.js';
import {
  BUILTIN_MODELS,
  BUILTIN_OPAMP_MODELS,
  DEFAULT_DIODE_MODEL,
  DEFAULT_OPAMP_MODEL,
  DEFAULT_TOLERANCE,
  VALUE_RANGE,
} from './defaults.js';

/** A part with its value and tolerance already parsed to SI numbers. */
export interface PreparedPart {
  part: Part;
  index: number;
  value?: number;
  tolerance?: number;
}

/**
 * Parsed values per board object, computed once: buildCircuit runs thousands of times per board
 * (fault dictionary, Monte Carlo) and must not re-parse "4k7" each time. Keyed weakly so that a board
 * derived by a substitution or a fault gets its own entry and old ones are collected.
 */
const cache = new WeakMap<Board, Map<string, PreparedPart>>();
/** Per part object too: a board derived by a fault edit keeps its untouched parts, and their parsing. */
const partCache = new WeakMap<Part, { value?: number; tolerance?: number }>();

/** Parses one part's value as its kind expects; throws UserInputError naming `field`. */
export function parsePartValue(part: Part, field: string): { value?: number; tolerance?: number } {
  if (part.value === undefined) return {};
  const unit = VALUE_RANGE[part.kind]?.unit;
  if (typeof part.value === 'number') return { value: part.value };
  const parsed = parseValue(part.value, { unit, field });
  return { value: parsed.value, tolerance: parsed.tolerance };
}

export function preparedParts(board: Board): Map<string, PreparedPart> {
  let prepared = cache.get(board);
  if (prepared) return prepared;
  prepared = new Map();
  board.parts.forEach((part, index) => {
    let parsed = partCache.get(part);
    if (!parsed) {
      const { value, tolerance } = parsePartValue(part, `parts[${index}].value`);
      parsed = { value, tolerance: part.tolerance ?? tolerance ?? DEFAULT_TOLERANCE[part.kind] };
      partCache.set(part, parsed);
    }
    prepared!.set(part.ref, { part, index, ...parsed });
  });
  cache.set(board, prepared);
  return prepared;
}

export function preparedPart(board: Board, ref: string): PreparedPart {
  const p = preparedParts(board).get(ref);
  if (!p) {
    throw new UserInputError({
      code: 'board.unknown-part',
      path: 'parts',
      message: `no part "${ref}" on board ${board.id}`,
      accepted: 'a designator listed in the board file',
    });
  }
  return p;
}

/** The SI value of a part (ohms, farads, henries; a pot's track). */
export function partValue(board: Board, ref: string): number {
  const p = preparedPart(board, ref);
  if (p.value === undefined) {
    throw new UserInputError({
      code: 'board.no-value',
      path: `parts[${p.index}].value`,
      message: `${ref} (${p.part.kind}) has no value`,
      accepted: 'a part with a value: resistor, capacitor, electrolytic, inductor or pot',
    });
  }
  return p.value;
}

/** The tolerance of a part as a fraction: the file's, else one in its value text (4k7F), else the kind's default. */
export function partTolerance(board: Board, ref: string): number | undefined {
  return preparedPart(board, ref).tolerance;
}

/** The semiconductor model a part uses: the board's entry, else a built-in of that name. */
export function modelNameFor(part: Part): string | undefined {
  if (part.model !== undefined) return part.model;
  if (part.kind === 'diode') return DEFAULT_DIODE_MODEL;
  if (part.kind === 'opamp-dual' || part.kind === 'opamp-quad') return DEFAULT_OPAMP_MODEL;
  return undefined;
}

export function resolveModel(board: Board, name: string): BoardModel | undefined {
  return board.models[name] ?? BUILTIN_MODELS[name];
}

/** Full op-amp parameters: the board's entry over the built-in of the same name over the default model. */
export function resolveOpAmp(board: Board, name: string): (OpAmpParams & { vosMax?: number }) | undefined {
  const own = board.opampModels[name];
  const builtin = BUILTIN_OPAMP_MODELS[name];
  if (!own && !builtin) return undefined;
  const base = builtin ?? BUILTIN_OPAMP_MODELS[DEFAULT_OPAMP_MODEL];
  const { source: _s, ...baseParams } = base;
  const { source: _o, ...ownParams } = own ?? {};
  return { ...baseParams, ...ownParams };
}
