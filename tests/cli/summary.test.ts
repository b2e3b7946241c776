import { describe, expect, it, beforeAll } from 'vitest';
import { mkdtempSync, writeFileSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createActor } from 'xstate';
import { run } from '../../src/cli/run.js';
import { memoryIo } from '../../src/cli/io.js';
import { DEMO_BOARD_FILE, loadBoard } from '../../src/board/index.js';
import { findTree } from '../../src/engine/load-tree.js';
import { createWalkMachine } from '../../src/engine/walk-machine.js';
import { createSession, saveSession } from '../../src/engine/session.js';

/**
 * `voltwalk summary` on a session saved part-way through the first power-up walk on the demo
 * board: five inspections passed, then one rail resistance typed. The band in the summary must be
 * the one the engine routed the reading on (read back from the session, not restated here).
 */
let dir: string;
let file: string;
let band: { min: number; max: number };

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'voltwalk-summary-'));
  const board = loadBoard(DEMO_BOARD_FILE);
  const tree = findTree('first-power-up');
  const { machine } = createWalkMachine(tree, board, { samples: 0 });
  const actor = createActor(machine).start();
  for (let i = 0; i < 5; i++) actor.send({ type: 'user.answer', choice: 'ok' });
  actor.send({ type: 'user.reading', value: 150e3, text: '150k' });
  file = join(dir, 'walk.json');
  saveSession(file, createSession(tree, board, actor.getPersistedSnapshot(), { boardFile: DEMO_BOARD_FILE }));
  const saved = JSON.parse(readFileSync(file, 'utf8'));
  band = Object.values(saved.snapshot.context.readings as Record<string, { band: { min: number; max: number } }>)[0].band;
}, 300_000);

describe('voltwalk summary', () => {
  it('prints a short plain case: board, symptom, the reading against its band, the next question', async () => {
    const io = memoryIo({ cwd: dir });
    expect(await run(['summary', 'walk.json'], io)).toBe(0);
    const out = io.out();
    expect(out.split('\n').length).toBeLessThanOrEqual(26);
    expect(out).toContain('voltwalk case: A freshly soldered board');
    expect(out).toContain('Board: Wenlow Tamp compressor (demo kit)');
    expect(out).toMatch(/- TP5 .*: 150 kΩ HIGH \[/);
    expect(out).toContain('walk not finished');
    expect(out).toMatch(/Next: measure TP6/);
    expect(out).toMatch(/^Ask: "/m);
    expect(band.max).toBeLessThan(150e3);
  }, 300_000);

  it('in Markdown marks the out-of-band outcome in bold', async () => {
    const io = memoryIo({ cwd: dir });
    expect(await run(['summary', 'walk.json', '--md'], io)).toBe(0);
    expect(io.out()).toMatch(/^### voltwalk case: /);
    expect(io.out()).toContain('**HIGH**');
  }, 300_000);

  it('as JSON carries the band the reading was judged on and the customer question', async () => {
    const io = memoryIo({ cwd: dir });
    expect(await run(['summary', 'walk.json', '--json', '--customer'], io)).toBe(0);
    const json = JSON.parse(io.out());
    expect(json.readings[0]).toMatchObject({ testPoint: 'TP5', value: 150e3, outcome: 'high', min: band.min, max: band.max });
    expect(json.wording).toBe('customer');
    expect(json.next.testPoint).toBe('TP6');
    // Customer wording is the tree's own customer prompt for that step.
    expect(json.next.question).toBe(findTree('first-power-up').nodes['ohms-neg'].say.customer);
  }, 300_000);

  it('reports a damaged session file in one line, exit 1, and leaves it as it was', async () => {
    const bad = join(dir, 'bad.json');
    writeFileSync(bad, '{"format":"voltwalk-session/1",');
    const io = memoryIo({ cwd: dir });
    expect(await run(['summary', 'bad.json'], io)).toBe(1);
    expect(io.err()).toBe(`voltwalk: ${bad}: the session file is damaged (not valid JSON) (accepted: a voltwalk-session/1 file written by voltwalk)\n`);
    expect(readFileSync(bad, 'utf8')).toBe('{"format":"voltwalk-session/1",');
  });

  it('refuses a missing SESSION argument as a usage error', async () => {
    const io = memoryIo({ cwd: dir });
    expect(await run(['summary'], io)).toBe(2);
    expect(io.err()).toContain('summary needs a SESSION file');
  });
});
