import { Pressable, StyleSheet, View } from 'react-native';

import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';

/** A small set of mutually exclusive choices, each a full touch target. */
export function Segmented<T extends string>({
  value,
  options,
  onChange,
  label,
}: {
  value: T;
  options: { value: T; label: string }[];
  onChange: (v: T) => void;
  label: string;
}) {
  return (
    <View style={styles.row} role="radiogroup" accessibilityLabel={label}>
      {options.map((o) => {
        const selected = o.value === value;
        return (
          <Pressable
            key={o.value}
            role="radio"
            aria-checked={selected}
            accessibilityState={{ checked: selected }}
            onPress={() => onChange(o.value)}
            style={StyleSheet.flatten([styles.option, selected && styles.selected])}
          >
            <Text variant="label" color={selected ? colors.baseText : colors.text}>
              {o.label}
            </Text>
          </Pressable>
        );
      })}
    </View>
  );
}

const styles = StyleSheet.create({
  row: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    backgroundColor: colors.surfaceSunk,
    borderRadius: radius.md,
    padding: 3,
    gap: 3,
    alignSelf: 'flex-start',
  },
  option: {
    minHeight: layout.touchTarget - 4,
    paddingHorizontal: space.lg,
    justifyContent: 'center',
    alignItems: 'center',
    borderRadius: radius.sm + 2,
  },
  selected: { backgroundColor: colors.base },
});
