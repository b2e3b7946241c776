import { describe, expect, it } from 'vitest';
import { parseBomCsv, splitDesignators } from '../../../src/ui/bom/bom-csv.js';

// Header names as EDA tools commonly export them (common practice): "Designator"/"Comment" in one
// family, "Reference"/"Value" in another; grouped designators in one quoted cell.
describe('bill of materials CSV', () => {
  it('finds the columns by header name in any order and splits quoted designator groups', () => {
    const csv = ['"Comment","Designator","Footprint","Quantity"', '"10k","R1, R2","0805",2', '"4k7","R7","0805",1'].join('\n');
    const { rows, problems } = parseBomCsv(csv, 'bom.csv');
    expect(problems).toEqual([]);
    expect(rows).toEqual([
      { ref: 'R1', value: '10k', line: 2 },
      { ref: 'R2', value: '10k', line: 2 },
      { ref: 'R7', value: '4k7', line: 3 },
    ]);
  });

  it('reads semicolon-separated files whose values use a decimal comma', () => {
    const csv = 'Reference;Value;Qty\nC3;"2,2u";1\n';
    expect(parseBomCsv(csv, 'bom.csv').rows).toEqual([{ ref: 'C3', value: '2,2u', line: 2 }]);
  });

  it('keeps doubled quotes inside a quoted cell as one quote', () => {
    const csv = 'Ref,Value\nR9,"1k ""matched"""\n';
    expect(parseBomCsv(csv, 'bom.csv').rows[0].value).toBe('1k "matched"');
  });

  it('reports a file without the two columns in one line naming what is accepted', () => {
    const { rows, problems } = parseBomCsv('Part,Qty\nR1,2\n', 'bom.csv');
    expect(rows).toEqual([]);
    expect(problems).toHaveLength(1);
    expect(problems[0].message).toContain('designator and a value column');
    expect(problems[0].accepted).toContain('Designator');
  });

  it('reports a row without a value by line', () => {
    const { problems } = parseBomCsv('Designator,Value\nR1,\n', 'bom.csv');
    expect(problems[0].path).toBe('line 2');
  });

  it('expands designator ranges', () => {
    expect(splitDesignators('R3-R5 C1')).toEqual(['R3', 'R4', 'R5', 'C1']);
  });
});
