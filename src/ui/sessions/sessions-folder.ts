import { join, resolve } from 'node:path';

/**
 * Where walks are autosaved: `VOLTWALK_HOME` when set (a folder, used as is), otherwise
 * `.voltwalk-sessions/` under the current directory, so a bench's sessions stay with its work.
 */
export const SESSIONS_FOLDER_NAME = '.voltwalk-sessions';

export function sessionsFolder(env: Record<string, string | undefined>, cwd: string): string {
  const home = env.VOLTWALK_HOME?.trim();
  return home ? resolve(cwd, home) : join(cwd, SESSIONS_FOLDER_NAME);
}

/**
 * A fresh file name for a new walk: time stamp plus tree id. An existing file — finished,
 * unfinished or unreadable — is never reused, so a corrupt session stays exactly as it was found.
 */
export function newSessionFile(folder: string, treeId: string, now: Date, exists: (file: string) => boolean): string {
  const stamp = now.toISOString().replace(/\.\d+Z$/, 'Z').replace(/[:]/g, '-');
  for (let n = 1; ; n++) {
    const file = join(folder, `${stamp}-${treeId}${n > 1 ? `-${n}` : ''}.json`);
    if (!exists(file)) return file;
  }
}
