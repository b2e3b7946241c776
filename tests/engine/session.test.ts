import { mkdtempSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it, vi } from 'vitest';
import { createActor } from 'xstate';

vi.mock('../../src/engine/ranking.js', () => ({ rankFor: () => ({ note: 'ranking left out of engine tests' }) }));
vi.mock('../../src/engine/board-view.js', async () => {
  const { fakeView } = await import('./fake-view.js');
  return { createBoardView: () => fakeView() };
});

import { createWalkMachine } from '../../src/engine/walk-machine.js';
import { createSession, loadSession, resumeWalk, saveSession, SESSION_FORMAT } from '../../src/engine/session.js';
import { answerEvent, currentStep, readingEvent } from '../../src/engine/step-view.js';
import { UserInputError } from '../../src/errors.js';
import { fakeView, smallTree } from './fake-view.js';

const board = fakeView().board;
const dir = () => mkdtempSync(join(tmpdir(), 'voltwalk-session-'));

function walkedSession() {
  const tree = smallTree();
  const { machine, walk } = createWalkMachine(tree, board);
  const actor = createActor(machine).start();
  actor.send(answerEvent(currentStep(walk, actor.getSnapshot()), 'ok'));
  actor.send(readingEvent(currentStep(walk, actor.getSnapshot()), '10k'));
  actor.send({ type: 'user.acknowledge' });
  actor.send({ type: 'user.substitute', ref: 'R1', value: '5k6' });
  return { tree, actor, session: createSession(tree, board, actor.getPersistedSnapshot()) };
}

function failure(fn: () => unknown): UserInputError {
  try {
    fn();
  } catch (e) {
    if (e instanceof UserInputError) return e;
    throw e;
  }
  throw new Error('expected a UserInputError');
}

describe('sessions', () => {
  it('round-trips through a file: same step, same context, and the walk goes on', () => {
    const { tree, actor, session } = walkedSession();
    const file = join(dir(), 'case.json');
    saveSession(file, session);
    const loaded = loadSession(file);
    expect(loaded.format).toBe(SESSION_FORMAT);
    const resumed = resumeWalk(loaded, tree, board);
    resumed.actor.start();
    const before = actor.getSnapshot();
    const after = resumed.actor.getSnapshot();
    expect(after.value).toBe('power');
    expect(after.context).toEqual(before.context);
    resumed.actor.send({ type: 'user.acknowledge' });
    // the substitution survived the round trip: the band is centred on 5.6 V
    expect(currentStep(resumed.walk, resumed.actor.getSnapshot()).expected?.nominal).toBeCloseTo(5.6);
  });

  it('writes through a temporary file and leaves nothing else behind', () => {
    const { session } = walkedSession();
    const d = dir();
    saveSession(join(d, 'a.json'), session);
    expect(readdirSync(d)).toEqual(['a.json']);
  });

  it('a corrupt file is a clear one-line error and the file is left untouched', () => {
    const file = join(dir(), 'bad.json');
    writeFileSync(file, '{"format": "voltwalk-session/1", "tree');
    const e = failure(() => loadSession(file));
    expect(e.problems[0].code).toBe('session.corrupt');
    expect(e.message.split('\n')).toHaveLength(1);
    expect(readFileSync(file, 'utf8')).toBe('{"format": "voltwalk-session/1", "tree');
  });

  it('a file from another format version is refused by name', () => {
    const { session } = walkedSession();
    const file = join(dir(), 'old.json');
    writeFileSync(file, JSON.stringify({ ...session, format: 'voltwalk-session/0' }));
    const e = failure(() => loadSession(file));
    expect(e.problems[0]).toMatchObject({ code: 'session.version', path: 'format' });
    expect(e.message).toContain('voltwalk-session/0');
  });

  it('a damaged context is refused, naming the field', () => {
    const { session } = walkedSession();
    const file = join(dir(), 'dam.json');
    writeFileSync(file, JSON.stringify({ ...session, snapshot: { ...session.snapshot, context: { ...session.snapshot.context, acknowledged: ['lasers'] } } }));
    const e = failure(() => loadSession(file));
    expect(e.problems[0].code).toBe('session.corrupt');
    expect(e.problems[0].path).toBe('snapshot.context.acknowledged.0');
  });

  it('refuses to resume on a tree that changed since the save', () => {
    const { session } = walkedSession();
    const changed = smallTree({ 'end-ok': { kind: 'conclude', title: 'ok now', parts: [], say: { technician: 'x', customer: 'y' } } });
    expect(failure(() => resumeWalk(session, changed, board)).problems[0].code).toBe('session.tree-changed');
  });

  it('refuses to resume on a board that changed since the save', () => {
    const { tree, session } = walkedSession();
    const other = { ...board, parts: [...board.parts, { ...board.parts[0], ref: 'R2' }] };
    expect(failure(() => resumeWalk(session, tree, other)).problems[0].code).toBe('session.board-changed');
  });

  it('a missing file and an unwritable path are clear errors', () => {
    expect(failure(() => loadSession(join(dir(), 'nope.json'))).problems[0].code).toBe('session.missing');
    // A folder is said to be one; "damaged" would send the person looking for a broken file.
    const folder = failure(() => loadSession(dir()));
    expect(folder.problems[0].message).toBe('session file: is a folder, not a file');
    const { session } = walkedSession();
    expect(failure(() => saveSession(join(dir(), 'no-such-dir', 'x.json'), session)).problems[0].code).toBe('session.unwritable');
  });
});
