import type { Wordings } from '../walk/wording.js';
import type { Tone } from '../theme/tones.js';

/** Which screen is up. Screens are states of the app, not routes: each knows what leads out of it. */
export type ScreenName = 'start' | 'open-board' | 'parts' | 'walk' | 'summary';

export interface AppState {
  screen: ScreenName;
  wording: Wordings;
  boardFile: string;
  /** Part values changed before a walk starts (during a walk they live in the walk itself). */
  substitutions: Record<string, string | number>;
  /** One line about the last thing that happened: a saved summary, a refused file. */
  notice?: { tone: Tone; text: string };
  summary?: { text: string; file?: string };
}

export type AppAction =
  | { type: 'show'; screen: ScreenName }
  | { type: 'toggle-wording' }
  | { type: 'open-board'; file: string }
  | { type: 'substitute'; ref: string; value: string | number | null }
  | { type: 'replace-substitutions'; substitutions: Record<string, string | number> }
  | { type: 'notice'; tone: Tone; text: string }
  | { type: 'clear-notice' }
  | { type: 'show-summary'; text: string; file?: string };

export function initialAppState(boardFile: string, wording: Wordings): AppState {
  return { screen: 'start', wording, boardFile, substitutions: {} };
}

export function appReducer(state: AppState, action: AppAction): AppState {
  switch (action.type) {
    case 'show':
      return { ...state, screen: action.screen, notice: action.screen === state.screen ? state.notice : undefined };
    case 'toggle-wording':
      return { ...state, wording: state.wording === 'technician' ? 'customer' : 'technician' };
    case 'open-board':
      // Part changes belong to the board they were made on.
      return { ...state, boardFile: action.file, substitutions: {}, screen: 'start', notice: undefined };
    case 'substitute': {
      const { [action.ref]: _old, ...rest } = state.substitutions;
      return { ...state, substitutions: action.value === null ? rest : { ...rest, [action.ref]: action.value } };
    }
    case 'replace-substitutions':
      return { ...state, substitutions: action.substitutions };
    case 'notice':
      return { ...state, notice: { tone: action.tone, text: action.text } };
    case 'clear-notice':
      return { ...state, notice: undefined };
    case 'show-summary':
      return { ...state, screen: 'summary', summary: { text: action.text, file: action.file } };
  }
}
