import type { Board } from '../schemas/board.js';
import { DIP_PIN_COUNT } from './pins.js';
import { findPart } from './lookup.js';

/**
 * Pins that sit next to each other on a part, where a solder bridge can join them. A dual-in-line
 * package numbers pins 1..n/2 down one side and n/2+1..n back up the other, so adjacent numbers on
 * the same side are neighbours (common practice; SOIC shares the layout). The file's own
 * `neighbours` are added, each pair once.
 */
export function neighbourPins(board: Board, ref: string): Array<[string, string]> {
  const part = findPart(board, ref);
  const pairs: Array<[string, string]> = [];
  const seen = new Set<string>();
  const add = (a: string, b: string) => {
    const key = [a, b].sort().join('\0');
    if (a === b || seen.has(key)) return;
    seen.add(key);
    pairs.push([a, b]);
  };
  const n = DIP_PIN_COUNT[part.kind];
  if (n !== undefined) {
    const half = n / 2;
    for (let i = 1; i < half; i++) add(String(i), String(i + 1));
    for (let i = half + 1; i < n; i++) add(String(i), String(i + 1));
  }
  for (const [a, b] of part.neighbours ?? []) add(a, b);
  return pairs;
}
