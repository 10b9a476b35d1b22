/**
 * The question asked when a motion reading is far from the ride's design motion: keep it (it then carries
 * the confirmation, and the supervisor sees it was confirmed) or measure again. Nothing counts until the
 * inspector answers, so a mistimed swing never reaches the load check unnoticed.
 */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';

import { Button } from '@/components/button';
import Feather from '@/components/feather-icon';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { colors, radius, space } from '@/components/theme';
import { PLAUSIBLE_HIGH, PLAUSIBLE_LOW, type PlausibilityCheck, plausibilityText } from '@/features/records';
import type { Reading } from '@/features/records/schema';

/** A reading held back until the inspector answers. */
export type PendingReading = { reading: Reading; check: PlausibilityCheck };

/** The confirmation the reading carries once kept. */
function confirmReading(pending: PendingReading, note: string, now: Date = new Date()): Reading {
  const trimmed = note.trim();
  return {
    ...pending.reading,
    plausibility: {
      designSI: pending.check.designSI,
      ratio: pending.check.ratio,
      confirmedAt: now.toISOString(),
      ...(trimmed ? { note: trimmed } : {}),
    },
  };
}

const likelyCause: Record<PlausibilityCheck['kind'], string> = {
  period:
    'Timing one pass of a swing instead of there and back, a mark that two arms pass, or a missed or ' +
    'extra pass gives half or twice the real period.',
  speed: 'A speed read in the wrong unit, or a count of half turns, gives a value far from the real one.',
  amplitude: 'An amplitude read across both sides instead of one side of centre gives twice the real value.',
};

export function PlausibilityPrompt({
  pending,
  valueText,
  onKeep,
  onMeasureAgain,
}: {
  pending: PendingReading;
  /** The value as it will be recorded, with its unit. */
  valueText: string;
  onKeep: (confirmed: Reading) => void;
  onMeasureAgain: () => void;
}) {
  const [note, setNote] = useState('');
  const { check } = pending;
  return (
    <View style={styles.box} role="alert" accessibilityLabel="Far from the design motion">
      <View style={styles.head}>
        <Feather name="alert-triangle" size={20} color={colors.near} />
        <Text variant="heading" color={colors.near} style={styles.grow}>
          Far from the design motion: check before it counts
        </Text>
      </View>
      <Text>
        <Text variant="figure">{valueText}</Text> is {plausibilityText(check)}. Readings between{' '}
        {PLAUSIBLE_LOW}× and {PLAUSIBLE_HIGH}× of the design go in without this question.
      </Text>
      <Text variant="small" muted>
        {likelyCause[check.kind]} If the value is right, keep it: the load check uses it and the record shows
        you confirmed it.
      </Text>
      <TextField
        label="Why this value is right (optional)"
        value={note}
        onChangeText={setNote}
        maxLength={500}
      />
      <View style={styles.actions}>
        <Button label="Measure again" tone="quiet" onPress={onMeasureAgain} />
        <Button label="Keep this value" onPress={() => onKeep(confirmReading(pending, note))} />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  box: {
    gap: space.sm,
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 2,
    borderColor: colors.near,
    backgroundColor: colors.nearSoft,
  },
  head: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  grow: { flex: 1 },
  actions: { flexDirection: 'row', gap: space.sm, flexWrap: 'wrap', justifyContent: 'flex-end' },
});
