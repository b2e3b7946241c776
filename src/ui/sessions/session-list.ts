import { readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { UserInputError } from '../../errors.js';

/** One file in the sessions folder, as the start screen offers it. */
export type SessionEntry<S> =
  | { file: string; modified: Date; status: 'unfinished' | 'finished'; session: S }
  | { file: string; modified: Date; status: 'corrupt'; problem: string };

/**
 * Reads every session file in the folder, newest first. A file that does not load is listed as
 * corrupt with the one-line reason and left untouched on disk. Temporary files of an interrupted
 * save (`*.tmp`) are not sessions and are skipped.
 */
export function listSessions<S>(folder: string, load: (file: string) => S, isFinished: (session: S) => boolean): SessionEntry<S>[] {
  let names: string[];
  try {
    names = readdirSync(folder);
  } catch {
    return [];
  }
  const entries: SessionEntry<S>[] = [];
  for (const name of names) {
    if (!name.endsWith('.json')) continue;
    const file = join(folder, name);
    let modified: Date;
    try {
      modified = statSync(file).mtime;
    } catch {
      continue;
    }
    try {
      const session = load(file);
      entries.push({ file, modified, status: isFinished(session) ? 'finished' : 'unfinished', session });
    } catch (error) {
      entries.push({ file, modified, status: 'corrupt', problem: oneLine(error) });
    }
  }
  return entries.sort((a, b) => b.modified.getTime() - a.modified.getTime());
}

function oneLine(error: unknown): string {
  // The file name is shown beside the reason, so only the problem's own words are kept.
  if (error instanceof UserInputError) return error.problems[0].message;
  return error instanceof Error ? error.message.split('\n')[0] : String(error);
}
