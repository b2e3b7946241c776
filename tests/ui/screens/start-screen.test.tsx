import React from 'react';
import { describe, expect, it } from 'vitest';
import { render } from 'ink-testing-library';
import { StartScreen, type StartChoice } from '../../../src/ui/screens/StartScreen.js';
import { ARROW_DOWN, ENTER, press } from '../keys.js';

const board = { name: 'Demo compressor', rails: ['+12 V', '-12 V'], partCount: 42, file: 'demo.json' };
const symptoms = [
  { treeId: 'first-power-up', symptom: 'A freshly soldered board, about to be powered' },
  { treeId: 'no-gain-reduction', symptom: 'Audio passes but nothing is compressed' },
];

function setup(extra: Partial<React.ComponentProps<typeof StartScreen>> = {}) {
  const chosen: StartChoice[] = [];
  let toggles = 0;
  let quits = 0;
  const r = render(
    <StartScreen
      width={80}
      board={board}
      symptoms={symptoms}
      resumable={[]}
      corrupt={[]}
      wording="technician"
      onChoose={(c) => chosen.push(c)}
      onToggleWording={() => toggles++}
      onQuit={() => quits++}
      {...extra}
    />,
  );
  return { ...r, chosen, toggles: () => toggles, quits: () => quits };
}

describe('start screen', () => {
  it('shows the board in one line, the symptoms to choose from and the keys', () => {
    const { lastFrame } = setup();
    expect(lastFrame()).toBe(
      [
        'voltwalk · guided fault-finding',
        '',
        'Board: Demo compressor · rails +12 V, -12 V · 42 parts',
        'Wording: for a bench technician',
        '',
        'What is wrong with the module?',
        '> A freshly soldered board, about to be powered',
        '  Audio passes but nothing is compressed',
        '  Check or change part values (substituted parts, a bill of materials)',
        '  Open another board file…',
        '',
        '↑↓ choose  ·  Enter start  ·  w customer wording  ·  q quit',
      ].join('\n'),
    );
  });

  it('starts the symptom chosen with the arrow keys and Enter', async () => {
    const { stdin, chosen } = setup();
    await press(stdin, ARROW_DOWN, ENTER);
    expect(chosen).toEqual([{ type: 'symptom', treeId: 'no-gain-reduction' }]);
  });

  it('offers an unfinished walk first and reports an unreadable session file without touching it', async () => {
    const { lastFrame, stdin, chosen } = setup({
      resumable: [{ file: '/s/a.json', label: 'Audio passes but nothing is compressed (2 readings)' }],
      corrupt: [{ file: '/s/b.json', problem: 'the session file is damaged (not valid JSON)' }],
    });
    const frame = lastFrame()!;
    expect(frame).toContain('Carry on where you stopped, or pick what is wrong:');
    expect(frame).toContain('> Resume: Audio passes but nothing is compressed (2 readings)');
    expect(frame).toContain('! /s/b.json: the session file is damaged (not valid JSON) (left as it is)');
    await press(stdin, ENTER);
    expect(chosen).toEqual([{ type: 'resume', file: '/s/a.json' }]);
  });

  it('switches wording with w and quits with q', async () => {
    const { stdin, toggles, quits } = setup();
    await press(stdin, 'w', 'q');
    expect(toggles()).toBe(1);
    expect(quits()).toBe(1);
  });

  it('says it is loading until the board and trees are in', () => {
    const { lastFrame } = setup({ board: undefined, status: 'Loading the board and the diagnostic trees…' });
    expect(lastFrame()).toContain('Board: loading…');
    expect(lastFrame()).toContain('Loading the board and the diagnostic trees…');
  });
});
