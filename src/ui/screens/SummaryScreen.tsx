import React from 'react';
import { Box, Text, useInput, useStdout } from 'ink';
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
  const { stdout } = useStdout();
  // The file holds every line; the screen shows what fits, each line cut at the edge.
  const rows = Math.max(10, (stdout as { rows?: number }).rows ?? 24);
  const all = text.trimEnd().split('\n');
  const room = rows - (file ? 7 : 5);
  const shown = all.length > room ? [...all.slice(0, room - 1), `… ${all.length - room + 1} more line(s) in the file`] : all;
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
        {shown.map((line, i) => (
          <Text key={i} wrap="truncate-end">
            {line}
          </Text>
        ))}
      </Box>
    </Frame>
  );
}
