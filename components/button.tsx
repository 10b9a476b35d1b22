import { ActivityIndicator, Pressable, StyleSheet, View, type PressableProps } from 'react-native';

import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';

type Props = Omit<PressableProps, 'children'> & {
  label: string;
  tone?: 'primary' | 'accent' | 'quiet' | 'danger';
  busy?: boolean;
  icon?: React.ReactNode;
  /** Lets a screen move the focus to the button (passed on to the Pressable, as React 19 passes refs). */
  ref?: React.Ref<View>;
};

/** A full-size touch target; `busy` keeps the label width and shows a spinner. */
export function Button({ label, tone = 'primary', busy, disabled, icon, style, ...rest }: Props) {
  const palette = tones[tone];
  const inactive = disabled || busy;
  return (
    <Pressable
      accessibilityRole="button"
      accessibilityState={{ disabled: !!inactive, busy: !!busy }}
      disabled={inactive}
      style={(state) => [
        styles.button,
        { backgroundColor: palette.bg, borderColor: palette.border },
        state.pressed && styles.pressed,
        inactive && styles.inactive,
        typeof style === 'function' ? style(state) : style,
      ]}
      {...rest}
    >
      <View style={styles.row}>
        {/* The button says it is busy itself (its busy state); the spinner only shows it. */}
        {busy ? <ActivityIndicator color={palette.fg} aria-hidden /> : icon}
        <Text variant="heading" color={palette.fg}>
          {label}
        </Text>
      </View>
    </Pressable>
  );
}

const tones = {
  primary: { bg: colors.base, fg: colors.baseText, border: colors.base },
  accent: { bg: colors.accent, fg: colors.baseText, border: colors.accent },
  quiet: { bg: colors.surface, fg: colors.text, border: colors.border },
  danger: { bg: colors.surface, fg: colors.danger, border: colors.danger },
} as const;

const styles = StyleSheet.create({
  button: {
    minHeight: layout.touchTarget,
    paddingHorizontal: space.xl,
    borderRadius: radius.md,
    borderWidth: 1.5,
    justifyContent: 'center',
    alignItems: 'center',
  },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  pressed: { opacity: 0.85 },
  inactive: { opacity: 0.55 },
});
