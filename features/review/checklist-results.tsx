import Feather from '@expo/vector-icons/Feather';
import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';

import { Card } from '@/components/card';
import { Text } from '@/components/text';
import { colors, layout, radius, space } from '@/components/theme';
import type { ChecklistAnswer } from '@/features/inspections/schema';
import type { InspectionPhoto } from '@/features/review/inspection-schema';
import { PhotoThumb } from '@/features/review/photo-gallery';
import { formatMeasurement } from '@/features/review/review-format';

type Result = ChecklistAnswer['result'];

/** Each answer's word and shape: a failed item is never told apart by colour alone. */
const resultInfo: Record<
  'pass' | 'fail' | 'na' | 'none',
  { label: string; icon: 'check' | 'x' | 'minus' | 'help-circle'; color: string }
> = {
  fail: { label: 'Failed', icon: 'x', color: colors.over },
  pass: { label: 'Passed', icon: 'check', color: colors.within },
  na: { label: 'Not applicable', icon: 'minus', color: colors.textMuted },
  none: { label: 'Not answered', icon: 'help-circle', color: colors.near },
};
const keyOf = (r: Result) => r ?? 'none';

/**
 * The checklist as answered. Failed items come first, each with the inspector's note, any measurement
 * and its photos; the rest are counted, and listed on request.
 */
export function ChecklistResults({
  checklist,
  photos,
  onOpenPhoto,
}: {
  checklist: ChecklistAnswer[];
  photos: InspectionPhoto[];
  onOpenPhoto: (photoId: string) => void;
}) {
  const [showAll, setShowAll] = useState(false);
  if (checklist.length === 0) return <Text muted>This inspection has no checklist answers.</Text>;
  const failed = checklist.filter((a) => a.result === 'fail');
  const rest = checklist.filter((a) => a.result !== 'fail');
  const count = (r: Result) => rest.filter((a) => a.result === r).length;
  const tally = [
    `${failed.length} failed`,
    `${count('pass')} passed`,
    count('na') ? `${count('na')} not applicable` : null,
    count(null) ? `${count(null)} not answered` : null,
  ]
    .filter(Boolean)
    .join(' · ');
  return (
    <View style={styles.root}>
      <Text variant="figure">{tally}</Text>
      {failed.length === 0 ? <Text muted>No item was marked failed.</Text> : null}
      {failed.map((a) => (
        <Card key={a.itemId} style={styles.failed} accessibilityLabel={`Failed item: ${a.text}`}>
          <ResultMark result="fail" />
          {a.area ? (
            <Text variant="label" muted>
              {a.area.toUpperCase()}
            </Text>
          ) : null}
          <Text variant="heading">{a.text}</Text>
          {a.note ? <Text>{a.note}</Text> : <Text muted>No note from the inspector.</Text>}
          {a.measurement ? <Text variant="figure">Measured {formatMeasurement(a.measurement)}</Text> : null}
          <ItemPhotos itemId={a.itemId} photos={photos} onOpen={onOpenPhoto} />
        </Card>
      ))}
      {rest.length > 0 ? (
        <Pressable
          role="button"
          aria-expanded={showAll}
          onPress={() => setShowAll((v) => !v)}
          style={styles.toggle}
        >
          <Feather name={showAll ? 'chevron-up' : 'chevron-down'} size={18} color={colors.accent} />
          <Text variant="heading" color={colors.accent}>
            {showAll ? 'Hide the other items' : `Show the other ${rest.length} items`}
          </Text>
        </Pressable>
      ) : null}
      {showAll ? (
        <View style={styles.list} role="list">
          {rest.map((a) => (
            <View key={a.itemId} style={styles.line} role="listitem">
              <ResultMark result={a.result} />
              <View style={styles.lineText}>
                <Text>{a.text}</Text>
                {a.note ? (
                  <Text variant="small" muted>
                    {a.note}
                  </Text>
                ) : null}
              </View>
              <ItemPhotos itemId={a.itemId} photos={photos} onOpen={onOpenPhoto} small />
            </View>
          ))}
        </View>
      ) : null}
    </View>
  );
}

function ResultMark({ result }: { result: Result }) {
  const info = resultInfo[keyOf(result)];
  return (
    <View style={styles.mark} accessibilityLabel={info.label}>
      <Feather name={info.icon} size={16} color={info.color} />
      <Text variant="label" color={info.color}>
        {info.label}
      </Text>
    </View>
  );
}

function ItemPhotos({
  itemId,
  photos,
  onOpen,
  small,
}: {
  itemId: string;
  photos: InspectionPhoto[];
  onOpen: (photoId: string) => void;
  small?: boolean;
}) {
  const mine = photos.filter((p) => p.checklistItemId === itemId);
  if (mine.length === 0) return null;
  return (
    <View style={styles.photos}>
      {mine.map((p) => (
        <PhotoThumb key={p.id} photo={p} onOpen={onOpen} size={small ? 56 : 96} />
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  root: { gap: space.md },
  failed: { borderLeftWidth: 4, borderLeftColor: colors.over },
  mark: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.xs,
    alignSelf: 'flex-start',
    minWidth: 130,
  },
  toggle: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    minHeight: layout.touchTarget,
    alignSelf: 'flex-start',
  },
  list: {
    backgroundColor: colors.surface,
    borderRadius: radius.lg,
    borderWidth: 1,
    borderColor: colors.border,
    paddingHorizontal: space.md,
  },
  line: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    gap: space.md,
    paddingVertical: space.sm,
    borderBottomWidth: 1,
    borderBottomColor: colors.surfaceSunk,
  },
  lineText: { flex: 1, minWidth: 180, gap: 2 },
  photos: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
