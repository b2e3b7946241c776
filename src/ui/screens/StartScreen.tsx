import React from 'react';
import { Box, Text, useInput } from 'ink';
import { Frame } from '../components/frame/Frame.js';
import { ChoiceList, type Choice } from '../components/choice-list/ChoiceList.js';
import { Tinted } from '../theme/Tinted.js';
import type { Wordings } from '../walk/wording.js';
import { boardLineText, type BoardLine } from './board-line.js';


export type StartChoice =
  | { type: 'symptom'; treeId: string }
  | { type: 'resume'; file: string }
  | { type: 'parts' }
  | { type: 'open-board' };

interface Props {
  width: number;
  board?: BoardLine;
  /** Shown instead of the symptoms while the board and trees load, or when they cannot. */
  status?: string;
  symptoms: Array<{ treeId: string; symptom: string }>;
  resumable: Array<{ file: string; label: string }>;
  corrupt: Array<{ file: string; problem: string }>;
  wording: Wordings;
  isActive?: boolean;
  onChoose: (choice: StartChoice) => void;
  onToggleWording: () => void;
  onQuit: () => void;
}


/** The first screen: which board, what is wrong with it, or carry on with an unfinished walk. */
export function StartScreen({ width, board, status, symptoms, resumable, corrupt, wording, isActive = true, onChoose, onToggleWording, onQuit }: Props) {
  useInput(
    (input) => {
      if (input === 'w') onToggleWording();
      if (input === 'q') onQuit();
    },
    { isActive },
  );
  const items: Choice<StartChoice>[] = [
    ...resumable.map((r) => ({ key: `resume:${r.file}`, label: `Resume: ${r.label}`, value: { type: 'resume', file: r.file } as StartChoice })),
    ...symptoms.map((s) => ({ key: `tree:${s.treeId}`, label: s.symptom, value: { type: 'symptom', treeId: s.treeId } as StartChoice })),
    { key: 'parts', label: 'Check or change part values (substituted parts, a bill of materials)', value: { type: 'parts' } },
    { key: 'open', label: 'Open another board file…', value: { type: 'open-board' } },
  ];
  return (
    <Frame
      title="voltwalk · guided fault-finding"
      width={width}
      hints={[
        { key: '↑↓', does: 'choose' },
        { key: 'Enter', does: 'start' },
        { key: 'w', does: `${wording === 'technician' ? 'customer' : 'technician'} wording` },
        { key: 'q', does: 'quit' },
      ]}
    >
      <Text wrap="truncate-end">Board: {board ? boardLineText(board) : 'loading…'}</Text>
      <Text>
        Wording: {wording === 'technician' ? 'for a bench technician' : 'for a customer (plain words, for a support chat)'}
      </Text>
      <Box marginTop={1} flexDirection="column">
        {status ? (
          <Text>{status}</Text>
        ) : (
          <>
            <Text>{resumable.length > 0 ? 'Carry on where you stopped, or pick what is wrong:' : 'What is wrong with the module?'}</Text>
            <ChoiceList items={items} isActive={isActive} limit={12} onChoose={onChoose} />
          </>
        )}
      </Box>
      {corrupt.map((c) => (
        <Tinted key={c.file} tone="bad" wrap="truncate-end">
          ! {c.file}: {c.problem} (left as it is)
        </Tinted>
      ))}
    </Frame>
  );
}
