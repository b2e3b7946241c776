import { cacheKey, decodeNumber as decode, encodeNumber as encode, readCacheFile, writeCacheFile } from './cache-files.js';
import type { Board } from '../schemas/board.js';
import type { BuiltDictionary } from '../diagnosis/dictionary.js';

/**
 * A built dictionary kept on disk between runs, since building one for a full board keeps the
 * solver busy for seconds (tens of seconds on a slow machine). Keyed by a hash of everything the
 * predictions depend on that lives in data (the board with substitutions, the conditions, the
 * prior share) and by DICTIONARY_FORMAT, which is raised whenever fault models or the file layout
 * change. A file that cannot be read or parsed is ignored and rebuilt: a cache is never a reason to fail.
 */
export const DICTIONARY_FORMAT = 'voltwalk-dictionary/6';

export function dictionaryKey(board: Board, conditions: string[] | undefined, noFaultPrior: number | undefined, version: string): string {
  return cacheKey([DICTIONARY_FORMAT, version, board, conditions ?? null, noFaultPrior ?? null]);
}

export function saveDictionary(dir: string, key: string, dict: BuiltDictionary): void {
  writeCacheFile(dir, `${key}.json`, {
    format: DICTIONARY_FORMAT,
    observables: dict.observables,
    hypotheses: dict.hypotheses.map((h) => ({ ...h, predictions: h.predictions.map(encode), ...(h.variants ? { variants: h.variants.map((v) => v.map(encode)) } : {}) })),
    faults: dict.faults,
    unsettled: [...dict.unsettled.entries()],
    skippedConditions: dict.skippedConditions,
  });
}

export function loadDictionary(dir: string, key: string, board: Board): BuiltDictionary | undefined {
  try {
    const data = readCacheFile(dir, `${key}.json`);
    if (!data || data.format !== DICTIONARY_FORMAT || !Array.isArray(data.hypotheses) || !Array.isArray(data.observables)) return undefined;
    const hypotheses = data.hypotheses.map((h: { predictions: unknown[]; variants?: unknown[][] }) => ({
      ...h,
      predictions: h.predictions.map(decode),
      ...(h.variants ? { variants: h.variants.map((v) => v.map(decode)) } : {}),
    }));
    const width = data.observables.length;
    if (hypotheses.some((h: { predictions: number[]; variants?: number[][] }) => h.predictions.length !== width || h.variants?.some((v) => v.length !== width))) return undefined;
    return { board, observables: data.observables, hypotheses, faults: data.faults, unsettled: new Map(data.unsettled), skippedConditions: data.skippedConditions ?? [] };
  } catch {
    return undefined;
  }
}
