import React from 'react';
import { Text } from 'ink';
import { keepUnitsTogether } from './keep-units.js';

/** A paragraph of instructions, wrapped to the frame without splitting a value from its unit. */
export function Prose({ children }: { children: string }) {
  return <Text>{keepUnitsTogether(children)}</Text>;
}
