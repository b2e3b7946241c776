import { describe, expect, it } from 'vitest';
import { keepUnitsTogether } from '../../../src/ui/components/prose/keep-units.js';
import { dropBreakSpace } from '../../../src/ui/components/prose/break-space.js';

const NBSP = '\u00a0';

// Keeping a number and its unit symbol on one line is common practice in typesetting SI values;
// the unit symbols checked are the SI ones with their prefixes (and °C, %, dBu as the trade writes them).
describe('a value stays on one line with its unit', () => {
  it('joins a number to the unit symbol after it, prefixes included', () => {
    expect(keepUnitsTogether('the ±12 V rails')).toBe(`the ±12${NBSP}V rails`);
    expect(keepUnitsTogether('set 1 kHz at 775 mV, then 4.7 kΩ')).toBe(`set 1${NBSP}kHz at 775${NBSP}mV, then 4.7${NBSP}kΩ`);
    expect(keepUnitsTogether('47 µF, 20 dBu, 25 °C, 10 %, 5 ms')).toBe(`47${NBSP}µF, 20${NBSP}dBu, 25${NBSP}°C, 10${NBSP}%, 5${NBSP}ms`);
  });

  it('leaves words that only start like a unit, and numbers followed by words', () => {
    for (const text of ['pin 8 Vcc', 'wait 2 seconds', '3 mm from the edge', 'U1 pin 4 to ground', 'the 2 Vs']) {
      expect(keepUnitsTogether(text)).toBe(text);
    }
  });
});

describe('a wrapped paragraph starts each line at its margin', () => {
  it('drops the one space the terminal kept at a break, after any colour codes, never on the first line', () => {
    expect(dropBreakSpace(' indented on purpose', 0)).toBe(' indented on purpose');
    expect(dropBreakSpace(' with audio.', 1)).toBe('with audio.');
    expect(dropBreakSpace('\u001b[33m with audio.', 2)).toBe('\u001b[33mwith audio.');
    expect(dropBreakSpace('  two spaces', 1)).toBe(' two spaces');
    expect(dropBreakSpace('no space', 3)).toBe('no space');
  });
});
