import { describe, expect, it } from 'vitest';
import { fitHints } from '../../../src/ui/components/key-hints/KeyHints.js';

const hints = [
  { key: 's', does: 'chat summary' },
  { key: 'p', does: 'add reading' },
  { key: 'Esc', does: 'back' },
  { key: 'q', does: 'quit' },
  { key: 'n', does: 'new walk' },
  { key: 'r', does: 'full reasons' },
];

describe('the key-hint line', () => {
  it('spaces the hints out when they fit', () => {
    expect(fitHints(hints.slice(0, 3), 80)).toBe('s chat summary  ·  p add reading  ·  Esc back');
  });

  it('draws them closer before it drops any, then drops from the end', () => {
    // 90 columns spaced out, 80 close together: every hint still shows on an 80-column terminal.
    expect(fitHints(hints, 80)).toBe('s chat summary · p add reading · Esc back · q quit · n new walk · r full reasons');
    expect(fitHints(hints, 60)).toBe('s chat summary · p add reading · Esc back · q quit');
  });
});
