import { useReducer } from 'react';
import { useInput } from 'ink';
import { initialPartsBrowser, partsBrowserReducer, type PartsBrowserState, type PartsMode } from './use-parts-browser-state.js';

interface Options {
  stages: number;
  rowsIn: (stage: number) => number;
  isActive?: boolean;
  onReset: (stage: number, row: number) => void;
  onBack: () => void;
}

/** Keys of the parts list while browsing; typing a value or a path belongs to that field instead. */
export function usePartsBrowser({ stages, rowsIn, isActive = true, onReset, onBack }: Options): [PartsBrowserState, (mode: PartsMode) => void] {
  const [state, dispatch] = useReducer(partsBrowserReducer, initialPartsBrowser);
  useInput(
    (input, key) => {
      if (key.leftArrow) dispatch({ type: 'stage', by: -1, stages });
      else if (key.rightArrow) dispatch({ type: 'stage', by: 1, stages });
      else if (key.upArrow) dispatch({ type: 'row', by: -1, rows: rowsIn(state.stage) });
      else if (key.downArrow) dispatch({ type: 'row', by: 1, rows: rowsIn(state.stage) });
      else if (key.return) dispatch({ type: 'mode', mode: 'edit' });
      else if (input === 'i') dispatch({ type: 'mode', mode: 'import' });
      else if (input === 'r') onReset(state.stage, state.row);
      else if (key.escape) onBack();
    },
    { isActive: isActive && state.mode === 'browse' },
  );
  return [state, (mode) => dispatch({ type: 'mode', mode })];
}
