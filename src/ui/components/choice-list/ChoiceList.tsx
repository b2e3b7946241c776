import React from 'react';
import { Text } from 'ink';
import SelectInput from 'ink-select-input';
import { useColour } from '../../theme/colour-context.js';
import { toneColour } from '../../theme/tones.js';

export interface Choice<V> {
  key: string;
  label: string;
  value: V;
}

interface Props<V> {
  items: Choice<V>[];
  isActive?: boolean;
  limit?: number;
  onChoose: (value: V) => void;
  onHighlight?: (value: V) => void;
}

/**
 * A vertical list chosen with the arrow keys and Enter. The chosen line is marked with `>` so it
 * reads without colour; colour, when allowed, only repeats that.
 */
export function ChoiceList<V>({ items, isActive = true, limit, onChoose, onHighlight }: Props<V>) {
  const colour = useColour();
  const Indicator = ({ isSelected }: { isSelected?: boolean }) => <Text>{isSelected ? '> ' : '  '}</Text>;
  const Item = ({ isSelected, label }: { isSelected?: boolean; label: string }) => (
    <Text color={isSelected ? toneColour('focus', colour) : undefined} bold={colour && isSelected}>
      {label}
    </Text>
  );
  return (
    <SelectInput
      items={items}
      isFocused={isActive}
      limit={limit}
      indicatorComponent={Indicator}
      itemComponent={Item}
      onSelect={(item) => onChoose(item.value)}
      onHighlight={onHighlight ? (item) => onHighlight(item.value) : undefined}
    />
  );
}
