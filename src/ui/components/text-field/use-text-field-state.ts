/**
 * The pure state of a one-line text field: what has been typed, and the hint shown when Enter was
 * refused. Typing again clears the refusal, so the hint describes the text on screen.
 */
export interface TextFieldState {
  value: string;
  refusal?: string;
}

export type TextFieldAction =
  | { type: 'insert'; text: string }
  | { type: 'erase' }
  | { type: 'clear' }
  | { type: 'refuse'; hint: string }
  | { type: 'reset'; value: string };

export function initialTextField(value = ''): TextFieldState {
  return { value };
}

export function textFieldReducer(state: TextFieldState, action: TextFieldAction): TextFieldState {
  switch (action.type) {
    case 'insert': {
      const text = printable(action.text);
      return text ? { value: state.value + text } : state;
    }
    case 'erase':
      return state.value ? { value: [...state.value].slice(0, -1).join('') } : { value: '' };
    case 'clear':
      return { value: '' };
    case 'refuse':
      return { ...state, refusal: action.hint };
    case 'reset':
      return { value: action.value };
  }
}

/** Drops control characters (a paste may carry a newline or escape codes); keeps letters, µ, Ω. */
function printable(text: string): string {
  return text.replace(/[\u0000-\u001f\u007f]/g, '');
}
