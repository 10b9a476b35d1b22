import type { ReactNode } from 'react';
import { Pressable, StyleSheet } from 'react-native';

import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';

/**
 * One option of a radio group whose options carry more than a word (a status mark, a note): a filled or
 * empty ring and a heavier border mark the chosen one, so it does not rest on colour alone.
 */
export function RadioOption({
  on,
  label,
  onPress,
  children,
}: {
  on: boolean;
  /** Read for the option; what it shows is `children`. */
  label: string;
  onPress: () => void;
  children: ReactNode;
}) {
  return (
    <Pressable
      role="radio"
      aria-checked={on}
      accessibilityState={{ checked: on }}
      accessibilityLabel={label}
      onPress={onPress}
      style={StyleSheet.flatten([styles.choice, on && styles.choiceOn])}
    >
      <Text variant="label" color={on ? colors.base : colors.textMuted}>
        {on ? '●' : '○'}
      </Text>
      {children}
    </Pressable>
  );
}

const styles = StyleSheet.create({
  choice: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    minHeight: layout.touchTarget,
    paddingHorizontal: space.md,
    borderRadius: radius.md,
    borderWidth: 1.5,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  choiceOn: { borderColor: colors.base, borderWidth: 2.5 },
});
