import { Pressable, StyleSheet, View } from 'react-native';

import { ChoiceChips } from '@/components/choice-chips';
import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, layout, radius, space } from '@/components/theme';
import type { InstrumentSnapshot, ReadingKind } from '@/features/records/schema';
import {
  type CalibrationStatus,
  type Instrument,
  type ReadingMethod,
  calibrationStatus,
  calibrationWords,
  instrumentsFor,
  methodChoiceLabel,
  methodsForKind,
} from '@/features/instruments/schema';

/**
 * The inspector's answer so far: nothing is chosen until they choose it. `null` instrument = none used;
 * `note` says how, for a method the list does not name (it becomes the reading's note).
 */
export type MeasuredWith = {
  method: ReadingMethod | null;
  instrument: Instrument | null | undefined;
  note: string;
};
export const nothingChosen: MeasuredWith = { method: null, instrument: undefined, note: '' };

export const snapshotOf = (i: Instrument): InstrumentSnapshot => ({
  id: i.id,
  name: i.name,
  serial: i.serial,
  calibrationDueOn: i.calibrationDueOn,
});

/**
 * What is still missing before a reading can be kept, or null. A past-due instrument is refused here too,
 * in case the date moved on while the form was open.
 */
export function measuredWithProblem(m: MeasuredWith, today: string): string | null {
  if (!m.method) return 'Choose how it was measured';
  if (m.method === 'other' && !m.note.trim()) return 'Say how it was measured';
  if (m.instrument === undefined) return 'Choose the instrument, or say none from the register was used';
  if (m.instrument && calibrationStatus(m.instrument.calibrationDueOn, today).state === 'past_due')
    return `${m.instrument.name} is past its calibration due date; use another instrument`;
  return null;
}

const statusIcon: Record<
  CalibrationStatus['state'],
  { icon: 'check-circle' | 'alert-triangle' | 'slash' | 'minus-circle'; color: string }
> = {
  current: { icon: 'check-circle', color: colors.within },
  not_required: { icon: 'minus-circle', color: colors.textMuted },
  due_soon: { icon: 'alert-triangle', color: colors.near },
  past_due: { icon: 'slash', color: colors.over },
};

/**
 * How a reading was measured: the method (fitting the reading's kind), then the instrument from the
 * register. Instruments past their calibration due date are shown but cannot be chosen; those due within
 * 14 days are flagged.
 */
export function MeasuredWithPicker({
  kind,
  instruments,
  today,
  value,
  onChange,
  error,
}: {
  kind: ReadingKind;
  instruments: Instrument[];
  today: string;
  value: MeasuredWith;
  onChange: (v: MeasuredWith) => void;
  error?: string;
}) {
  const methods = methodsForKind[kind];
  const available = value.method ? instrumentsFor(instruments, kind, value.method) : [];
  return (
    <View style={styles.root}>
      <ChoiceChips<ReadingMethod>
        label="Measured by"
        value={value.method}
        options={methods.map((m) => ({ value: m, label: methodChoiceLabel[m] }))}
        onChange={(method) => onChange({ method, instrument: undefined, note: value.note })}
        error={!value.method ? error : undefined}
      />
      {value.method === 'other' ? (
        <TextField
          label="How it was measured"
          value={value.note}
          onChangeText={(note) => onChange({ ...value, note })}
          error={!value.note.trim() && error === 'Say how it was measured' ? error : undefined}
        />
      ) : null}
      {value.method ? (
        <View style={styles.list} role="radiogroup" accessibilityLabel="Instrument">
          <Text variant="label" muted>
            INSTRUMENT
          </Text>
          {available.map((i) => {
            const status = calibrationStatus(i.calibrationDueOn, today);
            const refused = status.state === 'past_due';
            const on = value.instrument?.id === i.id;
            const mark = statusIcon[status.state];
            return (
              <Pressable
                key={i.id}
                role="radio"
                aria-checked={on}
                aria-disabled={refused}
                disabled={refused}
                accessibilityState={{ checked: on, disabled: refused }}
                accessibilityLabel={`${i.name}, serial ${i.serial}. ${calibrationWords(i.calibrationDueOn, status)}`}
                onPress={() => onChange({ ...value, instrument: i })}
                style={StyleSheet.flatten([styles.option, on && styles.optionOn, refused && styles.refused])}
              >
                <Text variant="label" color={on ? colors.baseText : colors.text}>
                  {on ? '● ' : '○ '}
                  {i.name} · {i.serial}
                </Text>
                <View style={styles.status}>
                  <Feather name={mark.icon} size={14} color={on ? colors.baseText : mark.color} />
                  <Text
                    variant="small"
                    color={
                      on
                        ? colors.baseText
                        : status.state === 'current' || status.state === 'not_required'
                          ? colors.textMuted
                          : mark.color
                    }
                  >
                    {calibrationWords(i.calibrationDueOn, status)}
                  </Text>
                </View>
              </Pressable>
            );
          })}
          {available.length === 0 ? (
            <Text variant="small" muted>
              The register on this phone has no {methodChoiceLabel[value.method].toLowerCase()} for this
              reading.
            </Text>
          ) : null}
          <Pressable
            role="radio"
            aria-checked={value.instrument === null}
            accessibilityState={{ checked: value.instrument === null }}
            accessibilityLabel="None from the register"
            onPress={() => onChange({ ...value, instrument: null })}
            style={StyleSheet.flatten([styles.option, value.instrument === null && styles.optionOn])}
          >
            <Text variant="label" color={value.instrument === null ? colors.baseText : colors.text}>
              {value.instrument === null ? '● ' : '○ '}None from the register
            </Text>
          </Pressable>
          {value.method && value.instrument === undefined && error && error !== 'Say how it was measured' ? (
            <Text variant="small" color={colors.danger} role="alert">
              {error}
            </Text>
          ) : null}
        </View>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  root: { gap: space.sm },
  list: { gap: space.xs },
  option: {
    minHeight: layout.touchTarget,
    paddingHorizontal: space.md,
    paddingVertical: space.xs,
    justifyContent: 'center',
    gap: 2,
    borderRadius: radius.md,
    borderWidth: 1.5,
    borderColor: colors.border,
    backgroundColor: colors.surface,
  },
  optionOn: { backgroundColor: colors.base, borderColor: colors.base },
  refused: { backgroundColor: colors.overSoft, borderColor: colors.over, borderStyle: 'dashed' },
  status: { flexDirection: 'row', alignItems: 'center', gap: space.xs },
});
