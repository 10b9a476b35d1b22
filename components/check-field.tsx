import { Pressable, StyleSheet, View } from 'react-native';

import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';

/** A yes/no choice with its label: a full touch target, ticked box plus words, never colour alone. */
export function CheckField({
  label,
  value,
  onChange,
  icon,
}: {
  label: string;
  value: boolean;
  onChange: (value: boolean) => void;
  icon?: React.ComponentProps<typeof Feather>['name'];
}) {
  return (
    <Pressable
      role="checkbox"
      aria-checked={value}
      accessibilityState={{ checked: value }}
      accessibilityLabel={label}
      onPress={() => onChange(!value)}
      style={styles.row}
    >
      <View style={StyleSheet.flatten([styles.box, value && styles.boxOn])}>
        {value ? <Feather name="check" size={16} color={colors.baseText} /> : null}
      </View>
      {icon ? <Feather name={icon} size={16} color={colors.textMuted} /> : null}
      <Text variant="small">{label}</Text>
    </Pressable>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', alignItems: 'center', gap: space.sm, minHeight: layout.touchTarget },
  box: {
    width: 24,
    height: 24,
    borderRadius: radius.sm,
    borderWidth: 2,
    borderColor: colors.textMuted,
    alignItems: 'center',
    justifyContent: 'center',
    backgroundColor: colors.surface,
  },
  boxOn: { backgroundColor: colors.base, borderColor: colors.base },
});
