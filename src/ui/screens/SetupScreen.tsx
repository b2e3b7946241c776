import React from 'react';
import { Box, Text, useInput } from 'ink';
import { Frame } from '../components/frame/Frame.js';
import { Tinted } from '../theme/Tinted.js';
import { FlushLines, Prose } from '../components/prose/Prose.js';
import { keepUnitsTogether } from '../components/prose/keep-units.js';
import type { WalkStep } from '../../engine/step-view.js';

interface Props {
  width: number;
  title: string;
  stageMap?: React.ReactNode;
  text: string;
  condition?: WalkStep['condition'];
  powered: boolean;
  isActive?: boolean;
  onDone: () => void;
  onBack: () => void;
}

/** What to set up before the next readings: power, knobs, switches, a test level. */
export function SetupScreen({ width, title, stageMap, text, condition, powered, isActive = true, onDone, onBack }: Props) {
  useInput(
    (_input, key) => {
      if (key.return) onDone();
      if (key.escape) onBack();
    },
    { isActive },
  );
  return (
    <Frame title={title} width={width} hints={[{ key: 'Enter', does: 'done, next' }, { key: 'Esc', does: 'back' }, { key: 'Ctrl-C', does: 'quit, saved' }]}>
      {stageMap}
      <Box marginTop={stageMap ? 1 : 0} flexDirection="column">
        <Text bold>SET UP{powered ? ' (power on)' : ' (power off)'}</Text>
        <Prose>{text}</Prose>
        {condition ? (
          <FlushLines>
            <Text>
              <Tinted tone="quiet">{condition.label}: </Tinted>
              {keepUnitsTogether(condition.instructions)}
            </Text>
          </FlushLines>
        ) : null}
      </Box>
      <Box marginTop={1}>
        <Text>Press Enter when it is set up.</Text>
      </Box>
    </Frame>
  );
}
