import { z } from 'zod';
import { cacheKey, decodeNumber, encodeNumber, readCacheFile, writeCacheFile } from './cache-files.js';
import { AccessSchema, PartKindSchema, type Board } from '../schemas/board.js';
import type { BuiltDictionary } from '../diagnosis/dictionary.js';
import type { Observable, Hypothesis } from '../diagnosis/dictionary-model.js';
import type { Fault } from '../diagnosis/fault.js';
import { FAULT_MODES, type FaultModeId } from '../diagnosis/fault-modes.js';

/**
 * A built dictionary kept on disk between runs, since building one for a full board keeps the
 * solver busy for seconds (tens of seconds on a slow machine). Keyed by a hash of everything the
 * predictions depend on that lives in data (the board with substitutions, the conditions, the
 * prior share) and by DICTIONARY_FORMAT, which is raised whenever fault models or the file layout
 * change. A file that cannot be read, or whose contents are not a dictionary of this format, is
 * ignored and rebuilt: a cache is never a reason to fail.
 */
export const DICTIONARY_FORMAT = 'voltwalk-dictionary/7';

export function dictionaryKey(board: Board, conditions: string[] | undefined, noFaultPrior: number | undefined, version: string): string {
  return cacheKey([DICTIONARY_FORMAT, version, board, conditions ?? null, noFaultPrior ?? null]);
}

/** Every number as written by encodeNumber: an open circuit's Infinity and an unsettled NaN survive. */
const stored = z.union([z.number(), z.enum(['NaN', 'Inf', '-Inf'])]).transform(decodeNumber);

const ObservableFile = z.object({
  testPoint: z.string(),
  condition: z.string(),
  unit: z.enum(['V', 'Ω']),
  access: AccessSchema,
  nominal: stored,
  halfWidth: stored,
  min: stored.optional(),
  max: stored.optional(),
  span: stored,
});

const HypothesisFile = z.object({
  id: z.string(),
  part: z.string(),
  mode: z.string(),
  fault: z.string(),
  prior: z.number(),
  predictions: z.array(stored),
  halfWidths: z.array(stored).optional(),
  variants: z.array(z.array(stored)).optional(),
});

const FaultFile = z.object({
  id: z.string(),
  part: z.string(),
  kind: z.union([PartKindSchema, z.literal('rail')]),
  mode: z.enum(Object.keys(FAULT_MODES) as [FaultModeId, ...FaultModeId[]]),
  fault: z.string(),
  prior: z.number(),
  value: z.number().optional(),
  pins: z.tuple([z.string(), z.string()]).optional(),
  amplifier: z.string().optional(),
  rail: z.string().optional(),
  pinMap: z.record(z.string(), z.string()).optional(),
});

const DictionaryFile = z.object({
  format: z.literal(DICTIONARY_FORMAT),
  observables: z.array(ObservableFile),
  hypotheses: z.array(HypothesisFile),
  faults: z.array(FaultFile),
  unsettled: z.array(z.tuple([z.string(), z.array(z.string())])),
  skippedConditions: z.array(z.string()),
});

const encodeAll = (xs: number[]) => xs.map(encodeNumber);
const encodeObservable = (o: Observable) => ({
  ...o,
  nominal: encodeNumber(o.nominal),
  halfWidth: encodeNumber(o.halfWidth),
  ...(o.min !== undefined ? { min: encodeNumber(o.min) } : {}),
  ...(o.max !== undefined ? { max: encodeNumber(o.max) } : {}),
  span: encodeNumber(o.span),
});
const encodeHypothesis = (h: Hypothesis) => ({
  ...h,
  predictions: encodeAll(h.predictions),
  ...(h.halfWidths ? { halfWidths: encodeAll(h.halfWidths) } : {}),
  ...(h.variants ? { variants: h.variants.map(encodeAll) } : {}),
});

export function saveDictionary(dir: string, key: string, dict: BuiltDictionary): void {
  writeCacheFile(dir, `${key}.json`, {
    format: DICTIONARY_FORMAT,
    observables: dict.observables.map(encodeObservable),
    hypotheses: dict.hypotheses.map(encodeHypothesis),
    faults: dict.faults,
    unsettled: [...dict.unsettled.entries()],
    skippedConditions: dict.skippedConditions,
  });
}

export function loadDictionary(dir: string, key: string, board: Board): BuiltDictionary | undefined {
  const parsed = DictionaryFile.safeParse(readCacheFile(dir, `${key}.json`));
  if (!parsed.success) return undefined;
  // Typed as the diagnosis's own shapes: the file schema cannot drift from them unnoticed.
  const observables: Observable[] = parsed.data.observables;
  const hypotheses: Hypothesis[] = parsed.data.hypotheses.map(({ halfWidths, variants, ...h }) => ({
    ...h,
    ...(halfWidths ? { halfWidths } : {}),
    ...(variants ? { variants } : {}),
  }));
  const faults: Fault[] = parsed.data.faults;
  const width = observables.length;
  if (hypotheses.some((h) => h.predictions.length !== width || h.variants?.some((v) => v.length !== width))) return undefined;
  if (faults.length !== hypotheses.length - 1) return undefined;
  return { board, observables, hypotheses, faults, unsettled: new Map(parsed.data.unsettled), skippedConditions: parsed.data.skippedConditions };
}
