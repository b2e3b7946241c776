import React from 'react';
import { Box, Text } from 'ink';
import { useColour } from '../../theme/colour-context.js';
import { toneColour } from '../../theme/tones.js';
import { bandFigures, formatBand } from '../../../units/index.js';
import { layoutGauge, markerLine, type GaugeAllowance, type GaugeBand, type Verdict } from './gauge-layout.js';

interface Props {
  band: GaugeBand;
  reading?: number;
  width: number;
  /** Formats a value with its unit, e.g. "4.80 V", to the given significant figures (default 3). */
  format: (value: number, figures?: number) => string;
  /** The band's unit: given, the header shows its edges and nominal lined up (11.74 V to 11.80 V). */
  unit?: 'V' | 'Ω';
  /**
   * The verdict the engine reached, when it differs from a plain comparison with the band edges:
   * the engine allows for the meter's own accuracy, so a reading a hair outside is still in band.
   */
  verdict?: Verdict;
  /** The meter's accuracy beyond each edge, drawn as `:`; a reading there is in band. */
  allowance?: GaugeAllowance;
}

export const VERDICT_WORDS: Record<Verdict, string> = { in: 'in band', low: 'LOW', high: 'HIGH' };

/** The healthy band on a horizontal scale and, once read, where the reading fell. */
export function BandGauge({ band, reading, width, format, unit, verdict, allowance }: Props) {
  const colour = useColour();
  const plain = layoutGauge(band, reading, width, allowance);
  const layout = verdict && plain.verdict ? { ...plain, verdict } : plain;
  const figures = bandFigures(band.min, band.max);
  const { min, max, nominal } =
    unit && [band.min, band.max, band.nominal].every(Number.isFinite)
      ? formatBand(band.min, band.max, band.nominal, unit)
      : { min: format(band.min, figures), max: format(band.max, figures), nominal: format(band.nominal, figures) };
  // In band only thanks to the meter's accuracy: say so, or the marker beside the brackets puzzles.
  const byAllowance = layout.verdict === 'in' && plain.verdict !== 'in';
  const slack = allowance && (allowance.below > 0 || allowance.above > 0) ? allowanceText(allowance, format) : undefined;
  const before = layout.scale.slice(0, layout.bandFrom);
  const inside = layout.scale.slice(layout.bandFrom, layout.bandTo + 1);
  const after = layout.scale.slice(layout.bandTo + 1);
  const verdictTone = layout.verdict === 'in' ? 'good' : 'bad';
  return (
    <Box flexDirection="column">
      <Text>
        healthy band {min} to {max}, nominal {nominal}
      </Text>
      <Text>
        {before}
        <Text color={toneColour('good', colour)}>{inside}</Text>
        {after}
      </Text>
      {layout.marker !== undefined && reading !== undefined && layout.verdict ? (
        <Text color={toneColour(verdictTone, colour)} bold={colour}>
          {markerLine(layout.marker, `${format(reading, figures)} ${VERDICT_WORDS[layout.verdict]}${byAllowance ? ' (meter accuracy)' : ''}${layout.offScale ? ' (off scale)' : ''}`, width)}
        </Text>
      ) : null}
      {slack ? <Text dimColor={colour}>: = meter accuracy ({slack})</Text> : null}
    </Box>
  );
}

function allowanceText(allowance: GaugeAllowance, format: (value: number) => string): string {
  const below = format(allowance.below);
  const above = format(allowance.above);
  return below === above ? `±${below}` : `±${below} below, ±${above} above`;
}
