import React from 'react';
import { describe, expect, it } from 'vitest';
import { render } from 'ink-testing-library';
import { CautionScreen } from '../../../src/ui/screens/CautionScreen.js';
import { ENTER, ESCAPE, press } from '../keys.js';

function setup() {
  let acknowledged = 0;
  let backs = 0;
  const r = render(
    <CautionScreen
      width={80}
      title="voltwalk · Demo · No gain reduction"
      text="The next steps need the module switched on."
      hazards={['the ±12 V rails are live: one slipped probe can short a rail']}
      onAcknowledge={() => acknowledged++}
      onBack={() => backs++}
    />,
  );
  return { ...r, acknowledged: () => acknowledged, backs: () => backs };
}

describe('caution screen', () => {
  it('states the hazard in plain words and asks for a deliberate answer', () => {
    const { lastFrame } = setup();
    expect(lastFrame()).toBe(
      [
        'voltwalk · Demo · No gain reduction',
        '',
        '!! CAUTION',
        'The next steps need the module switched on.',
        '- the ±12\u00a0V rails are live: one slipped probe can short a rail',
        '',
        'Read it? Type y and Enter: _',
        '',
        'y Enter I have read this  ·  Esc back  ·  Ctrl-C quit, saved',
      ].join('\n'),
    );
  });

  it('wraps without splitting a value from its unit', () => {
    // At 10 columns a plain space would leave "- the ±12" on one line and "V rails" on the next.
    const { lastFrame } = render(
      <CautionScreen width={10} title="t" text="Power next." hazards={['the ±12 V rails']} onAcknowledge={() => {}} onBack={() => {}} />,
    );
    const lines = lastFrame()!.split('\n');
    // The item's wrapped lines hang under its text, two columns in, past the dash.
    expect(lines).toContain('  ±12\u00a0V');
    expect(lines.some((l) => l.trimEnd().endsWith('±12'))).toBe(false);
  });

  it('is not dismissed by Enter alone or by another key', async () => {
    const { stdin, lastFrame, acknowledged } = setup();
    await press(stdin, ENTER);
    expect(acknowledged()).toBe(0);
    expect(lastFrame()).toContain('! type y and press Enter once you have read the caution');
    await press(stdin, 'n', ENTER);
    expect(acknowledged()).toBe(0);
  });

  it('is acknowledged by y then Enter', async () => {
    const { stdin, acknowledged } = setup();
    await press(stdin, 'y', ENTER);
    expect(acknowledged()).toBe(1);
  });

  it('goes back with Esc', async () => {
    const { stdin, backs } = setup();
    await press(stdin, ESCAPE);
    expect(backs()).toBe(1);
  });
});
