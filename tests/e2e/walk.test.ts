import { afterEach, describe, expect, it } from 'vitest';
import { mkdtempSync, readdirSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { ROOT, Terminal, hasTmux } from './terminal.js';

/**
 * End to end: the real binary in a pseudo-terminal (tmux), walking the first power-up tree on the
 * bundled demo board by typing what a person would type. Readings typed are the nominal values the
 * screen itself asks for, so the walk takes the healthy route, through the power caution.
 */
const BIN = `node --import tsx ${JSON.stringify(join(ROOT, 'src/cli/bin.ts'))}`;
const run = hasTmux() ? describe : describe.skip;
if (!hasTmux()) console.warn('tests/e2e skipped: tmux is not installed, so there is no pseudo-terminal to run voltwalk in');

let term: Terminal | undefined;
afterEach(() => term?.close());

function start(home: string): Terminal {
  term = new Terminal(BIN, { VOLTWALK_HOME: home, TERM: 'xterm-256color' }, ROOT);
  return term;
}

async function chooseSymptom(t: Terminal, symptom: RegExp): Promise<string> {
  let screen = await t.waitFor((s) => /What is wrong|Carry on where you stopped/.test(s), 'the start screen', 120_000);
  for (let i = 0; i < 15 && !new RegExp(`> ${symptom.source}`).test(screen); i++) {
    t.keys('Down');
    screen = await t.waitForChange(screen);
  }
  t.keys('Enter');
  // Opening a walk works out the board's bands first; wait for its first step.
  return t.waitFor((s) => /INSPECT|MEASURE|CAUTION|SET UP|LOOK/.test(s), 'the first step', 300_000);
}

run('voltwalk in a terminal', () => {
  it('walks first power-up from the symptom to the conclusion, with the caution before any powered step', async () => {
    const home = mkdtempSync(join(tmpdir(), 'voltwalk-e2e-'));
    const t = start(home);
    let screen = await chooseSymptom(t, /A freshly soldered board/);
    let cautions = 0;
    let typoChecked = false;
    const powered: string[] = [];
    for (let step = 0; step < 40 && !screen.includes('FOUND:'); step++) {
      const before = screen;
      if (/MEASURE .*\n[\s\S]*\(powered\)/.test(screen) || screen.includes('SET UP (power on)')) {
        powered.push(screen.split('\n').find((l) => /MEASURE|SET UP/.test(l)) ?? '');
        expect(cautions, `a powered step appeared before its caution:\n${screen}`).toBeGreaterThan(0);
      }
      if (screen.includes('Read it? Type y')) {
        cautions++;
        t.type('y');
        t.keys('Enter');
      } else if (screen.includes('Reading (')) {
        if (!typoChecked) {
          t.type('4.2x');
          t.keys('Enter');
          screen = await t.waitForChange(screen);
          expect(screen).toMatch(/^! unrecognised characters \(accepted: a (voltage|resistance) reading such as/m);
          t.keys('BSpace', 'BSpace', 'BSpace', 'BSpace');
          screen = await t.waitForChange(screen);
          typoChecked = true;
        }
        const nominal = /\(nominal ([^)]+)\)/.exec(screen)?.[1];
        expect(nominal, `no expected value on the measure screen:\n${screen}`).toBeDefined();
        t.type(nominal!);
        await t.waitFor((s) => s.includes(`Reading (V): ${nominal}`) || s.includes(`Reading (Ω): ${nominal}`), 'the typed reading');
        t.keys('Enter');
        screen = await t.waitFor((s) => s.includes('healthy band'), 'the reading against its band', 120_000);
        expect(screen).toContain('in band');
        expect(screen).toMatch(/\[=*\|?=*\]/);
        t.keys('Enter');
      } else {
        // Inspections, observations and set-ups: the first answer is the healthy one.
        t.keys('Enter');
      }
      screen = await t.waitForChange(before, 120_000);
    }
    expect(screen).toContain('FOUND:');
    expect(cautions).toBeGreaterThan(0);
    expect(powered.length).toBeGreaterThan(0);
    t.type('s');
    screen = await t.waitFor((s) => s.includes('Case summary'), 'the case summary');
    expect(screen).toMatch(/Written to .*\.md/);
    t.keys('Enter');
    await t.waitForChange(screen);
    t.type('q');
    screen = await t.waitFor((s) => s.includes('EXIT:'), 'the program to end');
    expect(screen).toContain('EXIT:0');
    const files = readdirSync(home);
    const session = files.find((f) => f.endsWith('.json'))!;
    expect(JSON.parse(readFileSync(join(home, session), 'utf8')).format).toBe('voltwalk-session/1');
    expect(files.some((f) => f.endsWith('.md'))).toBe(true);
  }, 600_000);

  it('loses nothing on Ctrl-C: the next start offers the walk for resume at the same step', async () => {
    const home = mkdtempSync(join(tmpdir(), 'voltwalk-e2e-'));
    let t = start(home);
    let screen = await chooseSymptom(t, /A freshly soldered board/);
    // Answer two inspections, then interrupt.
    for (let i = 0; i < 2; i++) {
      t.keys('Enter');
      screen = await t.waitForChange(screen);
    }
    const heading = screen.split('\n').find((l) => l.startsWith('INSPECT') || l.startsWith('MEASURE'))!;
    const question = screen.split('\n')[screen.split('\n').indexOf(heading) + 1];
    t.keys('C-c');
    await t.waitFor((s) => s.includes('EXIT:'), 'the program to end');
    t.close();
    t = start(home);
    screen = await t.waitFor((s) => s.includes('> Resume: A freshly soldered board'), 'the resume offer', 120_000);
    // One walk was started, so exactly one is offered.
    expect(screen.match(/Resume: /g)?.length).toBe(1);
    t.keys('Enter');
    screen = await t.waitFor((s) => s.includes(heading), 'the resumed step', 300_000);
    expect(screen).toContain(heading);
    expect(screen).toContain(question);
  }, 600_000);
});
