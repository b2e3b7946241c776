import React from 'react';
import { Box, Text, Transform } from 'ink';
import { keepUnitsTogether } from './keep-units.js';
import { dropBreakSpace } from './break-space.js';

/** A paragraph of instructions, wrapped to the frame without splitting a value from its unit. */
export function Prose({ children }: { children: string }) {
  return (
    <FlushLines>
      <Text>{keepUnitsTogether(children)}</Text>
    </FlushLines>
  );
}

/** Any wrapped text block whose continuation lines should start at its margin (see dropBreakSpace). */
export function FlushLines({ children }: { children: React.ReactNode }) {
  return <Transform transform={dropBreakSpace}>{children}</Transform>;
}

/** A list item: its wrapped lines hang under the text, not under the dash. */
export function Bullet({ children }: { children: string }) {
  return (
    <Box>
      <Text>- </Text>
      <Box flexShrink={1}>
        <Prose>{children}</Prose>
      </Box>
    </Box>
  );
}
