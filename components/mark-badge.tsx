import type { ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';

import { Text } from '@/components/text';
import { radius, space } from '@/components/theme';

/**
 * The badge every status mark is drawn in: a shape, the words and a colour pair together, so the colour
 * is never the only signal. `compact` is the smaller badge used inside dense rows.
 */
export function MarkBadge({
  shape,
  label,
  fg,
  bg,
  accessibilityLabel,
  compact,
}: {
  shape: ReactNode;
  label: string;
  fg: string;
  bg: string;
  accessibilityLabel: string;
  compact?: boolean;
}) {
  return (
    <View
      style={StyleSheet.flatten([styles.mark, { backgroundColor: bg }, compact && styles.compact])}
      accessibilityLabel={accessibilityLabel}
    >
      {shape}
      <Text variant="label" color={fg}>
        {label}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  mark: {
    flexDirection: 'row',
    alignItems: 'center',
    alignSelf: 'flex-start',
    gap: space.xs + 2,
    paddingHorizontal: space.sm + 2,
    paddingVertical: space.xs,
    borderRadius: radius.sm,
  },
  compact: { paddingHorizontal: space.sm, paddingVertical: 2 },
});
