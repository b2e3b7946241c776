import type { Board } from '../../schemas/board.js';
import { partTolerance, partValue } from '../../board/values.js';
import { bandsFor, formatValue } from '../../units/index.js';

/** A part as a person looks for it on the board: where it is, its value, and the colours to expect. */
export interface PartInfo {
  ref: string;
  label?: string;
  kind: string;
  where: string;
  /** "4.7 kΩ ±1 %", or the model name for a semiconductor. */
  value?: string;
  /** Colour bands, resistors only. */
  bands?: string[];
  orientation?: string;
}

const UNIT_OF_KIND: Record<string, string> = { resistor: 'Ω', pot: 'Ω', capacitor: 'F', electrolytic: 'F', inductor: 'H' };

export function describePart(board: Board, ref: string): PartInfo {
  const part = board.parts.find((p) => p.ref === ref);
  if (!part) return { ref, kind: 'unknown', where: 'not on this board' };
  const unit = UNIT_OF_KIND[part.kind];
  let value: string | undefined = part.model;
  let bands: string[] | undefined;
  if (unit && part.value !== undefined) {
    const si = partValue(board, ref);
    const tol = partTolerance(board, ref);
    value = `${formatValue(si, unit)}${tol ? ` ±${Number((tol * 100).toPrecision(2))} %` : ''}`;
    if (part.kind === 'resistor') bands = bandsFor(si, tol);
  }
  return { ref, label: part.label, kind: part.kind, where: part.where, value, bands, orientation: part.orientation };
}

export type PartLineInfo = Pick<PartInfo, 'ref' | 'label' | 'where' | 'value' | 'bands' | 'orientation'>;

/** One line: "R12 (Threshold) · 4.7 kΩ ±1 % · bands yellow-violet-black-brown-brown · left of U2". */
export function partLine(p: PartLineInfo): string {
  const name = p.label ? `${p.ref} (${p.label})` : p.ref;
  return [name, p.value, p.bands && p.bands.length > 0 ? `bands ${p.bands.join('-')}` : undefined, p.where].filter(Boolean).join(' · ');
}
