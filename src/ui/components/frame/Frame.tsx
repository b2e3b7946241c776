import React from 'react';
import { Box } from 'ink';
import { Tinted } from '../../theme/Tinted.js';
import { KeyHints, type KeyHint } from '../key-hints/KeyHints.js';

interface Props {
  title: string;
  width: number;
  hints: KeyHint[];
  children: React.ReactNode;
}

/**
 * Every screen's outline: a title line, the body, and the key-hint line last. No borders, so the
 * whole width of an 80-column terminal is for words.
 */
export function Frame({ title, width, hints, children }: Props) {
  return (
    <Box flexDirection="column" width={width}>
      <Tinted bold wrap="truncate-end">
        {title}
      </Tinted>
      <Box flexDirection="column" marginTop={1} marginBottom={1}>
        {children}
      </Box>
      <KeyHints hints={hints} width={width} />
    </Box>
  );
}
