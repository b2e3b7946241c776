import React from 'react';
import { Box, Text, useInput } from 'ink';
import { Frame } from '../components/frame/Frame.js';
import { TextField } from '../components/text-field/TextField.js';
import type { Check } from '../components/text-field/use-text-field.js';
import { Tinted } from '../theme/Tinted.js';
import { FlushLines, Prose } from '../components/prose/Prose.js';
import { keepUnitsTogether } from '../components/prose/keep-units.js';
import type { WalkStep } from '../../engine/step-view.js';

interface Props {
  width: number;
  title: string;
  stageMap?: React.ReactNode;
  text: string;
  testPoint?: WalkStep['testPoint'];
  condition?: WalkStep['condition'];
  /** The band as the engine words it (enough figures to keep its edges apart). */
  band?: WalkStep['expected'];
  /** Parses what was typed as a reading of this quantity; its hint names the accepted forms. */
  check: (text: string) => Check<number>;
  isActive?: boolean;
  onReading: (value: number, text: string) => void;
  onSkip: () => void;
  onBack: () => void;
}

/** One measurement: the set-up, where the probes go, the expected band, and the reading. */
export function MeasureScreen({ width, title, stageMap, text, testPoint, condition, band, check, isActive = true, onReading, onSkip, onBack }: Props) {
  useInput(
    (_input, key) => {
      if (key.tab) onSkip();
    },
    { isActive },
  );
  const unit = band?.unit ?? (testPoint?.quantity === 'resistance' ? 'Ω' : 'V');
  return (
    <Frame
      title={title}
      width={width}
      hints={[{ key: 'Enter', does: 'record' }, { key: 'Esc', does: 'back' }, { key: 'Tab', does: 'skip (cannot measure)' }, { key: 'Ctrl-C', does: 'quit, saved' }]}
    >
      {stageMap}
      <Box marginTop={stageMap ? 1 : 0} flexDirection="column">
        <Text bold>
          MEASURE {testPoint ? `${testPoint.id} · ${testPoint.label}` : ''}
        </Text>
        <Prose>{text}</Prose>
        {condition ? (
          <FlushLines>
            <Text>
              <Tinted tone="quiet">Set-up: </Tinted>
              {keepUnitsTogether(condition.label)}
              {condition.powered ? ' (powered)' : ' (power off)'}
            </Text>
          </FlushLines>
        ) : null}
        {testPoint ? (
          <FlushLines>
            <Text>
              <Tinted tone="quiet">Probes: </Tinted>
              {keepUnitsTogether(testPoint.probe)}
            </Text>
          </FlushLines>
        ) : null}
        <Text>
          <Tinted tone="quiet">Expect: </Tinted>
          {band ? band.text : 'no expected value for this board here'}
        </Text>
      </Box>
      <Box marginTop={1}>
        <TextField label={band?.kind === 'noise' ? 'Hiss level (rms):' : `Reading (${unit}):`} placeholder={band?.kind === 'noise' ? 'e.g. 390uV or -66 dBu' : unit === 'V' ? 'e.g. 4.2 or 420mV' : 'e.g. 4k7 or 120'} isActive={isActive} check={check} onSubmit={onReading} onCancel={onBack} />
      </Box>
    </Frame>
  );
}
