import React from 'react';
import { Box, Text } from 'ink';
import { Frame } from '../components/frame/Frame.js';
import { TextField } from '../components/text-field/TextField.js';
import type { Check } from '../components/text-field/use-text-field.js';
import { Tinted } from '../theme/Tinted.js';
import { Bullet, Prose } from '../components/prose/Prose.js';

interface Props {
  width: number;
  title: string;
  stageMap?: React.ReactNode;
  text: string;
  hazards: string[];
  /** Worked out from the board for this caution (the idle draw to set a current limit by). */
  expectation?: string;
  isActive?: boolean;
  onAcknowledge: () => void;
  onBack: () => void;
}

/** A deliberate answer, not any key: a caution must not be dismissed by a stray Enter. */
export const ACKNOWLEDGE_WORD = 'y';
function acknowledge(text: string): Check<true> {
  const word = text.trim().toLowerCase();
  if (word === ACKNOWLEDGE_WORD || word === 'yes') return { ok: true, value: true };
  return { ok: false, hint: `type ${ACKNOWLEDGE_WORD} and press Enter once you have read the caution (Esc goes back)` };
}

/** The hazard in plain words before any powered step. */
export function CautionScreen({ width, title, stageMap, text, hazards, expectation, isActive = true, onAcknowledge, onBack }: Props) {
  return (
    <Frame title={title} width={width} hints={[{ key: 'y Enter', does: 'I have read this' }, { key: 'Esc', does: 'back' }, { key: 'Ctrl-C', does: 'quit, saved' }]}>
      {stageMap}
      <Box marginTop={stageMap ? 1 : 0} flexDirection="column">
        <Tinted tone="caution" bold>
          !! CAUTION
        </Tinted>
        <Prose>{text}</Prose>
        {hazards.map((h) => (
          <Bullet key={h}>{h}</Bullet>
        ))}
        {expectation ? <Prose>{`This board: ${expectation}.`}</Prose> : null}
      </Box>
      <Box marginTop={1}>
        <TextField label={`Read it? Type ${ACKNOWLEDGE_WORD} and Enter:`} isActive={isActive} check={acknowledge} onSubmit={() => onAcknowledge()} onCancel={onBack} />
      </Box>
    </Frame>
  );
}
