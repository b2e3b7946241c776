import { describe, expect, it } from 'vitest';
import { layoutStageMap, rowText } from '../../../src/ui/components/stage-map/stage-map-layout.js';

const stages = [
  { id: 'power', label: 'Power entry' },
  { id: 'input', label: 'Input' },
  { id: 'vca', label: 'VCA' },
  { id: 'detector', label: 'Detector' },
];

describe('stage map layout', () => {
  it('shows the chain in one row with the stage under test bracketed', () => {
    const rows = layoutStageMap(stages, 'vca', 80);
    expect(rows.map(rowText)).toEqual(['Power entry > Input > [VCA] > Detector']);
  });

  it('wraps a long chain onto a second row rather than past the edge', () => {
    const rows = layoutStageMap(stages, 'input', 30);
    expect(rows.length).toBe(2);
    for (const row of rows) expect(rowText(row).length).toBeLessThanOrEqual(30);
    expect(rows.flat().filter((c) => c.current).map((c) => c.text)).toEqual(['[Input]']);
  });

  it('shortens labels with ~ when two rows are not enough', () => {
    const many = Array.from({ length: 10 }, (_, i) => ({ id: `s${i}`, label: `Stage number ${i}` }));
    const rows = layoutStageMap(many, 's3', 40);
    expect(rows.length).toBeLessThanOrEqual(2);
    expect(rows.map(rowText).join(' ')).toContain('~');
  });
});
