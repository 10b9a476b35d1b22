import { StyleSheet, Text as RNText, type TextProps } from 'react-native';

import { colors, type TypeVariant, type as typeScale } from '@/components/theme';

type Props = TextProps & { variant?: TypeVariant; muted?: boolean; color?: string };

/** Text in the Pivotwatch type scale. `variant="figure"` uses monospaced digits for numbers. */
export function Text({ variant = 'body', muted, color, style, ...rest }: Props) {
  return (
    <RNText
      style={[styles.base, typeScale[variant], muted && styles.muted, color ? { color } : null, style]}
      {...rest}
    />
  );
}

const styles = StyleSheet.create({
  base: { color: colors.text },
  muted: { color: colors.textMuted },
});
