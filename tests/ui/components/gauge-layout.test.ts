import { describe, expect, it } from 'vitest';
import { layoutGauge, markerLine, verdictOf } from '../../../src/ui/components/band-gauge/gauge-layout.js';

// The gauge is pure characters, so these checks are exactly what a person sees without colour.
describe('band gauge layout', () => {
  const band = { min: 4, max: 6, nominal: 5 };

  it('draws the band in brackets with the nominal marked, a third of the scale either side', () => {
    const g = layoutGauge(band, undefined, 31);
    expect(g.scale).toBe('----------[====|====]----------');
    expect(g.marker).toBeUndefined();
  });

  it('puts the marker inside the band for a healthy reading', () => {
    const g = layoutGauge(band, 5.5, 31);
    expect(g.verdict).toBe('in');
    expect(g.marker).toBeGreaterThan(g.bandFrom);
    expect(g.marker).toBeLessThan(g.bandTo);
  });

  it('widens the scale to show a reading a little out of band, left of the band when low', () => {
    const g = layoutGauge(band, 1.5, 31);
    expect(g.verdict).toBe('low');
    expect(g.offScale).toBeUndefined();
    expect(g.marker).toBeLessThan(g.bandFrom);
    expect(g.scale).toHaveLength(31);
  });

  it('pins a reading far off the scale to the edge with an arrow', () => {
    const g = layoutGauge(band, 30, 31);
    expect(g.verdict).toBe('high');
    expect(g.offScale).toBe('high');
    expect(g.marker).toBe(30);
    expect(g.scale.endsWith('>')).toBe(true);
  });

  it('keeps a zero-width band visible as three characters', () => {
    const g = layoutGauge({ min: 0, max: 0, nominal: 0 }, undefined, 21);
    expect(g.scale).toMatch(/\[[=|]\]/);
  });

  it('classifies readings on the band edges as in band', () => {
    expect(verdictOf(band, 4)).toBe('in');
    expect(verdictOf(band, 6)).toBe('in');
    expect(verdictOf(band, 3.999)).toBe('low');
  });

  it('writes the marker label on the side that has room', () => {
    expect(markerLine(2, '5 V', 20)).toBe('  ^ 5 V');
    expect(markerLine(19, '5 V', 20)).toBe('               5 V ^');
  });
});
