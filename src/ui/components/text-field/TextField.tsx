import React from 'react';
import { Box, Text } from 'ink';
import { Tinted } from '../../theme/Tinted.js';
import { useTextField, type Check } from './use-text-field.js';

interface Props<T> {
  label: string;
  placeholder?: string;
  initial?: string;
  isActive?: boolean;
  check: (text: string) => Check<T>;
  /** Check while typing and show the hint at once (part values); otherwise only on Enter (readings). */
  live?: boolean;
  onSubmit: (value: T, text: string) => void;
  onCancel?: () => void;
}

/** A one-line field with a cursor, and below it the hint for text it will not accept. */
export function TextField<T>({ label, placeholder, initial, isActive = true, check, live = false, onSubmit, onCancel }: Props<T>) {
  const state = useTextField({ initial, isActive, check, onSubmit, onCancel });
  const liveResult = live && state.value ? check(state.value) : undefined;
  const hint = state.refusal ?? (liveResult && !liveResult.ok ? liveResult.hint : undefined);
  return (
    <Box flexDirection="column">
      <Text>
        {label} {state.value ? state.value : placeholder ? <Tinted tone="quiet">{placeholder}</Tinted> : null}
        {isActive ? '_' : ''}
      </Text>
      {hint ? (
        <Tinted tone="bad" wrap="truncate-end">
          ! {hint}
        </Tinted>
      ) : null}
    </Box>
  );
}
