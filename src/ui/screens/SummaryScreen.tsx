import React from 'react';
import { Box, Text, useInput } from 'ink';
import { Frame } from '../components/frame/Frame.js';
import { Tinted } from '../theme/Tinted.js';

interface Props {
  width: number;
  text: string;
  file?: string;
  isActive?: boolean;
  onBack: () => void;
  onQuit: () => void;
}

/** The case summary as it will be pasted, and where it was written. */
export function SummaryScreen({ width, text, file, isActive = true, onBack, onQuit }: Props) {
  useInput(
    (input, key) => {
      if (key.escape || key.return) onBack();
      if (input === 'q') onQuit();
    },
    { isActive },
  );
  return (
    <Frame title="Case summary — copy it into the chat" width={width} hints={[{ key: 'Enter', does: 'back' }, { key: 'q', does: 'quit' }]}>
      {file ? <Tinted tone="good">Written to {file}</Tinted> : null}
      <Box marginTop={file ? 1 : 0} flexDirection="column">
        {text
          .trimEnd()
          .split('\n')
          .map((line, i) => (
            <Text key={i}>{line}</Text>
          ))}
      </Box>
    </Frame>
  );
}
