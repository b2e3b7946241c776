import React from 'react';
import { describe, expect, it } from 'vitest';
import { render } from 'ink-testing-library';
import { SuspectsScreen } from '../../../src/ui/screens/SuspectsScreen.js';
import { SummaryScreen } from '../../../src/ui/screens/SummaryScreen.js';
import { POWERED_CAUTION, type CaseSummary } from '../../../src/ui/case/case-summary.js';
import { BACKSPACE, ENTER, press } from '../keys.js';

// Demo numbers: a made-up case on a made-up board, only to check what the screen shows.
const summary: CaseSummary = {
  board: { id: 'demo', name: 'Demo' },
  tree: { id: 'no-gr', symptom: 'No gain reduction' },
  wording: 'technician',
  finished: true,
  substitutions: [],
  readings: [],
  answers: [],
  skipped: [],
  conclusion: { title: 'The control voltage never moves', advice: 'Check the threshold network first.', parts: ['R20'] },
  suspects: [
    { rank: 1, parts: ['R20'], faults: ['R20 open'], probability: 0.62, why: 'TP5 reads 0 V where 1.1 V is expected', where: ['below the threshold knob'] },
    { rank: 2, parts: ['C7', 'R21'], faults: ['C7 short', 'R21 open'], probability: 0.3, why: 'both pull TP5 to ground', where: ['by U3'] },
  ],
  unexplained: [],
  next: { testPoint: 'TP6', label: 'detector', condition: 'hot', conditionLabel: 'DC above threshold', probe: 'red on TP6', question: 'Measure TP6' },
};

const part = (ref: string) => ({ ref, where: `where ${ref} is`, value: ref === 'R20' ? '10 kΩ ±1 %' : undefined, bands: ref === 'R20' ? ['brown', 'black', 'black', 'red', 'brown'] : undefined });

