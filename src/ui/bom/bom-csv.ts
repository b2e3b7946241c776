import { parse } from 'csv-parse/sync';
import type { Problem } from '../../errors.js';

/**
 * Reads a bill of materials exported by an EDA tool as CSV: finds the designator and value columns
 * by their header names, whatever their order, and splits grouped designators ("R1, R2, R5",
 * "R1 R2", "R3-R5"). Parsing uses csv-parse because real exports quote fields that hold the
 * delimiter ("R1, R2"), double quotes inside quotes, break lines inside quoted cells and use `;` or
 * tab where a decimal comma is usual — rules a split on commas gets wrong.
 */
export interface BomRow {
  ref: string;
  value: string;
  /** 1-based line of the row in the file, for error messages. */
  line: number;
}

const DESIGNATOR_HEADERS = ['designator', 'designators', 'reference', 'references', 'ref', 'refs', 'refdes', 'ref des', 'part reference', 'parts'];
const VALUE_HEADERS = ['value', 'val', 'comment', 'part value'];

export const BOM_ACCEPTED =
  'CSV with a header row naming a designator column (Designator, Reference, Ref, RefDes) and a value column (Value, Comment), separated by , ; or tab';

export function parseBomCsv(text: string, file: string): { rows: BomRow[]; problems: Problem[] } {
  let records: string[][];
  try {
    records = parse(text.replace(/^\uFEFF/, ''), {
      delimiter: [',', ';', '\t'],
      relax_column_count: true,
      skip_empty_lines: true,
      trim: true,
      info: false,
    }) as string[][];
  } catch (error) {
    const message = error instanceof Error ? error.message.split('\n')[0] : String(error);
    return { rows: [], problems: [{ code: 'bom.csv', file, message: `not readable as CSV: ${message}`, accepted: BOM_ACCEPTED }] };
  }
  const headerIndex = records.findIndex((r) => findColumn(r, DESIGNATOR_HEADERS) >= 0 && findColumn(r, VALUE_HEADERS) >= 0);
  if (headerIndex < 0) {
    return {
      rows: [],
      problems: [{ code: 'bom.header', file, path: 'line 1', message: 'no header row with both a designator and a value column', accepted: BOM_ACCEPTED }],
    };
  }
  const header = records[headerIndex];
  const refCol = findColumn(header, DESIGNATOR_HEADERS);
  const valueCol = findColumn(header, VALUE_HEADERS);
  const rows: BomRow[] = [];
  const problems: Problem[] = [];
  records.slice(headerIndex + 1).forEach((record, i) => {
    // Line numbers count records, which is exact unless a quoted cell spans lines.
    const line = headerIndex + i + 2;
    const refs = (record[refCol] ?? '').trim();
    const value = (record[valueCol] ?? '').trim();
    if (!refs && !value) return;
    if (!refs || !value) {
      problems.push({ code: 'bom.row', file, path: `line ${line}`, message: !refs ? 'a value without a designator' : `no value for ${refs}`, accepted: 'a designator and a value on every row' });
      return;
    }
    for (const ref of splitDesignators(refs)) rows.push({ ref, value, line });
  });
  return { rows, problems };
}

function findColumn(record: string[], names: string[]): number {
  return record.findIndex((cell) => names.includes(cell.trim().toLowerCase()));
}

/** "R1, R2 R5;R7" and ranges "R3-R5" become a list of designators. */
export function splitDesignators(cell: string): string[] {
  const out: string[] = [];
  for (const token of cell.split(/[\s,;]+/).filter(Boolean)) {
    const range = /^([A-Z]+)(\d+)-(?:([A-Z]+))?(\d+)$/i.exec(token);
    if (range && (!range[3] || range[3].toUpperCase() === range[1].toUpperCase()) && Number(range[4]) >= Number(range[2]) && Number(range[4]) - Number(range[2]) < 200) {
      for (let n = Number(range[2]); n <= Number(range[4]); n++) out.push(`${range[1].toUpperCase()}${n}`);
    } else out.push(token.toUpperCase());
  }
  return out;
}
