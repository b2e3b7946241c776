/**
 * Where the person is in the parts list: which stage, which part in it, and whether a value or a
 * file path is being typed. Stages wrap around; the row stays inside the stage's parts.
 */
export type PartsMode = 'browse' | 'edit' | 'import';

export interface PartsBrowserState {
  stage: number;
  row: number;
  mode: PartsMode;
}

export type PartsBrowserAction =
  | { type: 'stage'; by: 1 | -1; stages: number }
  | { type: 'row'; by: 1 | -1; rows: number }
  | { type: 'mode'; mode: PartsMode };

export const initialPartsBrowser: PartsBrowserState = { stage: 0, row: 0, mode: 'browse' };

export function partsBrowserReducer(state: PartsBrowserState, action: PartsBrowserAction): PartsBrowserState {
  switch (action.type) {
    case 'stage':
      if (action.stages <= 0) return state;
      return { ...state, stage: (state.stage + action.by + action.stages) % action.stages, row: 0 };
    case 'row':
      return { ...state, row: Math.min(Math.max(0, state.row + action.by), Math.max(0, action.rows - 1)) };
    case 'mode':
      return { ...state, mode: action.mode };
  }
}
