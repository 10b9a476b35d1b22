import { forwardRef, useState } from 'react';
import { StyleSheet, TextInput, View, type TextInputProps } from 'react-native';

import { fieldBox, FieldNote } from '@/components/field-frame';
import { Text } from '@/components/text';
import { colors, fonts, space } from '@/components/theme';

type Props = TextInputProps & { label: string; error?: string; hint?: string; unit?: string };

/** A multi-line input starts at about three lines and grows with its text up to this height, then scrolls. */
export const MULTILINE_MIN_HEIGHT = 88;
export const MULTILINE_MAX_HEIGHT = 280;

/**
 * A labelled input with its error under it; the label is the accessible name. A multi-line input grows
 * with what is typed (a fail note, say), so the inspector sees the whole text without scrolling inside it.
 */
export const TextField = forwardRef<TextInput, Props>(function TextField(
  { label, error, hint, unit, style, multiline, onContentSizeChange, ...rest },
  ref,
) {
  const [contentHeight, setContentHeight] = useState(0);
  const grown = multiline
    ? {
        minHeight: MULTILINE_MIN_HEIGHT,
        height: Math.min(MULTILINE_MAX_HEIGHT, Math.max(MULTILINE_MIN_HEIGHT, Math.ceil(contentHeight))),
        textAlignVertical: 'top' as const,
      }
    : null;
  return (
    <View style={styles.field}>
      <Text variant="label" muted>
        {label.toUpperCase()}
      </Text>
      <View style={[styles.box, multiline && styles.boxMultiline, error ? styles.boxError : null]}>
        <TextInput
          ref={ref}
          accessibilityLabel={label}
          placeholderTextColor={colors.textMuted}
          multiline={multiline}
          onContentSizeChange={(e) => {
            setContentHeight(e.nativeEvent.contentSize.height);
            onContentSizeChange?.(e);
          }}
          style={[styles.input, grown, style]}
          {...rest}
        />
        {unit ? (
          <Text variant="figure" muted style={styles.unit}>
            {unit}
          </Text>
        ) : null}
      </View>
      <FieldNote error={error} hint={hint} />
    </View>
  );
});

const styles = StyleSheet.create({
  field: { gap: space.xs },
  box: {
    flexDirection: 'row',
    alignItems: 'center',
    ...fieldBox,
  },
  boxMultiline: { alignItems: 'flex-start' },
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
