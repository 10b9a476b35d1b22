import { Pressable, StyleSheet, View } from 'react-native';

import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';

/**
 * Several independent on/off choices (filters). Each chip is a full touch target and says its state
 * with a tick as well as its fill, so the state never rests on colour alone.
 */
export function ToggleChips<T extends string>({
  label,
  values,
  options,
  onChange,
}: {
  label: string;
  values: readonly T[];
  options: { value: T; label: string; icon?: React.ReactNode }[];
  onChange: (values: T[]) => void;
}) {
  return (
    <View style={styles.row} role="group" accessibilityLabel={label}>
      {options.map((o) => {
        const on = values.includes(o.value);
        return (
          <Pressable
            key={o.value}
            role="checkbox"
            aria-checked={on}
            accessibilityState={{ checked: on }}
            accessibilityLabel={`${label}: ${o.label}`}
            onPress={() => onChange(on ? values.filter((v) => v !== o.value) : [...values, o.value])}
            style={StyleSheet.flatten([styles.chip, on && styles.chipOn])}
          >
            {o.icon}
            <Text variant="label" color={on ? colors.baseText : colors.text}>
              {on ? '✓ ' : ''}
              {o.label}
            </Text>
          </Pressable>
        );
      })}
    </View>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.xs },
  chip: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.xs,
    minHeight: layout.touchTarget - 4,
    paddingHorizontal: space.md,
    borderRadius: radius.md,
    borderWidth: 1.5,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  chipOn: { backgroundColor: colors.base, borderColor: colors.base },
});
