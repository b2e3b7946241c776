/**
 * Lays out the module's signal chain as a row of labelled blocks, `Input > VCA > Detector`, with
 * the stage under test in brackets — `[VCA]` — so the highlight reads without colour. Rows wrap at
 * the terminal width; labels are shortened (ending in `~`) only when the chain would need more than
 * `maxRows` rows.
 */
export interface StageBlock {
  id: string;
  label: string;
}

export interface StageCell {
  id: string;
  text: string;
  current: boolean;
}

const SEPARATOR = ' > ';

export function layoutStageMap(stages: StageBlock[], currentId: string | undefined, width: number, maxRows = 2): StageCell[][] {
  const w = Math.max(20, Math.floor(width));
  let limit = Math.max(...stages.map((s) => s.label.length), 1);
  for (;;) {
    const rows = wrap(cells(stages, currentId, limit), w);
    if (rows.length <= maxRows || limit <= 4) return rows;
    limit -= 1;
  }
}

export function rowText(row: StageCell[]): string {
  return row.map((c) => c.text).join(SEPARATOR);
}

function cells(stages: StageBlock[], currentId: string | undefined, limit: number): StageCell[] {
  return stages.map((s) => {
    const label = s.label.length > limit ? `${s.label.slice(0, limit - 1)}~` : s.label;
    const current = s.id === currentId;
    return { id: s.id, text: current ? `[${label}]` : label, current };
  });
}

function wrap(all: StageCell[], width: number): StageCell[][] {
  const rows: StageCell[][] = [];
  let row: StageCell[] = [];
  let used = 0;
  for (const cell of all) {
    const extra = row.length === 0 ? cell.text.length : SEPARATOR.length + cell.text.length;
    if (row.length > 0 && used + extra > width) {
      rows.push(row);
      row = [];
      used = 0;
    }
    used += row.length === 0 ? cell.text.length : SEPARATOR.length + cell.text.length;
    row.push(cell);
  }
  if (row.length > 0) rows.push(row);
  return rows;
}
