import React from 'react';
import { Text } from 'ink';
import { useColour } from './colour-context.js';
import { toneColour, type Tone } from './tones.js';

interface Props {
  tone?: Tone;
  bold?: boolean;
  inverse?: boolean;
  wrap?: 'wrap' | 'truncate-end';
  children: React.ReactNode;
}

/** Text in a tone when colour is allowed; plain text (same characters) when it is not. */
export function Tinted({ tone, bold, inverse, wrap, children }: Props) {
  const colour = useColour();
  return (
    <Text color={toneColour(tone, colour)} bold={colour ? bold : undefined} inverse={colour ? inverse : undefined} wrap={wrap}>
      {children}
    </Text>
  );
}
