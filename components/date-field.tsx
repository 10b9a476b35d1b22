import DateTimePicker from '@react-native-community/datetimepicker';
import { useState } from 'react';
import { Platform, Pressable, StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import { type DateFieldProps, dateOfDay, dateRangeProblem } from '@/components/date-field-rules';
import Feather from '@/components/feather-icon';
import { fieldBox, FieldNote } from '@/components/field-frame';
import { Text } from '@/components/text';
import { colors, space } from '@/components/theme';
import { formatDate, localDay } from '@/lib/dates';

/**
 * A calendar date on a phone: a field showing the date in the one date format, which opens the
 * platform's date picker (a dialog on Android, a calendar under the field on iOS). The value stays
 * YYYY-MM-DD. The web build has its own module (`date-field.web.tsx`), so the picker never reaches it.
 */
export function DateField({
  label,
  value,
  onChange,
  onBlur,
  error,
  hint,
  min,
  max,
  clearable = true,
}: DateFieldProps) {
  const [open, setOpen] = useState(false);
  const [refused, setRefused] = useState<string | null>(null);
  const shownError = (refused !== null ? dateRangeProblem(refused, min, max) : null) ?? error;
  const picked = (date: Date) => {
    // Android's dialog closes itself on either answer; iOS keeps its calendar until Done.
    if (Platform.OS !== 'ios') setOpen(false);
    const day = localDay(date);
    if (dateRangeProblem(day, min, max)) {
      setRefused(day);
      return;
    }
    setRefused(null);
    onChange(day);
  };
  return (
    <View style={styles.field}>
      <Text variant="label" muted>
        {label.toUpperCase()}
      </Text>
      <View style={styles.row}>
        <Pressable
          role="button"
          accessibilityLabel={`${label}: ${value ? formatDate(value) : 'no date'}`}
          accessibilityHint="Opens a calendar"
          aria-expanded={open}
          onPress={() => setOpen((o) => !o)}
          style={StyleSheet.flatten([styles.box, shownError ? styles.boxError : null])}
        >
          <Text muted={!value}>{value ? formatDate(value) : 'Choose a date'}</Text>
          <Feather name="calendar" size={18} color={colors.textMuted} />
        </Pressable>
        {clearable && value ? (
          <Button
            label="Clear"
            tone="quiet"
            onPress={() => {
              setRefused(null);
              onChange(null);
              onBlur?.();
            }}
          />
        ) : null}
      </View>
      {open ? (
        <View>
          <DateTimePicker
            mode="date"
            display={Platform.OS === 'ios' ? 'inline' : 'default'}
            value={dateOfDay(value ?? localDay())}
            minimumDate={min ? dateOfDay(min) : undefined}
            maximumDate={max ? dateOfDay(max) : undefined}
            onValueChange={(_event, date) => picked(date)}
            onDismiss={() => setOpen(false)}
          />
          {Platform.OS === 'ios' ? (
            <Button
              label="Done"
              tone="quiet"
              onPress={() => {
                setOpen(false);
                onBlur?.();
              }}
            />
          ) : null}
        </View>
      ) : null}
      <FieldNote error={shownError} hint={hint} />
    </View>
  );
}

const styles = StyleSheet.create({
  field: { gap: space.xs, minWidth: 0 },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  box: {
    flex: 1,
    flexDirection: 'row',
    alignItems: 'center',
    justifyContent: 'space-between',
    ...fieldBox,
  },
  boxError: { borderColor: colors.danger },
});