describe('suspects screen', () => {
  it('lists what was found, the ranked suspects with reasons and places, groups that cannot be split, and the next probe', () => {
    const { lastFrame } = render(
      <SuspectsScreen width={80} title="voltwalk · Demo · No gain reduction" summary={summary} part={part} onSummary={() => {}} onBack={() => {}} onNewWalk={() => {}} onQuit={() => {}} />,
    );
    expect(lastFrame()).toBe(
      [
        'voltwalk · Demo · No gain reduction',
        '',
        'FOUND: The control voltage never moves',
        'Check the threshold network first.',
        'Check first:',
        '  R20 · 10 kΩ ±1 % · bands brown-black-black-red-brown · where R20 is',
        '',
        'Suspects, most likely first (from your readings):',
        ' 1.  62 % R20 open',
        '          TP5 reads 0 V where 1.1 V is expected',
        '          R20 · 10 kΩ ±1 % · bands brown-black-black-red-brown · where R20 is',
        ' 2.  30 % C7 short or R21 open (cannot tell apart yet)',
        '          both pull TP5 to ground',
        '          C7 · where C7 is',
        '          R21 · where R21 is',
        '',
        'Next probe: TP6 detector under "DC above threshold" — red on TP6',
        '',
        's chat summary  ·  Esc back  ·  q quit  ·  n new walk  ·  r full reasons',
      ].join('\n'),
    );
  });

  it('puts the powered-work caution under a suggested probe on a powered board, whole', () => {
    for (const wording of ['technician', 'customer'] as const) {
      const powered = { ...summary, wording, next: { ...summary.next!, caution: POWERED_CAUTION[wording] } };
      const { lastFrame } = render(
        <SuspectsScreen width={80} title="t" summary={powered} part={part} onSummary={() => {}} onBack={() => {}} onNewWalk={() => {}} onQuit={() => {}} />,
      );
      const lines = lastFrame()!.split('\n');
      const next = lines.findIndex((l) => l.startsWith('Next probe: TP6'));
      // The caution wraps rather than being cut: every word of it is on screen.
      const end = lines.indexOf('', next);
      expect(lines.slice(next + 1, end).map((l) => l.trim()).join(' ').replace(/\u00a0/g, ' ')).toBe(`!! ${POWERED_CAUTION[wording]}`);
    }
  });

  it('shows a long probe placement whole, wrapped, with continuation lines at the margin', () => {
    const probe = 'black probe on the ground pad by J1 (marked GND); red probe on the unbanded end of D6, the diode right of U3';
    const long = { ...summary, next: { ...summary.next!, probe, caution: POWERED_CAUTION.technician } };
    const { lastFrame } = render(
      <SuspectsScreen width={60} title="t" summary={long} part={part} onSummary={() => {}} onBack={() => {}} onNewWalk={() => {}} onQuit={() => {}} />,
    );
    const lines = lastFrame()!.split('\n');
    const next = lines.findIndex((l) => l.startsWith('Next probe: TP6'));
    const caution = lines.findIndex((l) => l.startsWith('!! '));
    expect(lines.slice(next, caution).join(' ')).toBe(`Next probe: TP6 detector under "DC above threshold" — ${probe}`);
    for (const line of lines.slice(next, lines.indexOf('', next))) {
      expect(line.length).toBeLessThanOrEqual(60);
      expect(line.startsWith(' ')).toBe(false);
    }
  });

  it('cuts each reason to a line, and shows them whole, wrapped under the suspect, on r', async () => {
    const why = 'TP5 would read 0 V with R20 open (healthy 1.10 V); you read 0 V; TP6 would read 11.3 V with R20 open (healthy 5.90 V); you read 11.2 V';
    const long = { ...summary, suspects: [{ ...summary.suspects[0], why }] };
    const { lastFrame, stdin } = render(
      <SuspectsScreen width={60} title="t" summary={long} part={part} onSummary={() => {}} onBack={() => {}} onNewWalk={() => {}} onQuit={() => {}} />,
    );
    const cut = lastFrame()!.split('\n');
    expect(cut.find((l) => l.startsWith('          TP5'))).toMatch(/…$/);
    await press(stdin, 'r');
    const lines = lastFrame()!.split('\n');
    const first = lines.findIndex((l) => l.startsWith('          TP5'));
    const block = lines.slice(first, lines.findIndex((l) => l.startsWith('          R20 ·')));
    expect(block.length).toBeGreaterThan(1);
    expect(block.map((l) => l.slice(10)).join(' ').replace(/\u00a0/g, ' ')).toBe(why);
    for (const line of block) expect(line.length).toBeLessThanOrEqual(60);
  });

  it('on a short terminal shows two suspects with one place each and the parts to check on one line', () => {
    const three = { ...summary, suspects: [...summary.suspects, { rank: 3, parts: ['R9'], faults: ['R9 open'], probability: 0.05, why: 'w', where: [] }] };
    const { lastFrame } = render(
      <SuspectsScreen width={80} rows={24} title="t" summary={three} part={part} onSummary={() => {}} onBack={() => {}} onNewWalk={() => {}} onQuit={() => {}} />,
    );
    const lines = lastFrame()!.split('\n');
    expect(lines).toContain('Check first: R20');
    expect(lines.filter((l) => /^ \d\. /.test(l))).toHaveLength(2);
    expect(lines).toContain('          C7 · where C7 is');
    expect(lines).not.toContain('          R21 · where R21 is');
    expect(lines).toContain('    … 1 less likely (in the case summary)');
    expect(lines.length).toBeLessThanOrEqual(24);
  });

  it('takes a reading at the suggested probe on p, refuses a typo with the accepted forms, and shows why one was not recorded', async () => {
    const taken: string[] = [];
    const probe = {
      check: (text: string) => (/^[\d.]+$/.test(text) ? { ok: true as const, value: Number(text) } : { ok: false as const, hint: 'a voltage reading such as 4.2 or 420mV' }),
      take: (text: string) => {
        taken.push(text);
        return taken.length > 1 ? 'not recorded: this probe needs the module powered' : undefined;
      },
    };
    const { lastFrame, stdin } = render(
      <SuspectsScreen width={100} title="t" summary={summary} part={part} probe={probe} onSummary={() => {}} onBack={() => {}} onNewWalk={() => {}} onQuit={() => {}} />,
    );
    expect(lastFrame()).toContain('p add reading');
    await press(stdin, 'p');
    expect(lastFrame()).toContain('Reading at TP6:');
    expect(lastFrame()).toContain('Enter record  ·  Esc cancel');
    await press(stdin, '4.2x', ENTER);
    expect(lastFrame()).toContain('a voltage reading such as 4.2 or 420mV');
    expect(taken).toEqual([]);
    await press(stdin, BACKSPACE, ENTER);
    expect(taken).toEqual(['4.2']);
    expect(lastFrame()).not.toContain('Reading at TP6:');
    await press(stdin, 'p', '5', ENTER);
    expect(taken).toEqual(['4.2', '5']);
    expect(lastFrame()).toContain('! not recorded: this probe needs the module powered');
  });

  it('offers no probe when none is suggested', () => {
    const { lastFrame } = render(
      <SuspectsScreen width={100} title="t" summary={{ ...summary, next: undefined }} part={part} probe={{ check: () => ({ ok: true, value: 1 }), take: () => undefined }} onSummary={() => {}} onBack={() => {}} onNewWalk={() => {}} onQuit={() => {}} />,
    );
    expect(lastFrame()).not.toContain('add reading');
  });

  it('says first, and in words, when a reading fits no modelled fault', () => {
    const odd = { ...summary, unexplained: ['TP1 = 11.2 V fits no single modelled fault.'] };
    const { lastFrame } = render(
      <SuspectsScreen width={80} title="t" summary={odd} part={part} onSummary={() => {}} onBack={() => {}} onNewWalk={() => {}} onQuit={() => {}} />,
    );
    const lines = lastFrame()!.split('\n');
    const note = lines.indexOf('! TP1 = 11.2\u00a0V fits no single modelled fault.');
    expect(note).toBeGreaterThan(0);
    const suspects = lines.indexOf('Suspects, most likely first (from your readings):');
    expect(note).toBeLessThan(suspects);
    expect(lines[suspects - 1]).toBe('');
  });

  it('writes the case summary on s', async () => {
    let asked = 0;
    const { stdin } = render(<SuspectsScreen width={80} title="t" summary={summary} part={part} onSummary={() => asked++} onBack={() => {}} onNewWalk={() => {}} onQuit={() => {}} />);
    await press(stdin, 's');
    expect(asked).toBe(1);
  });
});

describe('summary screen', () => {
  it('shows the text as it will be pasted and where it was written', async () => {
    let back = 0;
    const { lastFrame, stdin } = render(<SummaryScreen width={80} text={'### case\n- TP1 ok\n'} file="/tmp/x.md" onBack={() => back++} onQuit={() => {}} />);
    expect(lastFrame()).toBe(['Case summary — copy it into the chat', '', 'Written to /tmp/x.md', '', '### case', '- TP1 ok', '', 'Enter back  ·  q quit'].join('\n'));
    await press(stdin, ENTER);
    expect(back).toBe(1);
  });
});
