import { Pressable, StyleSheet, View } from 'react-native';

import { FieldFrame } from '@/components/field-frame';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';

/**
 * One choice from a short list, as a labelled group of chips that wrap on a phone. The chosen one is
 * filled and ticked, so the state does not rest on colour alone.
 */
export function ChoiceChips<T extends string>({
  label,
  value,
  options,
  onChange,
  error,
  hideLabel,
}: {
  label: string;
  value: T | null | undefined;
  options: readonly { value: T; label: string }[];
  onChange: (value: T) => void;
  error?: string;
  hideLabel?: boolean;
}) {
  return (
    <FieldFrame label={label} hideLabel={hideLabel} error={error}>
      <View style={styles.row} role="radiogroup" accessibilityLabel={label}>
        {options.map((o) => {
          const on = o.value === value;
          return (
            <Pressable
              key={o.value}
              role="radio"
              aria-checked={on}
              accessibilityState={{ checked: on }}
              accessibilityLabel={o.label}
              onPress={() => onChange(o.value)}
              style={StyleSheet.flatten([
                styles.chip,
                on && styles.chipOn,
                error && !on ? styles.chipError : null,
              ])}
            >
              <Text variant="label" color={on ? colors.baseText : colors.text}>
                {on ? '● ' : '○ '}
                {o.label}
              </Text>
            </Pressable>
          );
        })}
      </View>
    </FieldFrame>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.xs },
  chip: {
    minHeight: layout.touchTarget - 4,
    paddingHorizontal: space.md,
    justifyContent: 'center',
    borderRadius: radius.md,
    borderWidth: 1.5,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  chipOn: { backgroundColor: colors.base, borderColor: colors.base },
  chipError: { borderColor: colors.danger },
});
