import { createHash } from 'node:crypto';
import { mkdirSync, readFileSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { homedir } from 'node:os';
import { join } from 'node:path';

/**
 * Results kept on disk between runs (fault dictionaries, expected bands), each in a file named by a
 * hash of everything it depends on. A cache is never a reason to fail: a file that cannot be written
 * (read-only home, full disk) is skipped, and one that cannot be read or parsed is treated as absent.
 */

export function defaultCacheDir(env: Record<string, string | undefined> = process.env): string {
  return env.VOLTWALK_CACHE_DIR ?? join(env.XDG_CACHE_HOME ?? join(homedir(), '.cache'), 'voltwalk');
}

/** 32 hex digits of SHA-256 over the JSON of `parts`. */
export function cacheKey(parts: unknown[]): string {
  return createHash('sha256').update(JSON.stringify(parts)).digest('hex').slice(0, 32);
}

/** NaN and ±Infinity do not survive JSON; they are written as strings. */
export const encodeNumber = (x: number): number | string => (Number.isNaN(x) ? 'NaN' : x === Infinity ? 'Inf' : x === -Infinity ? '-Inf' : x);
export const decodeNumber = (x: unknown): number => (x === 'NaN' ? NaN : x === 'Inf' ? Infinity : x === '-Inf' ? -Infinity : (x as number));

export function writeCacheFile(dir: string, name: string, data: unknown): void {
  // Written beside under this process's own name and renamed, so a reader never sees half a file,
  // even with two runs writing the same entry at once.
  const file = join(dir, name);
  const tmp = `${file}.${process.pid}.tmp`;
  try {
    mkdirSync(dir, { recursive: true });
    writeFileSync(tmp, JSON.stringify(data));
    renameSync(tmp, file);
  } catch {
    // Only slower next time; a half-written temporary is not left behind if it can be helped.
    try {
      rmSync(tmp, { force: true });
    } catch {
      // A folder that refuses the write may refuse this too.
    }
  }
}

/** The parsed file, unchecked (the caller checks its shape), or undefined when it cannot be read or parsed. */
export function readCacheFile(dir: string, name: string): ReturnType<typeof JSON.parse> {
  try {
    return JSON.parse(readFileSync(join(dir, name), 'utf8'));
  } catch {
    return undefined;
  }
}
