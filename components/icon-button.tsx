import { Pressable, StyleSheet } from 'react-native';

import Feather from '@/components/feather-icon';
import { colors, layout, radius } from '@/components/theme';

/** A square icon-only button with a spoken label (move up, remove…); a full touch target. */
export function IconButton({
  icon,
  label,
  onPress,
  disabled,
  tone = 'quiet',
}: {
  icon: React.ComponentProps<typeof Feather>['name'];
  label: string;
  onPress: () => void;
  disabled?: boolean;
  tone?: 'quiet' | 'danger';
}) {
  return (
    <Pressable
      role="button"
      accessibilityLabel={label}
      accessibilityState={{ disabled: !!disabled }}
      disabled={disabled}
      onPress={onPress}
      style={StyleSheet.flatten([styles.button, disabled && styles.disabled])}
    >
      <Feather name={icon} size={18} color={tone === 'danger' ? colors.danger : colors.text} />
    </Pressable>
  );
}

const styles = StyleSheet.create({
  button: {
    width: layout.touchTarget,
    height: layout.touchTarget,
    alignItems: 'center',
    justifyContent: 'center',
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  disabled: { opacity: 0.35 },
});
