import React from 'react';
import { Box, Text, useInput } from 'ink';
import { Frame } from '../components/frame/Frame.js';
import { ChoiceList } from '../components/choice-list/ChoiceList.js';
import { partLine, type PartLineInfo } from '../parts/part-info.js';
import { FlushLines, Prose } from '../components/prose/Prose.js';
import { keepUnitsTogether } from '../components/prose/keep-units.js';
import { Tinted } from '../theme/Tinted.js';

interface Props {
  width: number;
  title: string;
  stageMap?: React.ReactNode;
  heading: string;
  text: string;
  /** What the board's parts say the answer should be (a detector time), shown under the question. */
  expectation?: string;
  /** Parts to look at (inspect steps). */
  parts?: PartLineInfo[];
  choices: Array<{ id: string; label: string }>;
  canSkip: boolean;
  isActive?: boolean;
  onChoose: (id: string) => void;
  onSkip: () => void;
  onBack: () => void;
}

/** A question answered by looking or listening: an observation, or an inspection of parts. */
export function ChoiceScreen({ width, title, stageMap, heading, text, expectation, parts = [], choices, canSkip, isActive = true, onChoose, onSkip, onBack }: Props) {
  useInput(
    (_input, key) => {
      if (key.escape) onBack();
      if (key.tab && canSkip) onSkip();
    },
    { isActive },
  );
  return (
    <Frame
      title={title}
      width={width}
      hints={[{ key: '↑↓', does: 'choose' }, { key: 'Enter', does: 'answer' }, { key: 'Esc', does: 'back' }, ...(canSkip ? [{ key: 'Tab', does: 'cannot tell, skip' }] : []), { key: 'Ctrl-C', does: 'quit, saved' }]}
    >
      {stageMap}
      <Box marginTop={stageMap ? 1 : 0} flexDirection="column">
        <Text bold>{heading}</Text>
        <Prose>{text}</Prose>
        {expectation ? (
          <FlushLines>
            <Text>
              <Tinted tone="quiet">Expect: </Tinted>
              {keepUnitsTogether(expectation)}
            </Text>
          </FlushLines>
        ) : null}
        {parts.slice(0, 6).map((p) => (
          <Text key={p.ref} wrap="truncate-end">
            - {partLine(p)}
            {p.orientation ? ` · ${p.orientation}` : ''}
          </Text>
        ))}
      </Box>
      <Box marginTop={1}>
        <ChoiceList items={choices.map((c) => ({ key: c.id, label: c.label, value: c.id }))} isActive={isActive} onChoose={onChoose} />
      </Box>
    </Frame>
  );
}
