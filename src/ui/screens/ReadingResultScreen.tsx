import React from 'react';
import { Box, Text, useInput } from 'ink';
import { Frame } from '../components/frame/Frame.js';
import { BandGauge, VERDICT_WORDS } from '../components/band-gauge/BandGauge.js';
import type { GaugeAllowance, Verdict } from '../components/band-gauge/gauge-layout.js';
import { Tinted } from '../theme/Tinted.js';
import type { ExpectedBand } from '../../engine/outcome.js';

export interface ReadingResult {
  testPoint: string;
  label: string;
  value: number;
  band: ExpectedBand;
  /** The engine's outcome word: in-band, low, high, stuck-at-rail, near-zero. */
  outcome: string;
  /** The stage the test point belongs to, for the stage map. */
  stage?: string;
  /** The meter's accuracy beyond each band edge, within which the engine still called it in band. */
  allowance?: GaugeAllowance;
}

interface Props {
  width: number;
  title: string;
  stageMap?: React.ReactNode;
  result: ReadingResult;
  format: (value: number, unit: string, figures?: number) => string;
  isActive?: boolean;
  onContinue: () => void;
}

const OUTCOME_WORDS: Record<string, string> = {
  'in-band': 'inside the healthy band',
  low: 'below the healthy band',
  high: 'above the healthy band',
  'stuck-at-rail': 'stuck near a supply rail',
  'near-zero': 'next to nothing',
};

/** The engine's outcome decides in band or not (it allows for meter accuracy); the side comes from the nominal. */
export function verdictOfOutcome(result: Pick<ReadingResult, 'outcome' | 'value' | 'band'>): Verdict {
  if (result.outcome === 'in-band') return 'in';
  return result.value < result.band.nominal ? 'low' : 'high';
}

/** Where the reading fell against its band, before the walk moves on. */
export function ReadingResultScreen({ width, title, stageMap, result, format, isActive = true, onContinue }: Props) {
  useInput(
    (_input, key) => {
      if (key.return) onContinue();
    },
    { isActive },
  );
  const verdict = verdictOfOutcome(result);
  return (
    <Frame title={title} width={width} hints={[{ key: 'Enter', does: 'next step' }, { key: 'Ctrl-C', does: 'quit, saved' }]}>
      {stageMap}
      <Box marginTop={stageMap ? 1 : 0} flexDirection="column">
        <Text bold>
          {/* Four figures, as the meter showed it and as the walk records it: 11.77 V, not 11.8 V. */}
          {result.testPoint} · {result.label}: {format(result.value, result.band.unit, 4)}{' '}
          <Tinted tone={verdict === 'in' ? 'good' : 'bad'} bold>
            {VERDICT_WORDS[verdict]}
          </Tinted>
        </Text>
        <Text>The reading is {OUTCOME_WORDS[result.outcome] ?? result.outcome}. Saved.</Text>
        <Box marginTop={1}>
          <BandGauge band={result.band} reading={result.value} verdict={verdict} allowance={result.allowance} width={width} unit={result.band.unit} format={(v, figures) => format(v, result.band.unit, figures)} />
        </Box>
      </Box>
    </Frame>
  );
}
