import React from 'react';
import { describe, expect, it } from 'vitest';
import { render } from 'ink-testing-library';
import { mkdtempSync, readFileSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { App } from '../../../src/ui/app/App.js';
import { DEMO_BOARD_FILE } from '../../../src/board/index.js';
import { findTree } from '../../../src/engine/load-tree.js';
import { ARROW_DOWN, ENTER, press, settle } from '../keys.js';

/**
 * The whole app in-process on the bundled demo board and the real engine: from the symptom to the
 * suspects, typing what a person types. The walk types the nominal value the screen asks for at
 * each step except the positive rail, where it types a dead rail (0 V), so the walk ends on a
 * conclusion with suspects.
 */
const loadServices = () => import('../../../src/ui/app/services.js');

function app(folder: string) {
  return render(<App boardFile={DEMO_BOARD_FILE} folder={folder} cwd={folder} wording="technician" loadServices={loadServices} />);
}

async function until(frame: () => string | undefined, test: (s: string) => boolean, what: string, ms = 120_000): Promise<string> {
  const t0 = Date.now();
  while (Date.now() - t0 < ms) {
    const f = frame() ?? '';
    if (test(f)) return f;
    await settle(100);
  }
  throw new Error(`timed out waiting for ${what}; last frame:\n${frame()}`);
}

async function chooseSymptom(r: ReturnType<typeof app>, symptom: string, walk = !symptom.startsWith('Open')): Promise<void> {
  let f = await until(r.lastFrame, (s) => /What is wrong|Carry on/.test(s), 'the start screen');
  for (let i = 0; i < 15 && !f.includes(`> ${symptom}`); i++) {
    await press(r.stdin, ARROW_DOWN);
    f = r.lastFrame()!;
  }
  await press(r.stdin, ENTER);
  if (walk) await until(r.lastFrame, (s) => /INSPECT|MEASURE|CAUTION|SET UP|LOOK/.test(s), 'the first step', 300_000);
}

describe('the app, start to suspects', () => {
  it('walks first power-up: inspections, resistances, the caution, power, readings, suspects, summary', async () => {
    const folder = mkdtempSync(join(tmpdir(), 'voltwalk-app-'));
    const r = app(folder);
    await chooseSymptom(r, 'A freshly soldered board');
    let cautioned = false;
    let frame = '';
    for (let step = 0; step < 40; step++) {
      frame = await until(r.lastFrame, (s) => /INSPECT|LOOK|MEASURE|SET UP|CAUTION|FOUND:|STOPPED/.test(s), 'a step');
      if (frame.includes('FOUND:')) break;
      if (/\(powered\)|SET UP \(power on\)/.test(frame)) expect(cautioned, `powered step before its caution:\n${frame}`).toBe(true);
      if (frame.includes('CAUTION')) {
        cautioned = true;
        await press(r.stdin, 'y', ENTER);
      } else if (frame.includes('Reading (')) {
        const rail = frame.includes('MEASURE') && /\+12 V|positive rail/i.test(frame.split('\n').find((l) => l.startsWith('MEASURE')) ?? '');
        const nominal = /\(nominal ([^)]+)\)/.exec(frame)?.[1];
        expect(nominal).toBeDefined();
        const typed = rail && frame.includes('(powered)') ? '0' : nominal!;
        await press(r.stdin, typed, ENTER);
        const result = await until(r.lastFrame, (s) => s.includes('healthy band'), 'the reading result');
        expect(result).toMatch(/\[=*\|?=*\]/);
        expect(result).toMatch(/\^ .* (in band|LOW|HIGH)/);
        await press(r.stdin, ENTER);
      } else await press(r.stdin, ENTER);
    }
    expect(frame).toContain('FOUND:');
    expect(cautioned).toBe(true);
    expect(frame).toMatch(/Suspects, most likely first|no ranking/i);
    await press(r.stdin, 's');
    const summary = await until(r.lastFrame, (s) => s.includes('Case summary'), 'the summary');
    const md = readdirSync(folder).find((f) => f.endsWith('.md'))!;
    const text = readFileSync(join(folder, md), 'utf8');
    expect(summary).toContain(text.split('\n')[0]);
    expect(text.split('\n').length).toBeLessThanOrEqual(26);
    expect(text).toMatch(/Readings \(healthy band in brackets\):/);
    r.unmount();
  }, 600_000);

  it('speaks to a customer after w on the start screen: the tree\'s customer wording', async () => {
    const folder = mkdtempSync(join(tmpdir(), 'voltwalk-app-'));
    const r = app(folder);
    await until(r.lastFrame, (s) => s.includes('What is wrong'), 'the start screen');
    await press(r.stdin, 'w');
    expect(r.lastFrame()).toContain('Wording: for a customer (plain words, for a support chat)');
    await chooseSymptom(r, 'A freshly soldered board');
    const tree = findTree('first-power-up');
    const first = tree.nodes[tree.start];
    expect(r.lastFrame()).toContain(first.say.customer.slice(0, 60));
    expect(r.lastFrame()).toContain('> it matches the description');
    r.unmount();
  }, 600_000);

  it('opens another board file typed in, refusing a path that is not a board with a one-line reason', async () => {
    const folder = mkdtempSync(join(tmpdir(), 'voltwalk-app-'));
    const fixtures = join(import.meta.dirname, '..', '..', 'fixtures', 'boards');
    const r = render(<App boardFile={DEMO_BOARD_FILE} folder={folder} cwd={fixtures} wording="technician" loadServices={loadServices} />);
    await chooseSymptom(r, 'Open another board file');
    await until(r.lastFrame, (s) => s.includes('Board file:'), 'the open-board screen');
    await press(r.stdin, 'nothing-here.json', ENTER);
    expect(r.lastFrame()).toMatch(/^! .*no such file/m);
    for (let i = 0; i < 'nothing-here.json'.length; i++) r.stdin.write('\u007F');
    await press(r.stdin, 'small-amp.json', ENTER);
    const f = await until(r.lastFrame, (s) => s.includes('What is wrong') && !s.includes('Wenlow'), 'the start screen on the other board');
    expect(f).toMatch(/^Board: .* · rails .* · \d+ parts$/m);
    r.unmount();
  }, 600_000);

  it('reports a damaged session file on the start screen and leaves it untouched', async () => {
    const folder = mkdtempSync(join(tmpdir(), 'voltwalk-app-'));
    const damaged = join(folder, 'old.json');
    writeFileSync(damaged, '{"format": "voltwalk-session/1", "treeId": ');
    const r = app(folder);
    const f = await until(r.lastFrame, (s) => s.includes('What is wrong'), 'the start screen');
    expect(f).toContain(`! ${damaged}: the session file is damaged (not valid JSON) (left as it is)`);
    await chooseSymptom(r, 'A freshly soldered board');
    await until(r.lastFrame, (s) => s.includes('INSPECT'), 'the first step');
    await press(r.stdin, ENTER);
    expect(readFileSync(damaged, 'utf8')).toBe('{"format": "voltwalk-session/1", "treeId": ');
    expect(readdirSync(folder).filter((n) => n.endsWith('.json')).length).toBe(2);
    r.unmount();
  }, 600_000);
});
