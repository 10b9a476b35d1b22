import { StyleSheet, View } from 'react-native';

import { colors, layout, space } from '@/components/theme';
import { useWide } from '@/components/use-wide';

/**
 * A bar fixed under a scrolling page, for the page's next step and its main action: on a phone it sits
 * where the thumb rests, whatever the length of the form above it. Lay it out after the page's scroll view
 * in a column that fills the screen (see `features/inspections/inspection-frame.tsx`).
 */
export function ActionBar({
  children,
  label,
}: {
  children: React.ReactNode;
  /** What the bar is for, for screen readers ("Inspection actions"). */
  label: string;
}) {
  const wide = useWide();
  return (
    <View style={styles.bar} role="toolbar" accessibilityLabel={label}>
      <View style={[styles.inner, wide && styles.innerWide]}>{children}</View>
    </View>
  );
}

const styles = StyleSheet.create({
  bar: {
    borderTopWidth: 1,
    borderTopColor: colors.border,
    backgroundColor: colors.surface,
    paddingHorizontal: space.lg,
    paddingVertical: space.sm,
  },
  inner: {
    width: '100%',
    maxWidth: layout.maxContentWidth,
    alignSelf: 'center',
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    minHeight: layout.touchTarget,
  },
  innerWide: { paddingHorizontal: space.lg },
});
