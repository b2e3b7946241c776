import React from 'react';
import { describe, expect, it } from 'vitest';
import { render } from 'ink-testing-library';
import { MeasureScreen } from '../../../src/ui/screens/MeasureScreen.js';
import { ReadingResultScreen } from '../../../src/ui/screens/ReadingResultScreen.js';
import type { Check } from '../../../src/ui/components/text-field/use-text-field.js';
import { hintOf } from '../../../src/ui/components/text-field/hint-of.js';
import { formatValue, parseReading } from '../../../src/units/index.js';
import { describeBand } from '../../../src/engine/step-view.js';
import { meterAllowance } from '../../../src/engine/outcome.js';
import { BACKSPACE, ENTER, TAB, press } from '../keys.js';

const check = (text: string): Check<number> => {
  try {
    return { ok: true, value: parseReading(text, 'voltage', 'reading at TP3') };
  } catch (error) {
    return { ok: false, hint: hintOf(error) };
  }
};
const format = (v: number, unit: string, figures?: number) => formatValue(v, unit, figures);
const raw = { nominal: 4.8, min: 4.65, max: 4.95, unit: 'V' as const };
const band = { ...raw, text: describeBand(raw) };

function setup() {
  const readings: Array<[number, string]> = [];
  let skips = 0;
  const r = render(
    <MeasureScreen
      width={80}
      title="voltwalk · Demo · No gain reduction"
      text="Measure the VCA control voltage at rest."
      testPoint={{ id: 'TP3', label: 'VCA control', probe: 'black on the ground loop, red on the TP3 pad', quantity: 'voltage' }}
      condition={{ id: 'rest', label: 'At rest', instructions: 'no input, knobs at noon', powered: true }}
      band={band}
      check={check}
      onReading={(v, t) => readings.push([v, t])}
      onSkip={() => skips++}
      onBack={() => {}}
    />,
  );
  return { ...r, readings, skips: () => skips };
}

describe('measure screen', () => {
  it('says what to set up, where the probes go and the band expected', () => {
    const { lastFrame } = setup();
    expect(lastFrame()).toBe(
      [
        'voltwalk · Demo · No gain reduction',
        '',
        'MEASURE TP3 · VCA control',
        'Measure the VCA control voltage at rest.',
        'Set-up: At rest (powered)',
        'Probes: black on the ground loop, red on the TP3 pad',
        'Expect: 4.65 V to 4.95 V (nominal 4.80 V)',
        '',
        'Reading (V): e.g. 4.2 or 420mV_',
        '',
        'Enter record  ·  Esc back  ·  Tab skip (cannot measure)  ·  Ctrl-C quit, saved',
      ].join('\n'),
    );
  });

  // Reading forms from the units contract: plain, with unit, with multiplier, decimal comma.
  it.each([
    ['4.2', 4.2],
    ['4.2 V', 4.2],
    ['420mV', 0.42],
    ['4,2', 4.2],
  ])('takes %s as %d volts', async (typed, volts) => {
    const { stdin, readings } = setup();
    await press(stdin, typed, ENTER);
    expect(readings).toEqual([[volts, typed]]);
  });

  it('refuses a typo with a one-line hint and keeps the text for correcting', async () => {
    const { stdin, lastFrame, readings } = setup();
    await press(stdin, '4.2x', ENTER);
    expect(readings).toEqual([]);
    const lines = lastFrame()!.split('\n');
    expect(lines).toContain('Reading (V): 4.2x_');
    const hint = lines.find((l) => l.startsWith('! '));
    expect(hint).toBe('! unrecognised characters (accepted: a voltage reading such as 4.2 or 420mV)');
    await press(stdin, BACKSPACE, ENTER);
    expect(readings).toEqual([[4.2, '4.2']]);
  });

  it('skips with Tab when the reading cannot be taken', async () => {
    const { stdin, skips } = setup();
    await press(stdin, TAB);
    expect(skips()).toBe(1);
  });
});

describe('reading result', () => {
  it('shows the band and where a high reading fell, in characters', () => {
    const { lastFrame } = render(
      <ReadingResultScreen
        width={60}
        title="t"
        result={{ testPoint: 'TP3', label: 'VCA control', value: 5.1, band, outcome: 'high' }}
        format={format}
        onContinue={() => {}}
      />,
    );
    const lines = lastFrame()!.split('\n');
    expect(lines[2]).toBe('TP3 · VCA control: 5.1 V HIGH');
    expect(lines[3]).toBe('The reading is above the healthy band. Saved.');
    expect(lines[5]).toBe('healthy band 4.65 V to 4.95 V, nominal 4.80 V');
    const scale = lines[6];
    const marker = lines[7];
    expect(scale).toMatch(/^-+\[=+\|=+\]-+$/);
    // The marker sits right of the band's closing bracket: a high reading.
    expect(marker.indexOf('^')).toBeGreaterThan(scale.indexOf(']'));
    expect(marker).toContain('5.1 V HIGH');
  });

  it('a reading in band only by the meter accuracy says so, beside the allowance drawn with :', () => {
    // 4.65 V on the 20 V range: 0.5 % of 4.65 V + 2 counts of 10 mV = 43.25 mV below the band.
    const allowance = meterAllowance(band);
    const { lastFrame } = render(
      <ReadingResultScreen width={60} title="t" result={{ testPoint: 'TP3', label: 'VCA control', value: 4.62, band, outcome: 'in-band', allowance }} format={format} onContinue={() => {}} />,
    );
    const lines = lastFrame()!.split('\n');
    expect(lines[2]).toBe('TP3 · VCA control: 4.62 V in band');
    expect(lines[6]).toMatch(/^-+:+\[=+\|=+\]:+-+$/);
    expect(lines[6][lines[7].indexOf('^')]).toBe(':');
    expect(lines[7]).toContain('4.62 V in band (meter accuracy)');
    expect(lines[8]).toMatch(/^: = meter accuracy \(±43\.3 mV below, ±44\.[78] mV above\)$/);
  });

  it('heads the result with the reading to four figures, as the meter showed it', () => {
    const { lastFrame } = render(
      <ReadingResultScreen width={60} title="t" result={{ testPoint: 'TP1', label: 'rail', value: 11.77, band: { ...band, min: 11.74, max: 11.8, nominal: 11.77 }, outcome: 'in-band' }} format={format} onContinue={() => {}} />,
    );
    expect(lastFrame()!.split('\n')[2]).toBe('TP1 · rail: 11.77 V in band');
  });

  it('moves on with Enter', async () => {
    let on = 0;
    const { stdin } = render(<ReadingResultScreen width={60} title="t" result={{ testPoint: 'TP3', label: 'x', value: 4.8, band, outcome: 'in-band' }} format={format} onContinue={() => on++} />);
    await press(stdin, ENTER);
    expect(on).toBe(1);
  });
});
