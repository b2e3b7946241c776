import React from 'react';
import { Text } from 'ink';
import { Tinted } from '../../theme/Tinted.js';

export interface KeyHint {
  key: string;
  does: string;
}

/** The line at the bottom saying which keys do what here; drops hints from the end to fit. */
export function KeyHints({ hints, width }: { hints: KeyHint[]; width: number }) {
  return (
    <Text wrap="truncate-end">
      <Tinted tone="quiet">{fitHints(hints, width)}</Tinted>
    </Text>
  );
}

export function fitHints(hints: KeyHint[], width: number): string {
  const parts = hints.map((h) => `${h.key} ${h.does}`);
  while (parts.length > 1 && parts.join('  ·  ').length > width) parts.pop();
  return parts.join('  ·  ');
}
