export interface BoardLine {
  name: string;
  rails: string[];
  partCount: number;
  file: string;
}

/** The board in one line: name, rails, part count. */
export function boardLineText(b: BoardLine): string {
  return `${b.name} · rails ${b.rails.join(', ')} · ${b.partCount} parts`;
}
