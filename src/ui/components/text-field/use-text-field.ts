import { useReducer } from 'react';
import { useInput } from 'ink';
import { initialTextField, textFieldReducer, type TextFieldState } from './use-text-field-state.js';

/** The result of checking a field's text: the accepted value, or a one-line hint. */
export type Check<T> = { ok: true; value: T } | { ok: false; hint: string };

export interface TextFieldOptions<T> {
  initial?: string;
  isActive?: boolean;
  check: (text: string) => Check<T>;
  onSubmit: (value: T, text: string) => void;
  onCancel?: () => void;
}

/**
 * Key handling of a text field: printable keys type, Backspace erases, Enter submits when `check`
 * accepts the text and shows its hint when it does not, Escape cancels. Inactive fields ignore keys.
 */
export function useTextField<T>({ initial, isActive = true, check, onSubmit, onCancel }: TextFieldOptions<T>): TextFieldState {
  const [state, dispatch] = useReducer(textFieldReducer, initial, initialTextField);
  useInput(
    (input, key) => {
      if (key.return) {
        const result = check(state.value);
        if (result.ok) {
          onSubmit(result.value, state.value);
          dispatch({ type: 'clear' });
        } else dispatch({ type: 'refuse', hint: result.hint });
        return;
      }
      if (key.escape) {
        onCancel?.();
        return;
      }
      if (key.backspace || key.delete) {
        dispatch({ type: 'erase' });
        return;
      }
      if (key.ctrl || key.meta || key.tab || key.upArrow || key.downArrow || key.leftArrow || key.rightArrow) return;
      dispatch({ type: 'insert', text: input });
    },
    { isActive },
  );
  return state;
}
