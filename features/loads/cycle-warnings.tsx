import { StyleSheet, View } from 'react-native';

import { MarkIcon, VocabularyMark } from '@/components/mark-icon';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import type { CycleWarning } from '@/features/loads/engine';
import { sortWarnings, warningSubject } from '@/features/loads/format';
import { cycleWarningLevelVocabulary } from '@/lib/vocabulary';

/**
 * What the person must know about how far to trust a load check, shown with the result: warnings (a record
 * sampled too slowly, noisy, gappy, clipped) stand out with their mark and words; notes on how the result
 * was computed (the smoothing used, a free swing's period) follow, quieter. Nothing when there are none,
 * and an older answer without warnings renders as one with none.
 */
export function CycleWarnings({
  warnings,
  jointNames = [],
  seatNames = [],
}: {
  warnings: readonly CycleWarning[] | null | undefined;
  jointNames?: readonly string[];
  seatNames?: readonly string[];
}) {
  const sorted = sortWarnings(warnings);
  if (sorted.length === 0) return null;
  const attention = sorted.filter((w) => w.level === 'warning');
  const notes = sorted.filter((w) => w.level !== 'warning');
  const line = (w: CycleWarning) => {
    const subject = warningSubject(w, jointNames, seatNames);
    return subject ? `${subject}: ${w.message}` : w.message;
  };
  return (
    <View style={styles.root}>
      {attention.length > 0 ? (
        <View style={styles.attention} role="note" aria-label="Warnings about this result">
          <VocabularyMark word={cycleWarningLevelVocabulary.warning} />
          {attention.map((w, i) => (
            <Text key={`${w.code}-${i}`} style={styles.attentionText}>
              {line(w)}
            </Text>
          ))}
        </View>
      ) : null}
      {notes.length > 0 ? (
        <View style={styles.notes} role="note" aria-label="How this result was computed">
          <Text variant="label" muted>
            {cycleWarningLevelVocabulary.info.label.toUpperCase()}
          </Text>
          {notes.map((w, i) => (
            <View key={`${w.code}-${i}`} style={styles.note}>
              <View style={styles.noteIcon}>
                <MarkIcon mark={cycleWarningLevelVocabulary.info.mark} />
              </View>
              <Text variant="small" muted style={styles.noteText}>
                {line(w)}
              </Text>
            </View>
          ))}
        </View>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  root: { gap: space.sm },
  attention: {
    gap: space.sm,
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 1.5,
    borderColor: colors.near,
    backgroundColor: colors.surface,
  },
  attentionText: { color: colors.text },
  notes: { gap: space.xs, paddingHorizontal: space.xs },
  note: { flexDirection: 'row', gap: space.sm, alignItems: 'flex-start' },
  noteIcon: { paddingTop: 3 },
  noteText: { flexShrink: 1 },
});
