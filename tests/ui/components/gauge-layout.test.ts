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

  it("draws the meter's accuracy beyond each edge as ':', and a reading there inside it", () => {
    // Band 4 … 6 with 0.5 either side: the scale runs 2 … 8 (a band width beyond each edge).
    const g = layoutGauge(band, 3.7, 31, { below: 0.5, above: 0.5 });
    expect(g.scale).toMatch(/^-+:+\[=+\|=+\]:+-+$/);
    const colons = g.scale.match(/:+(?=\[)/)![0].length;
    // 0.5 of a 6-wide scale over 30 columns: two or three columns.
    expect(colons).toBeGreaterThanOrEqual(2);
    expect(colons).toBeLessThanOrEqual(3);
    expect(g.marker).toBeLessThan(g.bandFrom);
    expect(g.scale[g.marker!]).toBe(':');
    // Without an allowance the same scale has none.
    expect(layoutGauge(band, 3.7, 31).scale).not.toContain(':');
  });

  it('widens the scale to show an allowance wider than the band', () => {
    const g = layoutGauge({ min: 11.74, max: 11.8, nominal: 11.77 }, 11.7, 40, { below: 0.079, above: 0.079 });
    expect(g.scale).toHaveLength(40);
    expect(g.scale.startsWith('-')).toBe(true);
    expect(g.scale.endsWith('-')).toBe(true);
    expect(g.scale[g.marker!]).toBe(':');
  });

  it('writes the marker label on the side that has room', () => {
    expect(markerLine(2, '5 V', 20)).toBe('  ^ 5 V');
    expect(markerLine(19, '5 V', 20)).toBe('               5 V ^');
  });
});
