import React from 'react';
import { describe, expect, it } from 'vitest';
import { render } from 'ink-testing-library';
import { TextField } from '../../../src/ui/components/text-field/TextField.js';
import { textFieldReducer } from '../../../src/ui/components/text-field/use-text-field-state.js';
import type { Check } from '../../../src/ui/components/text-field/use-text-field.js';
import { BACKSPACE, ENTER, press } from '../keys.js';

const digits = (text: string): Check<number> => (/^\d+$/.test(text) ? { ok: true, value: Number(text) } : { ok: false, hint: 'digits only, e.g. 42' });

describe('text field state', () => {
  it('types, erases one character (not one byte) and drops control characters', () => {
    let s = textFieldReducer({ value: '' }, { type: 'insert', text: '4k7\n' });
    expect(s.value).toBe('4k7');
    s = textFieldReducer({ value: '10kΩ' }, { type: 'erase' });
    expect(s.value).toBe('10k');
  });

  it('forgets a refusal once the person types again', () => {
    const refused = textFieldReducer({ value: 'x' }, { type: 'refuse', hint: 'no' });
    expect(refused.refusal).toBe('no');
    expect(textFieldReducer(refused, { type: 'erase' }).refusal).toBeUndefined();
  });
});

describe('TextField', () => {
  it('refuses text its check rejects with a one-line hint, then accepts a correction', async () => {
    const got: number[] = [];
    const { stdin, lastFrame } = render(<TextField label="Count:" check={digits} onSubmit={(v) => got.push(v)} />);
    await press(stdin, '4', 'x', ENTER);
    expect(lastFrame()).toBe('Count: 4x_\n! digits only, e.g. 42');
    expect(got).toEqual([]);
    await press(stdin, BACKSPACE, '2', ENTER);
    expect(got).toEqual([42]);
    expect(lastFrame()).toBe('Count: _');
  });

  it('shows the hint while typing in live mode', async () => {
    const { stdin, lastFrame } = render(<TextField label="Count:" live check={digits} onSubmit={() => {}} />);
    await press(stdin, 'a');
    expect(lastFrame()).toBe('Count: a_\n! digits only, e.g. 42');
  });

  it('ignores keys while inactive', async () => {
    const { stdin, lastFrame } = render(<TextField label="Count:" isActive={false} check={digits} onSubmit={() => {}} />);
    await press(stdin, '7');
    expect(lastFrame()).toBe('Count:');
  });
});

describe('TextField, fast input', () => {
  it('submits text pasted together with its Enter in one write', async () => {
    const got: number[] = [];
    const { stdin } = render(<TextField label="Count:" check={digits} onSubmit={(v) => got.push(v)} />);
    await press(stdin, '42\r');
    expect(got).toEqual([42]);
  });
});
