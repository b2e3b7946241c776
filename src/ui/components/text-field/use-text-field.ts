import { useRef, useState } from 'react';
import { useInput } from 'ink';
import { initialTextField, textFieldReducer, type TextFieldAction, type TextFieldState } from './use-text-field-state.js';

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
 * The latest text is kept in a ref as well as in state: a paste such as "4.2\r" arrives as several
 * keys before React renders again, and Enter must see the text typed just before it.
 */
export function useTextField<T>({ initial, isActive = true, check, onSubmit, onCancel }: TextFieldOptions<T>): TextFieldState {
  const [state, setState] = useState(() => initialTextField(initial));
  const latest = useRef(state);
  const apply = (action: TextFieldAction) => {
    latest.current = textFieldReducer(latest.current, action);
    setState(latest.current);
  };
  const submit = () => {
    const text = latest.current.value;
    const result = check(text);
    if (result.ok) {
      apply({ type: 'clear' });
      onSubmit(result.value, text);
    } else apply({ type: 'refuse', hint: result.hint });
  };
  useInput(
    (input, key) => {
      if (key.return) {
        submit();
        return;
      }
      if (key.escape) {
        onCancel?.();
        return;
      }
      if (key.backspace || key.delete) {
        apply({ type: 'erase' });
        return;
      }
      if (key.ctrl || key.meta || key.tab || key.upArrow || key.downArrow || key.leftArrow || key.rightArrow) return;
      // A pasted line arrives as one chunk with its newline inside: type the line, then submit it.
      const newline = input.search(/[\r\n]/);
      if (newline >= 0) {
        apply({ type: 'insert', text: input.slice(0, newline) });
        submit();
        return;
      }
      apply({ type: 'insert', text: input });
    },
    { isActive },
  );
  return state;
}
