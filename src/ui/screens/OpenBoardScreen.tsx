import React from 'react';
import { Text } from 'ink';
import { Frame } from '../components/frame/Frame.js';
import { TextField } from '../components/text-field/TextField.js';
import type { Check } from '../components/text-field/use-text-field.js';

interface Props {
  width: number;
  /** Loads the board at the typed path; the hint says what is wrong with the file. */
  check: (text: string) => Check<string>;
  onOpen: (file: string) => void;
  onBack: () => void;
}

/** Another board file, by path. */
export function OpenBoardScreen({ width, check, onOpen, onBack }: Props) {
  return (
    <Frame title="Open a board file" width={width} hints={[{ key: 'Enter', does: 'open' }, { key: 'Esc', does: 'back' }]}>
      <Text>Type the path of a voltwalk board file (JSON), relative to this folder.</Text>
      <TextField label="Board file:" placeholder="e.g. boards/my-kit.json" check={check} onSubmit={onOpen} onCancel={onBack} />
    </Frame>
  );
}
