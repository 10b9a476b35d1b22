import { forwardRef } from 'react';
import { StyleSheet, TextInput, View, type TextInputProps } from 'react-native';

import { Text } from '@/components/text';
import { colors, fonts, layout, radius, space } from '@/components/theme';

type Props = TextInputProps & { label: string; error?: string; hint?: string; unit?: string };

/** A labelled input with its error under it; the label is the accessible name. */
export const TextField = forwardRef<TextInput, Props>(function TextField(
  { label, error, hint, unit, style, ...rest },
  ref,
) {
  return (
    <View style={styles.field}>
      <Text variant="label" muted>
        {label.toUpperCase()}
      </Text>
      <View style={[styles.box, error ? styles.boxError : null]}>
        <TextInput
          ref={ref}
          accessibilityLabel={label}
          placeholderTextColor={colors.textMuted}
          style={[styles.input, style]}
          {...rest}
        />
        {unit ? (
          <Text variant="figure" muted style={styles.unit}>
            {unit}
          </Text>
        ) : null}
      </View>
      {error ? (
        <Text variant="small" color={colors.danger} accessibilityLiveRegion="polite">
          {error}
        </Text>
      ) : hint ? (
        <Text variant="small" muted>
          {hint}
        </Text>
      ) : null}
    </View>
  );
});

const styles = StyleSheet.create({
  field: { gap: space.xs },
  box: {
    flexDirection: 'row',
    alignItems: 'center',
    minHeight: layout.touchTarget,
    borderWidth: 1.5,
    borderColor: colors.border,
    borderRadius: radius.md,
    backgroundColor: colors.surface,
    paddingHorizontal: space.md,
  },
  boxError: { borderColor: colors.danger },
  // minWidth 0 lets the input shrink on web, where it has an intrinsic width, so the unit stays inside.
  input: {
    flex: 1,
    minWidth: 0,
    fontFamily: fonts.regular,
    fontSize: 16,
    color: colors.text,
    paddingVertical: space.sm,
  },
  unit: { marginLeft: space.sm },
});
