import { useEffect, useRef } from 'react';
import { Pressable, ScrollView, StyleSheet, View } from 'react-native';

import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';

export type Step<T extends string> = {
  value: T;
  label: string;
  /** A short state under the label ("12/37", "2", "3 to do"); words, never colour alone. */
  detail?: string;
  /** The step still holds something to do (shown with a mark beside the detail). */
  attention?: boolean;
};

/**
 * The steps of one task as a single row that never wraps: on a phone each step shares the width, and when
 * the steps need more room than the screen has (a narrow phone, large text) the row scrolls sideways
 * instead of breaking onto a second line. One radio group; each step is a full touch target.
 */
export function StepTabs<T extends string>({
  value,
  steps,
  onChange,
  label,
}: {
  value: T;
  steps: Step<T>[];
  onChange: (v: T) => void;
  label: string;
}) {
  const scroll = useRef<ScrollView>(null);
  const offsets = useRef(new Map<T, number>());
  // The chosen step stays in view when the row scrolls (chosen from the bar below, say).
  useEffect(() => {
    const x = offsets.current.get(value);
    if (x !== undefined) scroll.current?.scrollTo({ x: Math.max(0, x - space.xl), animated: true });
  }, [value]);
  return (
    <ScrollView
      ref={scroll}
      horizontal
      showsHorizontalScrollIndicator={false}
      style={styles.scroll}
      contentContainerStyle={styles.content}
    >
      <View style={styles.row} role="radiogroup" accessibilityLabel={label} testID="step-tabs">
        {steps.map((s) => {
          const selected = s.value === value;
          return (
            <Pressable
              key={s.value}
              role="radio"
              aria-checked={selected}
              accessibilityState={{ checked: selected }}
              accessibilityLabel={s.label}
              accessibilityHint={s.detail}
              onPress={() => onChange(s.value)}
              onLayout={(e) => offsets.current.set(s.value, e.nativeEvent.layout.x)}
              style={StyleSheet.flatten([styles.step, selected && styles.selected])}
            >
              <Text variant="label" numberOfLines={1} color={selected ? colors.baseText : colors.text}>
                {s.label}
              </Text>
              {s.detail ? (
                <Text
                  variant="small"
                  numberOfLines={1}
                  color={selected ? colors.baseMuted : s.attention ? colors.near : colors.textMuted}
                >
                  {s.attention ? '● ' : ''}
                  {s.detail}
                </Text>
              ) : null}
            </Pressable>
          );
        })}
      </View>
    </ScrollView>
  );
}

const styles = StyleSheet.create({
  scroll: { flexGrow: 0 },
  content: { flexGrow: 1 },
  row: {
    flexGrow: 1,
    flexDirection: 'row',
    flexWrap: 'nowrap',
    backgroundColor: colors.surfaceSunk,
    borderRadius: radius.md,
    padding: 3,
    gap: 3,
  },
  step: {
    flexGrow: 1,
    flexBasis: 'auto',
    minHeight: layout.touchTarget + 4,
    paddingHorizontal: space.sm,
    paddingVertical: space.xs,
    justifyContent: 'center',
    alignItems: 'center',
    borderRadius: radius.sm + 2,
  },
  selected: { backgroundColor: colors.base },
});
