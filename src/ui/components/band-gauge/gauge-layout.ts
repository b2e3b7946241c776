/**
 * Lays out the horizontal band gauge as plain characters, so it reads the same with or without
 * colour: `-` is the scale, `[` and `]` the healthy band's edges, `=` inside the band, `|` the
 * nominal value, `:` the meter's own accuracy beyond each edge (a reading there still counts as in
 * band), and a `^` on the line below where the reading fell. A reading far outside the scale is
 * pinned to the edge and shown as `<` or `>` (off the scale).
 */
export interface GaugeBand {
  min: number;
  max: number;
  nominal: number;
}

export type Verdict = 'in' | 'low' | 'high';

/** How far beyond each band edge a reading is still in band (the meter's accuracy), in the band's unit. */
export interface GaugeAllowance {
  below: number;
  above: number;
}

export interface GaugeLayout {
  /** The scale line, exactly `width` characters. */
  scale: string;
  /** Column of the band's edges and of the reading's marker within the scale. */
  bandFrom: number;
  bandTo: number;
  marker?: number;
  /** The reading pinned to an edge because it lies far off the scale. */
  offScale?: 'low' | 'high';
  verdict?: Verdict;
}

export function verdictOf(band: GaugeBand, reading: number): Verdict {
  if (reading < band.min) return 'low';
  if (reading > band.max) return 'high';
  return 'in';
}

/** How many band widths of scale to show either side of the band before pinning a reading. */
const MARGIN_SPANS = 1;
const MAX_SPANS = 4;

export function layoutGauge(band: GaugeBand, reading: number | undefined, width: number, allowance?: GaugeAllowance): GaugeLayout {
  const w = Math.max(12, Math.floor(width));
  const span = bandSpan(band);
  const below = allowance?.below ?? 0;
  const above = allowance?.above ?? 0;
  // The margin takes in the allowance, with room beyond it, however wide the allowance is.
  let lo = band.min - Math.max(MARGIN_SPANS * span, 1.5 * below);
  let hi = band.max + Math.max(MARGIN_SPANS * span, 1.5 * above);
  let offScale: 'low' | 'high' | undefined;
  if (reading !== undefined && Number.isFinite(reading)) {
    // Widen the scale to take the reading in, up to a limit; beyond it the reading is pinned.
    if (reading < lo) lo = Math.max(reading - 0.1 * span, band.min - MAX_SPANS * span);
    if (reading > hi) hi = Math.min(reading + 0.1 * span, band.max + MAX_SPANS * span);
    if (reading < lo) offScale = 'low';
    if (reading > hi) offScale = 'high';
  }
  const col = (v: number) => Math.min(w - 1, Math.max(0, Math.round(((v - lo) / (hi - lo)) * (w - 1))));
  let bandFrom = col(band.min);
  let bandTo = col(band.max);
  // A band narrower than three columns could not show both edges and its inside.
  if (bandTo - bandFrom < 2) {
    const mid = Math.round((bandFrom + bandTo) / 2);
    bandFrom = Math.max(0, mid - 1);
    bandTo = Math.min(w - 1, bandFrom + 2);
  }
  const slackFrom = below > 0 ? Math.min(col(band.min - below), bandFrom - 1) : bandFrom;
  const slackTo = above > 0 ? Math.max(col(band.max + above), bandTo + 1) : bandTo;
  const cells: string[] = Array.from({ length: w }, (_, i) =>
    i > bandFrom && i < bandTo ? '=' : (i >= slackFrom && i < bandFrom) || (i > bandTo && i <= slackTo) ? ':' : '-',
  );
  cells[bandFrom] = '[';
  cells[bandTo] = ']';
  const nominalCol = col(band.nominal);
  if (nominalCol > bandFrom && nominalCol < bandTo) cells[nominalCol] = '|';
  let marker: number | undefined;
  if (reading !== undefined && Number.isFinite(reading)) {
    marker = offScale === 'low' ? 0 : offScale === 'high' ? w - 1 : col(reading);
    if (offScale === 'low') cells[0] = '<';
    if (offScale === 'high') cells[w - 1] = '>';
  }
  return {
    scale: cells.join(''),
    bandFrom,
    bandTo,
    marker,
    offScale,
    verdict: reading === undefined || !Number.isFinite(reading) ? undefined : verdictOf(band, reading),
  };
}

/** The line under the scale: a `^` at the marker, with its label on whichever side has room. */
export function markerLine(marker: number, label: string, width: number): string {
  const w = Math.max(12, Math.floor(width));
  const right = `^ ${label}`;
  if (marker + right.length <= w) return ' '.repeat(marker) + right;
  const left = `${label} ^`;
  return ' '.repeat(Math.max(0, marker - left.length + 1)) + left;
}

function bandSpan(band: GaugeBand): number {
  const span = band.max - band.min;
  if (span > 0) return span;
  // A zero-width band (an exact expectation) still needs a visible scale around it.
  return Math.max(Math.abs(band.nominal) * 0.1, 1e-3);
}
