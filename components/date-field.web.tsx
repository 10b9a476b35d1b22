import { type CSSProperties, useId, useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { type DateFieldProps, dateRangeProblem } from '@/components/date-field-rules';
import { FieldNote } from '@/components/field-frame';
import { Text } from '@/components/text';
import { colors, fonts, layout, radius, space } from '@/components/theme';

/**
 * A calendar date in a browser: the platform's own date input (its calendar, its keyboard entry), drawn
 * like the app's text fields. The field gives YYYY-MM-DD or nothing; a date outside `min`..`max` is shown
 * with its problem and not passed on, so the form keeps its last good value.
 */
export function DateField({ label, value, onChange, onBlur, error, hint, min, max }: DateFieldProps) {
  const id = useId();
  // What the input holds now, when it differs from `value` (a date refused for its range).
  const [refused, setRefused] = useState<string | null>(null);
  const own = refused !== null ? dateRangeProblem(refused, min, max) : null;
  const shownError = own ?? error;
  const messageId = `${id}-message`;
  return (
    <View style={styles.field}>
      <Text variant="label" muted>
        {label.toUpperCase()}
      </Text>
      <input
        type="date"
        aria-label={label}
        aria-invalid={shownError ? true : undefined}
        aria-describedby={shownError || hint ? messageId : undefined}
        value={refused ?? value ?? ''}
        min={min}
        max={max}
        onChange={(e) => {
          const next = e.currentTarget.value;
          if (dateRangeProblem(next, min, max)) {
            setRefused(next);
            return;
          }
          setRefused(null);
          onChange(next === '' ? null : next);
        }}
        onBlur={onBlur}
        style={inputStyle(!!shownError)}
      />
      <FieldNote error={shownError} hint={hint} nativeID={messageId} />
    </View>
  );
}

/** The text field's box (components/text-field.tsx), as CSS for the DOM input. */
function inputStyle(invalid: boolean): CSSProperties {
  return {
    boxSizing: 'border-box',
    width: '100%',
    minWidth: 0,
    minHeight: layout.touchTarget,
    borderWidth: 1.5,
    borderStyle: 'solid',
    borderColor: invalid ? colors.danger : colors.border,
    borderRadius: radius.md,
    backgroundColor: colors.surface,
    color: colors.text,
    paddingLeft: space.md,
    paddingRight: space.sm,
    fontFamily: fonts.regular,
    fontSize: 16,
  };
}

const styles = StyleSheet.create({ field: { gap: space.xs, minWidth: 0 } });
