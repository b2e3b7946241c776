import React from 'react';
import { Text } from 'ink';
import { Tinted } from '../../theme/Tinted.js';

export interface KeyHint {
  key: string;
  does: string;
}

/**
 * The line at the bottom saying which keys do what here: spaced out when it fits, closer together
 * when not, and only then does it drop hints from the end (so screens list the ones that matter
 * most first).
 */
export function KeyHints({ hints, width }: { hints: KeyHint[]; width: number }) {
  return (
    <Text wrap="truncate-end">
      <Tinted tone="quiet">{fitHints(hints, width)}</Tinted>
    </Text>
  );
}

export function fitHints(hints: KeyHint[], width: number): string {
  const parts = hints.map((h) => `${h.key} ${h.does}`);
  if (parts.join(WIDE).length <= width) return parts.join(WIDE);
  while (parts.length > 1 && parts.join(NARROW).length > width) parts.pop();
  return parts.join(NARROW);
}

const WIDE = '  ·  ';
const NARROW = ' · ';
