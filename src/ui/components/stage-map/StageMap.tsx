import React from 'react';
import { Box, Text } from 'ink';
import { useColour } from '../../theme/colour-context.js';
import { toneColour } from '../../theme/tones.js';
import { layoutStageMap, type StageBlock } from './stage-map-layout.js';

interface Props {
  stages: StageBlock[];
  currentId?: string;
  width: number;
}

/** The signal chain with the stage under test bracketed (and inverse, when colour is allowed). */
export function StageMap({ stages, currentId, width }: Props) {
  const colour = useColour();
  const rows = layoutStageMap(stages, currentId, width);
  return (
    <Box flexDirection="column">
      {rows.map((row, r) => (
        <Text key={r}>
          {row.map((cell, i) => (
            <React.Fragment key={cell.id}>
              {i > 0 ? ' > ' : ''}
              {cell.current ? (
                <Text color={toneColour('focus', colour)} inverse={colour} bold={colour}>
                  {cell.text}
                </Text>
              ) : (
                cell.text
              )}
            </React.Fragment>
          ))}
        </Text>
      ))}
    </Box>
  );
}
