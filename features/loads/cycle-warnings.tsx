import { StyleSheet, View } from 'react-native';

import { MarkIcon, VocabularyMark } from '@/components/mark-icon';
import { Text } from '@/components/text';
import { colors, radius, space } from '@/components/theme';
import type { CycleWarning } from '@/features/loads/engine';
import { groupWarnings, warningSubject } from '@/features/loads/format';
import { cycleWarningLevelVocabulary } from '@/lib/vocabulary';

type Grouped = ReturnType<typeof groupWarnings>[number];

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
  const grouped = groupWarnings(warnings);
  if (grouped.length === 0) return null;
  const attention = grouped.filter((g) => g.warning.level === 'warning');
  const notes = grouped.filter((g) => g.warning.level !== 'warning');
  const line = ({ warning: w, more }: Grouped) => {
    const subject = warningSubject(w, jointNames, seatNames);
    const text = subject ? `${subject}: ${w.message}` : w.message;
    return more > 0 ? `${text} (and ${more} more like it)` : text;
  };
  return (
    <View style={styles.root}>
      {attention.length > 0 ? (
        <View style={styles.attention} role="note" aria-label="Warnings about this result">
          <VocabularyMark word={cycleWarningLevelVocabulary.warning} />
          {attention.map((g, i) => (
            <Text key={`${g.warning.code}-${i}`} style={styles.attentionText}>
              {line(g)}
            </Text>
          ))}
        </View>
      ) : null}
      {notes.length > 0 ? (
        <View style={styles.notes} role="note" aria-label="How this result was computed">
          <Text variant="label" muted>
            {cycleWarningLevelVocabulary.info.label.toUpperCase()}
          </Text>
          {notes.map((g, i) => (
            <View key={`${g.warning.code}-${i}`} style={styles.note}>
              <View style={styles.noteIcon}>
                <MarkIcon mark={cycleWarningLevelVocabulary.info.mark} />
              </View>
              <Text variant="small" muted style={styles.noteText}>
                {line(g)}
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
