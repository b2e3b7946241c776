import React from 'react';
import { Text, Transform } from 'ink';
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
