import React from 'react';
import { Box, Text } from 'ink';
import { useColour } from '../../theme/colour-context.js';
import { toneColour } from '../../theme/tones.js';
import { layoutGauge, markerLine, type GaugeBand, type Verdict } from './gauge-layout.js';

interface Props {
  band: GaugeBand;
  reading?: number;
  width: number;
  /** Formats a value with its unit, e.g. "4.80 V". */
  format: (value: number) => string;
  /**
   * The verdict the engine reached, when it differs from a plain comparison with the band edges:
   * the engine allows for the meter's own accuracy, so a reading a hair outside is still in band.
   */
  verdict?: Verdict;
}

export const VERDICT_WORDS: Record<Verdict, string> = { in: 'in band', low: 'LOW', high: 'HIGH' };

/** The healthy band on a horizontal scale and, once read, where the reading fell. */
export function BandGauge({ band, reading, width, format, verdict }: Props) {
  const colour = useColour();
  const plain = layoutGauge(band, reading, width);
  const layout = verdict && plain.verdict ? { ...plain, verdict } : plain;
  const before = layout.scale.slice(0, layout.bandFrom);
  const inside = layout.scale.slice(layout.bandFrom, layout.bandTo + 1);
  const after = layout.scale.slice(layout.bandTo + 1);
  const verdictTone = layout.verdict === 'in' ? 'good' : 'bad';
  return (
    <Box flexDirection="column">
      <Text>
        healthy band {format(band.min)} to {format(band.max)}, nominal {format(band.nominal)}
      </Text>
      <Text>
        {before}
        <Text color={toneColour('good', colour)}>{inside}</Text>
        {after}
      </Text>
      {layout.marker !== undefined && reading !== undefined && layout.verdict ? (
        <Text color={toneColour(verdictTone, colour)} bold={colour}>
          {markerLine(layout.marker, `${format(reading)} ${VERDICT_WORDS[layout.verdict]}${layout.offScale ? ' (off scale)' : ''}`, width)}
        </Text>
      ) : null}
    </Box>
  );
}
