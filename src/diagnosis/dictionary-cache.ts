import { createHash } from 'node:crypto';
import { mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import { homedir } from 'node:os';
import { join } from 'node:path';
import type { Board } from '../schemas/board.js';
import type { BuiltDictionary } from './dictionary.js';

/**
 * A built dictionary kept on disk between runs, since building one for a full board keeps the
 * solver busy for seconds (tens of seconds on a slow machine). Keyed by a hash of everything the
 * predictions depend on that lives in data (the board with substitutions, the conditions, the
 * prior share) and by DICTIONARY_FORMAT, which is
 * raised whenever fault models or the file layout change. A file that cannot be read or parsed is
 * ignored and rebuilt: a cache is never a reason to fail.
 */
export const DICTIONARY_FORMAT = 'voltwalk-dictionary/6';

export function defaultCacheDir(env: Record<string, string | undefined> = process.env): string {
  return env.VOLTWALK_CACHE_DIR ?? join(env.XDG_CACHE_HOME ?? join(homedir(), '.cache'), 'voltwalk');
}

export function dictionaryKey(board: Board, conditions: string[] | undefined, noFaultPrior: number | undefined, version: string): string {
  return createHash('sha256').update(JSON.stringify([DICTIONARY_FORMAT, version, board, conditions ?? null, noFaultPrior ?? null])).digest('hex').slice(0, 32);
}

/** NaN and Infinity do not survive JSON; they are written as strings. */
const encode = (x: number) => (Number.isNaN(x) ? 'NaN' : x === Infinity ? 'Inf' : x === -Infinity ? '-Inf' : x);
const decode = (x: unknown) => (x === 'NaN' ? NaN : x === 'Inf' ? Infinity : x === '-Inf' ? -Infinity : (x as number));

export function saveDictionary(dir: string, key: string, dict: BuiltDictionary): void {
  try {
    mkdirSync(dir, { recursive: true });
    const data = {
      format: DICTIONARY_FORMAT,
      observables: dict.observables,
      hypotheses: dict.hypotheses.map((h) => ({ ...h, predictions: h.predictions.map(encode), ...(h.variants ? { variants: h.variants.map((v) => v.map(encode)) } : {}) })),
      faults: dict.faults,
      unsettled: [...dict.unsettled.entries()],
      skippedConditions: dict.skippedConditions,
    };
    // Written beside and renamed, so a reader never sees half a file.
    const file = join(dir, `${key}.json`);
    writeFileSync(`${file}.tmp`, JSON.stringify(data));
    renameSync(`${file}.tmp`, file);
  } catch {
    // No cache folder (read-only home, full disk): the dictionary still works, only slower next time.
  }
}

export function loadDictionary(dir: string, key: string, board: Board): BuiltDictionary | undefined {
  try {
    const data = JSON.parse(readFileSync(join(dir, `${key}.json`), 'utf8'));
    if (data.format !== DICTIONARY_FORMAT || !Array.isArray(data.hypotheses) || !Array.isArray(data.observables)) return undefined;
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
