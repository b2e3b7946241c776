import { describe, expect, it } from 'vitest';
import { toneColour } from '../../../src/ui/theme/tones.js';
import { colourAllowed, memoryIo } from '../../../src/cli/io.js';

describe('colour', () => {
  it('gives ink no colour at all when colour is off, so NO_COLOR and TERM=dumb get plain text', () => {
    expect(toneColour('bad', false)).toBeUndefined();
    expect(toneColour('bad', true)).toBe('red');
  });

  it('is off for NO_COLOR (any value) and TERM=dumb even on a terminal (no-color.org convention)', () => {
    expect(colourAllowed(memoryIo({ isTTY: true, env: {} }))).toBe(true);
    expect(colourAllowed(memoryIo({ isTTY: true, env: { NO_COLOR: '' } }))).toBe(false);
    expect(colourAllowed(memoryIo({ isTTY: true, env: { TERM: 'dumb' } }))).toBe(false);
  });
});
