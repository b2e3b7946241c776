import { describe, expect, it } from 'vitest';
import { mkdtempSync, writeFileSync, existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { newSessionFile, sessionsFolder } from '../../../src/ui/sessions/sessions-folder.js';
import { listSessions } from '../../../src/ui/sessions/session-list.js';
import { UserInputError } from '../../../src/errors.js';

describe('sessions folder', () => {
  it('is .voltwalk-sessions under the current folder, or VOLTWALK_HOME (relative to it) when set', () => {
    expect(sessionsFolder({}, '/bench')).toBe('/bench/.voltwalk-sessions');
    expect(sessionsFolder({ VOLTWALK_HOME: '/srv/walks' }, '/bench')).toBe('/srv/walks');
    expect(sessionsFolder({ VOLTWALK_HOME: 'walks' }, '/bench')).toBe('/bench/walks');
  });

  it('never hands out the name of an existing file, damaged or not', () => {
    const dir = mkdtempSync(join(tmpdir(), 'voltwalk-names-'));
    const now = new Date('2026-12-02T10:15:00.123Z');
    const first = newSessionFile(dir, 'no-output', now, existsSync);
    expect(first).toBe(join(dir, '2026-12-02T10-15-00Z-no-output.json'));
    writeFileSync(first, 'damaged');
    expect(newSessionFile(dir, 'no-output', now, existsSync)).toBe(join(dir, '2026-12-02T10-15-00Z-no-output-2.json'));
  });

  it('lists sessions newest first, marks damaged ones with their reason and skips half-written temp files', () => {
    const dir = mkdtempSync(join(tmpdir(), 'voltwalk-list-'));
    writeFileSync(join(dir, 'a.json'), 'good');
    writeFileSync(join(dir, 'b.json'), 'bad');
    writeFileSync(join(dir, 'c.json.123.tmp'), 'partial');
    const load = (file: string) => {
      if (file.endsWith('b.json')) throw new UserInputError({ code: 'session.corrupt', file, message: 'the session file is damaged (not valid JSON)' });
      return { done: false };
    };
    const list = listSessions(dir, load, (s) => s.done);
    expect(list.map((e) => [e.file.slice(dir.length + 1), e.status])).toEqual(expect.arrayContaining([['a.json', 'unfinished'], ['b.json', 'corrupt']]));
    expect(list).toHaveLength(2);
    const bad = list.find((e) => e.status === 'corrupt');
    expect(bad && 'problem' in bad ? bad.problem : '').toBe('the session file is damaged (not valid JSON)');
  });

  it('finds nothing, without failing, when the folder does not exist yet', () => {
    expect(listSessions(join(tmpdir(), 'voltwalk-none-', String(Date.now())), () => 0, () => false)).toEqual([]);
  });
});
